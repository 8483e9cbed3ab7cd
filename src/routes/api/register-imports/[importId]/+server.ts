import { json } from '@sveltejs/kit';
import { apiError, endpoint } from '$lib/server/api';
import { requireRole } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as registerImport from '$lib/server/registerImport';
import type { RequestHandler } from './$types';

/** How far an import has come: the import page polls this while the job writes it. */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const scope = await scopeOf(requireRole(locals, 'officer'));
	const found = await registerImport.progress(scope, params.importId);
	if (!found.ok) return apiError(found.status, found.message);
	return json(found.progress, { headers: { 'cache-control': 'no-store' } });
});
