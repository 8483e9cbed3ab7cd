import { json } from '@sveltejs/kit';
import { updateUserSchema } from '$lib/schemas/users';
import { failureAnswer, endpoint, readJson } from '$lib/server/http/api';
import { requireAbility } from '$lib/server/auth/guard';
import * as users from '$lib/server/users';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	requireAbility(locals, 'administer');
	const found = await users.find(params.userId);
	return found.ok ? json(found.person) : failureAnswer(found);
});

export const PATCH: RequestHandler = endpoint(async ({ locals, request, params }) => {
	const admin = requireAbility(locals, 'administer');
	const body = await readJson(request, updateUserSchema);
	if (!body.ok) return body.response;
	const result = await users.update(admin.id, params.userId, body.data);
	if (!result.ok) return failureAnswer(result);
	const found = await users.find(params.userId);
	return found.ok ? json(found.person) : failureAnswer(found);
});
