import { json } from '@sveltejs/kit';
import { medicalSchema } from '$lib/schemas/incidents';
import { failureAnswer, endpoint, readJson } from '$lib/server/http/api';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as medical from '$lib/server/medical';
import type { RequestHandler } from './$types';

/** The medical follow-up: laser safety officers only. */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const scope = await scopeOf(requireAbility(locals, 'investigateIncidents'));
	const r = await medical.read(scope, params.incidentId, 'api');
	if (!r.ok) return failureAnswer(r);
	const { ok: _ok, ...record } = r;
	return json(record);
});

export const PUT: RequestHandler = endpoint(async ({ locals, params, request }) => {
	const scope = await scopeOf(requireAbility(locals, 'investigateIncidents'));
	const body = await readJson(request, medicalSchema);
	if (!body.ok) return body.response;
	const r = await medical.save(scope, params.incidentId, body.data);
	if (!r.ok) return failureAnswer(r);
	const saved = await medical.read(scope, params.incidentId, 'api');
	if (!saved.ok) return failureAnswer(saved);
	const { ok: _ok, ...record } = saved;
	return json(record);
});
