import { json } from '@sveltejs/kit';
import { endpoint, failureAnswer } from '$lib/server/http/api';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as registerImport from '$lib/server/registerImport';
import type { RequestHandler } from './$types';

/** How far an import has come: the import page polls this while the job writes it. */
export const GET: RequestHandler = endpoint(async ({ locals, params }) => {
	const scope = await scopeOf(requireAbility(locals, 'importRegister'));
	const found = await registerImport.progress(scope, params.registerImportId);
	if (!found.ok) return failureAnswer(found);
	return json(found.progress, { headers: { 'cache-control': 'no-store' } });
});
