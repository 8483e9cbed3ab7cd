import { json } from '@sveltejs/kit';
import { pathFormSchema } from '$lib/schemas/register';
import { failureAnswer, endpoint, readJson } from '$lib/server/http/api';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as paths from '$lib/server/paths';
import { pathStateOf } from '$lib/pathState';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const found = await paths.find(await scopeOf(requireUser(locals)), params.pathId);
	if (!found.ok) return failureAnswer(found);
	const { path, elements, points, latest, lines, lab } = found.detail;
	return json({ path, state: pathStateOf(path), lab, lines, elements, points, latest, editable: found.editable });
});

/** Replace the path (values with units, as in the editor); `version` must be the one read. */
export const PUT: RequestHandler = endpoint(async ({ locals, request, params }) => {
	const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
	const body = await readJson(request, pathFormSchema);
	if (!body.ok) return body.response;
	const found = await paths.find(scope, params.pathId);
	if (!found.ok) return failureAnswer(found);
	const saved = await paths.save(scope, found.detail.laser.id, params.pathId, body.data);
	if (!saved.ok) return failureAnswer(saved);
	return json(saved);
});
