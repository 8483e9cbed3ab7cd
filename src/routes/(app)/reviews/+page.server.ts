import { can } from '$lib/abilities';
import { z } from 'zod';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as labs from '$lib/server/labs';
import * as reviews from '$lib/server/reviews';
import { pathStates } from '$lib/pathState';
import type { PageServerLoad } from './$types';

const filterSchema = z.object({
	state: z.enum([...pathStates, 'waiting', 'all']).catch('waiting'),
	lab: z.uuid().optional().catch(undefined),
	page: z.coerce.number().int().min(1).max(10000).catch(1)
});

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const filter = filterSchema.parse(Object.fromEntries(url.searchParams));
	const [found, all, counts] = await Promise.all([reviews.queue(scope, { state: filter.state, labId: filter.lab, page: filter.page }), labs.list(), reviews.counts(scope)]);
	const rows = found.slice(0, reviews.QUEUE_PAGE_SIZE);
	return {
		rows,
		pages: { page: filter.page, hasNext: found.length > reviews.QUEUE_PAGE_SIZE, size: reviews.QUEUE_PAGE_SIZE },
		labs: scope.labIds === 'all' ? all : all.filter((l) => (scope.labIds as string[]).includes(l.id)),
		filter,
		counts,
		isOfficer: can(user, 'decideReviews')
	};
};
