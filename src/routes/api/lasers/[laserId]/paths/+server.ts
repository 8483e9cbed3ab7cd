import { json } from '@sveltejs/kit';
import { pathFormSchema } from '$lib/schemas/register';
import { failureAnswer, endpoint, readJson } from '$lib/server/http/api';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as paths from '$lib/server/paths';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = endpoint(async ({ locals, request, params }) => {
	const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
	const body = await readJson(request, pathFormSchema);
	if (!body.ok) return body.response;
	const saved = await paths.save(scope, params.laserId, null, { ...body.data, version: 0 });
	if (!saved.ok) return failureAnswer(saved);
	return json(saved, { status: 201 });
});
