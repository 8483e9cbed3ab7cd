import { json } from '@sveltejs/kit';
import { newLaserSchema } from '$lib/schemas/register';
import { apiError, failureAnswer, endpoint, readJson } from '$lib/server/http/api';
import { fieldMessages } from '$lib/server/http/failure';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as lasers from '$lib/server/lasers';
import type { RequestHandler } from './$types';

export type InventoryResponse = lasers.InventoryPage;

export const GET: RequestHandler = endpoint(async ({ locals, url }) => {
	const user = requireUser(locals);
	const filters = lasers.inventoryFromQuery(url.searchParams);
	if (!filters.ok) return apiError(400, 'Some query parameters need attention.', fieldMessages(filters.error));
	const page = await lasers.inventory(await scopeOf(user), filters.query);
	return json(page satisfies InventoryResponse);
});

export const POST: RequestHandler = endpoint(async ({ locals, request }) => {
	const user = requireAbility(locals, 'changeRegister');
	const body = await readJson(request, newLaserSchema);
	if (!body.ok) return body.response;
	const result = await lasers.create(await scopeOf(user), body.data);
	if (!result.ok) return failureAnswer(result);
	return json({ id: result.id }, { status: 201 });
});
