import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { orError } from '$lib/server/http/pages';
import * as reports from '$lib/server/reports';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const scope = await scopeOf(requireUser(locals));
	const { report } = orError(await reports.find(scope, params.pathId, params.snapshotId));
	return { report };
};
