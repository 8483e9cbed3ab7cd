import { z } from 'zod';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as labs from '$lib/server/labs';
import * as reviews from '$lib/server/reviews';
import { pathStates } from '$lib/pathState';
import type { PageServerLoad } from './$types';

const filterSchema = z.object({
	state: z.enum([...pathStates, 'waiting', 'all']).catch('waiting'),
	lab: z.uuid().optional().catch(undefined)
});

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const filter = filterSchema.parse(Object.fromEntries(url.searchParams));
	const [rows, all, counts] = await Promise.all([reviews.queue(scope, { state: filter.state, labId: filter.lab }), labs.list(), reviews.counts(scope)]);
	return {
		rows: rows.map((r) => ({ ...r, awaitingSince: r.awaitingSince?.toISOString() ?? null, updatedAt: r.updatedAt.toISOString() })),
		labs: scope.labIds === 'all' ? all : all.filter((l) => (scope.labIds as string[]).includes(l.id)),
		filter,
		counts,
		isOfficer: user.role === 'officer'
	};
};
