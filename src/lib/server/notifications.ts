// In-app notifications (the mail issue sends them as e-mail too). Written inside the caller's
// transaction, so a decision and the word of it commit together.
import { and, desc, eq } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';

export type NewNotification = { userIds: string[]; kind: string; pathId: string | null; title: string; body?: string };

export async function notify(tx: Tx, n: NewNotification): Promise<void> {
	const userIds = [...new Set(n.userIds)];
	if (userIds.length === 0) return;
	await tx.insert(table.notification).values(userIds.map((userId) => ({ userId, kind: n.kind, pathId: n.pathId, title: n.title, body: n.body ?? '' })));
}

export async function officerIds(tx: Tx): Promise<string[]> {
	const rows = await tx.select({ id: table.user.id }).from(table.user).where(and(eq(table.user.role, 'officer'), eq(table.user.disabled, false)));
	return rows.map((r) => r.id);
}

export async function recent(userId: string, limit = 20) {
	return db.select().from(table.notification).where(eq(table.notification.userId, userId)).orderBy(desc(table.notification.createdAt)).limit(limit);
}
