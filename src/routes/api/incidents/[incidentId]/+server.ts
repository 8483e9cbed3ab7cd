import { json } from '@sveltejs/kit';
import { apiError, endpoint } from '$lib/server/api';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import { todayISO } from '$lib/inspectionState';
import type { RequestHandler } from './$types';

export type IncidentResponse = incidents.IncidentView;

/** One incident, shaped for the person exactly as its page is (404 when they may not see it). */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const scope = await scopeOf(requireUser(locals));
	const found = await incidents.view(scope, params.incidentId, todayISO(), 'api');
	if (!found) return apiError(404, 'No such incident.');
	return json(found satisfies IncidentResponse);
});
