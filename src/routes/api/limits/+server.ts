import { json } from '@sveltejs/kit';
import { limitFormSchema } from '$lib/schemas/limits';
import { failureAnswer, endpoint, readJson } from '$lib/server/http/api';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import * as limits from '$lib/server/limits';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = endpoint(async ({ locals }) => {
	requireUser(locals);
	return json({ limits: await limits.list() });
});

export const POST: RequestHandler = endpoint(async ({ locals, request }) => {
	const officer = requireAbility(locals, 'manageLimits');
	const body = await readJson(request, limitFormSchema);
	if (!body.ok) return body.response;
	const result = await limits.create(officer.id, body.data);
	if (!result.ok) return failureAnswer(result);
	return json(result, { status: 201 });
});
