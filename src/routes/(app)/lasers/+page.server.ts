import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as labs from '$lib/server/labs';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const all = await labs.list();
	return {
		labs: scope.labIds === 'all' ? all : all.filter((l) => (scope.labIds as string[]).includes(l.id)),
		canRegister: scope.editLabIds === 'all' || (Array.isArray(scope.editLabIds) && scope.editLabIds.length > 0)
	};
};
