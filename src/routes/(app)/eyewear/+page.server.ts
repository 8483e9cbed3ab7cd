import { and, eq, inArray, sql } from 'drizzle-orm';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as eyewear from '$lib/server/eyewear';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const items = await eyewear.list(scope);
	// Cleared paths in scope, and whether their lab's eyewear meets their eyewear controls.
	const cleared = await db
		.select({ id: table.beamPath.id, name: table.beamPath.name, labCode: table.lab.code })
		.from(table.beamPath)
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
		.where(
			and(
				eq(table.beamPath.reviewState, 'cleared'),
				eq(table.beamPath.retired, false),
				scope.labIds === 'all' ? undefined : scope.labIds.length ? inArray(table.laser.labId, scope.labIds) : sql`false`
			)
		);
	const checks = await eyewear.checksForPaths(cleared.map((c) => c.id));
	return {
		items: items.map((i) => ({ ...i, lastCheckedAt: i.lastCheckedAt?.toISOString().slice(0, 10) ?? null, createdAt: i.createdAt.toISOString() })),
		cleared: cleared.map((c) => ({ ...c, check: checks.get(c.id) ?? null })),
		canManage: user.role === 'officer'
	};
};
