import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { csvResponse } from '$lib/server/registerExport';
import type { RequestHandler } from './$types';

/** The register's paths as CSV (the labs the reader may see; `?lab=` narrows to one). */
export const GET: RequestHandler = async ({ locals, url }) => csvResponse('paths', await scopeOf(requireUser(locals)), url);
