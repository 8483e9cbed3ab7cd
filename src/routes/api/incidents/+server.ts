import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/http/api';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import { todayISO } from '$lib/inspectionState';
import type { RequestHandler } from './$types';

export type IncidentListResponse = { items: incidents.IncidentListItem[] };

/** The incidents this person may see, with no personal field in any row. */
export const GET: RequestHandler = endpoint(async ({ locals }) => {
	const scope = await scopeOf(requireUser(locals));
	return json({ items: await incidents.list(scope, todayISO()) } satisfies IncidentListResponse);
});
