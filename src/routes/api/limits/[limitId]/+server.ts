import { json } from '@sveltejs/kit';
import { limitFormSchema } from '$lib/schemas/limits';
import { failureAnswer, endpoint, readJson } from '$lib/server/http/api';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import * as limits from '$lib/server/limits';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	requireUser(locals);
	const found = await limits.find(params.limitId);
	return found.ok ? json(found.limit) : failureAnswer(found);
});

/** A revision: a new version; `version` must be the current one. */
export const PUT: RequestHandler = endpoint(async ({ locals, request, params }) => {
	const officer = requireAbility(locals, 'manageLimits');
	const body = await readJson(request, limitFormSchema);
	if (!body.ok) return body.response;
	const result = await limits.revise(officer.id, params.limitId, body.data);
	if (!result.ok) return failureAnswer(result);
	return json(result);
});
