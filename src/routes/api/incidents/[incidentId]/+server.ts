import { json } from '@sveltejs/kit';
import { endpoint, failureAnswer } from '$lib/server/http/api';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import { todayISO } from '$lib/inspectionState';
import type { RequestHandler } from './$types';

export type IncidentResponse = incidents.IncidentView;

/** One incident, shaped for the person exactly as its page is (404 when they may not see it). */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const scope = await scopeOf(requireUser(locals));
	const found = await incidents.find(scope, params.incidentId, todayISO(), 'api');
	if (!found.ok) return failureAnswer(found);
	return json(found.incident satisfies IncidentResponse);
});
