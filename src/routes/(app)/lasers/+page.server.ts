import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as labs from '$lib/server/labs';
import * as lasers from '$lib/server/lasers';
import type { PageServerLoad } from './$types';
import { can } from '$lib/abilities';

/** The register with its first page of lasers, rendered in one request; a filter change loads again. */
export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const filters = lasers.inventoryFromQuery(url.searchParams);
	const [all, inventory] = await Promise.all([labs.list(), filters.ok ? lasers.inventory(scope, filters.query) : null]);
	return {
		labs: scope.labIds === 'all' ? all : all.filter((l) => (scope.labIds as string[]).includes(l.id)),
		canImport: can(user, 'importRegister'),
		canRegister: scope.editLabIds === 'all' || (Array.isArray(scope.editLabIds) && scope.editLabIds.length > 0),
		inventory,
		queryError: filters.ok ? null : filters.error.issues.map((i) => i.message).join(' ')
	};
};
