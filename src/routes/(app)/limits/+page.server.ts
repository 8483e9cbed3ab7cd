import { can } from '$lib/abilities';
import { requireUser } from '$lib/server/auth/guard';
import * as limits from '$lib/server/limits';
import * as paths from '$lib/server/paths';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const [list, stale] = await Promise.all([limits.list(), paths.countStale()]);
	return { limits: list, stale, canManage: can(user, 'manageLimits') };
};
