// Who may see and change which lab's records. Researchers work in their own labs; officers in all;
// managers and admins read everything and change nothing in the register.
import { eq, inArray, sql, type Column, type SQL } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import type { SessionUser } from './session';

export type Scope = { userId: string; role: SessionUser['role']; labIds: string[] | 'all'; editLabIds: string[] | 'all' | 'none' };

export async function scopeOf(user: SessionUser): Promise<Scope> {
	if (user.role === 'officer') return { userId: user.id, role: user.role, labIds: 'all', editLabIds: 'all' };
	if (user.role === 'manager' || user.role === 'admin') return { userId: user.id, role: user.role, labIds: 'all', editLabIds: 'none' };
	const rows = await db.select({ labId: table.labMember.labId }).from(table.labMember).where(eq(table.labMember.userId, user.id));
	const labIds = rows.map((r) => r.labId);
	return { userId: user.id, role: user.role, labIds, editLabIds: labIds };
}

export function canRead(scope: Scope, labId: string): boolean {
	return scope.labIds === 'all' || scope.labIds.includes(labId);
}

export function canEdit(scope: Scope, labId: string): boolean {
	return scope.editLabIds === 'all' || (Array.isArray(scope.editLabIds) && scope.editLabIds.includes(labId));
}

/** The rows of the labs this scope reads, as a condition on a lab id column (undefined: every lab). */
export function inReadableLabs(scope: Scope, labId: Column): SQL | undefined {
	if (scope.labIds === 'all') return undefined;
	return scope.labIds.length ? inArray(labId, scope.labIds) : sql`false`;
}
