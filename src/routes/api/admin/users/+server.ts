import { json } from '@sveltejs/kit';
import { newUserSchema } from '$lib/schemas/users';
import { failureAnswer, endpoint, readJson } from '$lib/server/http/api';
import { requireAbility } from '$lib/server/auth/guard';
import * as users from '$lib/server/users';
import type { RequestHandler } from './$types';

export type UsersResponse = { users: users.UserSummary[] };

export const GET: RequestHandler = endpoint(async ({ locals }) => {
	requireAbility(locals, 'administer');
	return json({ users: await users.list() } satisfies UsersResponse);
});

export const POST: RequestHandler = endpoint(async ({ locals, request }) => {
	const admin = requireAbility(locals, 'administer');
	const body = await readJson(request, newUserSchema);
	if (!body.ok) return body.response;
	const result = await users.create(admin.id, body.data);
	if (!result.ok) return failureAnswer(result);
	return json({ id: result.id }, { status: 201 });
});
