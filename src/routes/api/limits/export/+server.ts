// The limit library as a limit-set document (the same as the file the library page offers).
import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/http/api';
import { requireAbility } from '$lib/server/auth/guard';
import * as limitSets from '$lib/server/limitSets';
import type { RequestHandler } from './$types';

export type LimitSetResponse = Awaited<ReturnType<typeof limitSets.document>>;

export const GET: RequestHandler = endpoint(async ({ locals }) => {
	requireAbility(locals, 'manageLimits');
	return json((await limitSets.document()) satisfies LimitSetResponse);
});
