import { json } from '@sveltejs/kit';
import { editLaserSchema } from '$lib/schemas/register';
import { failureAnswer, endpoint, readJson } from '$lib/server/http/api';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as lasers from '$lib/server/lasers';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const user = requireUser(locals);
	const found = await lasers.find(await scopeOf(user), params.laserId);
	if (!found.ok) return failureAnswer(found);
	return json({ ...found.detail, editable: found.editable });
});

export const PATCH: RequestHandler = endpoint(async ({ locals, request, params }) => {
	const user = requireAbility(locals, 'changeRegister');
	const body = await readJson(request, editLaserSchema);
	if (!body.ok) return body.response;
	const scope = await scopeOf(user);
	const result = await lasers.update(scope, params.laserId, body.data);
	if (!result.ok) return failureAnswer(result);
	const found = await lasers.find(scope, params.laserId);
	return json(found.ok ? found.detail : null);
});
