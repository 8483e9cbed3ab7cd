import { can } from '$lib/abilities';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as eyewear from '$lib/server/eyewear';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const items = await eyewear.list(scope);
	return {
		items,
		cleared: await eyewear.clearedPathChecks(scope),
		canManage: can(user, 'manageEyewear')
	};
};
