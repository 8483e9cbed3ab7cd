import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import type { mailModes } from '$lib/enums';

export type MailMode = (typeof mailModes)[number];

export async function mailMode(userId: string): Promise<MailMode> {
	const [row] = await db.select().from(table.userPreference).where(eq(table.userPreference.userId, userId));
	return row?.mailMode ?? 'immediate';
}

export async function setMailMode(userId: string, mode: MailMode): Promise<void> {
	await db.transaction(async (tx) => {
		const before = await tx.select().from(table.userPreference).where(eq(table.userPreference.userId, userId));
		await tx
			.insert(table.userPreference)
			.values({ userId, mailMode: mode })
			.onConflictDoUpdate({ target: table.userPreference.userId, set: { mailMode: mode, updatedAt: new Date() } });
		await audit.record(tx, { actorId: userId, action: 'preferences.update', entity: 'user', entityId: userId, before: before[0] ?? null, after: { mailMode: mode } });
	});
}
