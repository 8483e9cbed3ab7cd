// Password reset by an e-mailed one-time link: a 256-bit random token, only its SHA-256 stored,
// valid for 30 minutes, used once. The request answers the same whether or not the account exists.
import { createHash, randomBytes } from 'node:crypto';
import { and, eq, gt, isNull, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { hashPassword, passwordProblem } from '$lib/server/auth/password';
import { enqueuePasswordReset } from '$lib/server/mail/outbox';
import * as jobs from '$lib/server/jobs';
import { queues } from '$lib/server/jobs/queues';
import { failure, fieldsNeedAttention, type Failure } from '$lib/server/failure';

export const RESET_VALID_MS = 30 * 60 * 1000;
const MAX_PER_HOUR = 3;

const hash = (token: string) => createHash('sha256').update(token).digest('hex');

export async function request(emailInput: string, now = new Date()): Promise<void> {
	const email = emailInput.trim().toLowerCase();
	const [person] = await db.select().from(table.user).where(eq(table.user.email, email));
	if (!person || person.disabled) return;
	const hourAgo = new Date(now.getTime() - 3600_000).toISOString();
	const recent = await db.$count(table.passwordReset, and(eq(table.passwordReset.userId, person.id), sql`${table.passwordReset.createdAt} > ${hourAgo}::timestamptz`));
	if (recent >= MAX_PER_HOUR) return; // quietly: the answer never tells who has an account
	const token = randomBytes(32).toString('base64url');
	const expiresAt = new Date(now.getTime() + RESET_VALID_MS);
	await db.transaction(async (tx) => {
		await tx.insert(table.passwordReset).values({ tokenHash: hash(token), userId: person.id, expiresAt });
		await enqueuePasswordReset(tx, { user: { id: person.id, email: person.email, name: person.name }, token, expiresAt });
		await audit.record(tx, { actorId: null, action: 'password.reset-requested', entity: 'user', entityId: person.id });
	});
	await jobs.nudge(queues.mailDeliver);
}

/** Whether a token may still be used (for the page, before the form is sent). */
export async function isUsable(token: string, now = new Date()): Promise<boolean> {
	const [row] = await db
		.select({ userId: table.passwordReset.userId })
		.from(table.passwordReset)
		.where(and(eq(table.passwordReset.tokenHash, hash(token)), isNull(table.passwordReset.usedAt), gt(table.passwordReset.expiresAt, now)));
	return !!row;
}

/** Set the new password, use up the token and end every session of the person, in one transaction. */
export async function complete(token: string, password: string, now = new Date()): Promise<{ ok: true } | Failure> {
	const usable = and(eq(table.passwordReset.tokenHash, hash(token)), isNull(table.passwordReset.usedAt), gt(table.passwordReset.expiresAt, now));
	const [found] = await db.select({ userId: table.passwordReset.userId, name: table.user.name, email: table.user.email }).from(table.passwordReset).innerJoin(table.user, eq(table.user.id, table.passwordReset.userId)).where(usable);
	if (!found) return failure(400, 'This link has expired or was already used. Ask for a new one.');
	const problem = passwordProblem(password, [found.name, found.email.split('@')[0]]);
	if (problem) return fieldsNeedAttention({ password: problem });
	const passwordHash = await hashPassword(password);
	return db.transaction(async (tx) => {
		// Used once: a second request racing this one finds no usable row and changes nothing.
		const [row] = await tx.update(table.passwordReset).set({ usedAt: now }).where(usable).returning();
		if (!row) return failure(400, 'This link has expired or was already used. Ask for a new one.');
		await tx.update(table.user).set({ passwordHash, updatedAt: now }).where(eq(table.user.id, row.userId));
		// Any other link still open for this person dies with this one.
		await tx.update(table.passwordReset).set({ usedAt: now }).where(and(eq(table.passwordReset.userId, row.userId), isNull(table.passwordReset.usedAt)));
		await tx.delete(table.session).where(eq(table.session.userId, row.userId));
		await audit.record(tx, { actorId: row.userId, action: 'password.reset', entity: 'user', entityId: row.userId });
		return { ok: true } as const;
	});
}
