// Password reset by an e-mailed one-time link: a 256-bit random token, only its SHA-256 stored,
// valid for 30 minutes, used once. The request answers the same, after the same work, whether or not
// the account exists; it is limited per client address and per typed address.
import { createHash, randomBytes } from 'node:crypto';
import { and, eq, gt, isNull, lt, sql } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { hashPassword, passwordProblem } from '$lib/server/auth/password';
import * as throttle from '$lib/server/auth/throttle';
import { enqueuePasswordReset } from '$lib/server/mail/outbox';
import { nudge, queues } from '$lib/server/jobs/queues';
import { failure, fieldsNeedAttention, type Failure } from '$lib/server/http/failure';

export const RESET_VALID_MS = 30 * 60 * 1000;
/** Links mailed to one account in an hour; requests beyond it are recorded and answered alike, and send nothing. */
export const MAX_LINKS_PER_ACCOUNT_PER_HOUR = 3;
/** Requests for one typed address in an hour, whether or not an account uses it (the same, quietly). */
export const MAX_PER_EMAIL_PER_HOUR = 5;
/** Requests from one client address in an hour; beyond it the requester is told to wait (429). */
export const MAX_PER_ADDRESS_PER_HOUR = 10;

const hash = (token: string) => createHash('sha256').update(token).digest('hex');

export type RequestOutcome = { ok: true } | Failure;

/**
 * A reset request. It does the same work whether or not an account uses the address, so neither
 * its answer nor its timing tells who has an account: two counts and one row, then a nudge to the
 * mail job, which looks the account up (processRequests) and mails the link.
 */
export async function request(emailInput: string, address: string, now = new Date()): Promise<RequestOutcome> {
	const email = emailInput.trim().toLowerCase();
	const hourAgo = new Date(now.getTime() - 3600_000).toISOString();
	const [counts] = await db.execute<{ from_address: number; for_email: number }>(sql`
		SELECT count(*) FILTER (WHERE address = ${address})::int AS from_address, count(*) FILTER (WHERE email = ${email})::int AS for_email
		FROM password_reset_request
		WHERE requested_at > ${hourAgo}::timestamptz AND (address = ${address} OR email = ${email})`);
	if (counts.from_address >= MAX_PER_ADDRESS_PER_HOUR)
		return failure(429, 'Too many reset requests from here. Wait an hour, or ask an administrator to set a new password.');
	// Over the per-address-typed limit the request is kept (it counts) but already done: nothing is mailed.
	const quiet = counts.for_email >= MAX_PER_EMAIL_PER_HOUR;
	await db.insert(table.passwordResetRequest).values({ email, address, requestedAt: now, processedAt: quiet ? now : null });
	await nudge(queues.mailDeliver);
	return { ok: true };
}

/**
 * The mail job's part: each waiting request, claimed in its own transaction (SKIP LOCKED, so two
 * instances never take the same one), becomes a reset link mailed through the ledger when an active
 * account uses the address and has had fewer than MAX_LINKS_PER_ACCOUNT_PER_HOUR links this hour.
 */
export async function processRequests(now = new Date()): Promise<{ processed: number; linked: number }> {
	let processed = 0;
	let linked = 0;
	for (;;) {
		const done = await db.transaction(async (tx) => {
			const [waiting] = await tx.execute<{ id: number; email: string }>(sql`
				SELECT id, email FROM password_reset_request WHERE processed_at IS NULL ORDER BY id LIMIT 1 FOR UPDATE SKIP LOCKED`);
			if (!waiting) return null;
			const sent = await issueLink(tx, waiting.email, now);
			await tx.update(table.passwordResetRequest).set({ processedAt: now }).where(eq(table.passwordResetRequest.id, Number(waiting.id)));
			return { sent };
		});
		if (!done) return { processed, linked };
		processed++;
		if (done.sent) linked++;
	}
}

async function issueLink(tx: Tx, email: string, now: Date): Promise<boolean> {
	const [person] = await tx.select().from(table.user).where(eq(table.user.email, email));
	if (!person || person.disabled) return false;
	const hourAgo = new Date(now.getTime() - 3600_000).toISOString();
	const recent = await tx.$count(table.passwordReset, and(eq(table.passwordReset.userId, person.id), sql`${table.passwordReset.createdAt} > ${hourAgo}::timestamptz`));
	if (recent >= MAX_LINKS_PER_ACCOUNT_PER_HOUR) return false;
	const token = randomBytes(32).toString('base64url');
	const expiresAt = new Date(now.getTime() + RESET_VALID_MS);
	await tx.insert(table.passwordReset).values({ tokenHash: hash(token), userId: person.id, expiresAt, createdAt: now });
	await enqueuePasswordReset(tx, { user: { id: person.id, email: person.email, name: person.name }, token, expiresAt });
	await audit.record(tx, { actorId: null, action: 'password.reset-requested', entity: 'user', entityId: person.id });
	return true;
}

/** Requests older than a day count toward nothing any more. */
export async function purgeRequests(now = new Date()): Promise<number> {
	const dayAgo = new Date(now.getTime() - 24 * 3600_000);
	const gone = await db.delete(table.passwordResetRequest).where(lt(table.passwordResetRequest.requestedAt, dayAgo)).returning({ id: table.passwordResetRequest.id });
	return gone.length;
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
	const outcome = await db.transaction(async (tx) => {
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
	// The owner proved they hold the mailbox: strangers' failures no longer throttle the account.
	if (outcome.ok) await throttle.clearAccount(found.email);
	return outcome;
}
