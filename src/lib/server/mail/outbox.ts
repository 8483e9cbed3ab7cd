// The e-mail ledger ("outbox"). A mail is a row first and a message second:
//   enqueue   inserts rows keyed by (kind, record, due key, step, recipient); a key seen before is
//             skipped, so computing a reminder again never sends it again;
//   deliver   claims due rows atomically (SKIP LOCKED: many workers never take the same row), sends
//             each with a Message-ID fixed by its row id, and records the outcome on the row;
//   assembleDigests  folds the rows held for digest readers into one mail per person per day.
// The rows stay for good: they are our sent-log (the job queue forgets its jobs).
import { createHash } from 'node:crypto';
import { and, asc, eq, inArray, lt, lte, or, sql } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { readMailConfig } from './config';
import { toIsoDay } from './schedule';
import * as templates from './templates';
import { createSender, describeError, isConnectionError, type MailSender } from './transport';

export const mailKinds = [
	'inspection.due',
	'inspection.overdue',
	'review.waiting',
	'training.expiring',
	'training.expired',
	'notification',
	'digest',
	'password.reset',
	'incident.eye_exposure',
	'action.overdue',
	'finding.overdue',
	// procedures and authorisations (recordId: the procedure, or the authorisation)
	'procedure.submitted',
	'procedure.review',
	'procedure.review_due',
	'signoff.needed',
	'signoff.lapsing',
	'authorisation.waiting',
	'authorisation.lapsing',
	'authorisation.lapsed'
] as const;
export type MailKind = (typeof mailKinds)[number];

/** Kinds that go out on their own even for digest readers. */
const alwaysImmediate: readonly string[] = ['password.reset', 'digest', 'incident.eye_exposure'];

export const MAX_ATTEMPTS = 20;
/** A row left in 'sending' this long belongs to a worker that died: another may take it. */
export const RECLAIM_AFTER_MS = 10 * 60_000;

export type MailInput = {
	kind: MailKind;
	recordId: string;
	dueKey: string;
	step: string;
	recipientId: string | null;
	recipientEmail: string;
	subject: string;
	text: string;
	html: string;
	reason: string;
};

/** 1, 2, 4, 8 … minutes after the n-th failed attempt, never more than an hour. */
export function backoffMs(attempts: number): number {
	const minutes = Math.min(2 ** Math.max(0, attempts - 1), 60);
	return minutes * 60_000;
}

export function messageIdFor(rowId: string): string {
	return `<${rowId}@beamwarden.local>`;
}

const keyOf = (m: Pick<MailInput, 'kind' | 'recordId' | 'dueKey' | 'step' | 'recipientEmail'>) => [m.kind, m.recordId, m.dueKey, m.step, m.recipientEmail.toLowerCase()].join('\u0000');

/**
 * Add mails to the ledger inside the caller's transaction. Rows whose key exists already are left
 * alone. Returns how many rows are new and how many of those wait for a digest.
 */
export async function enqueue(tx: Tx, mails: MailInput[]): Promise<{ inserted: number; held: number }> {
	if (mails.length === 0) return { inserted: 0, held: 0 };
	// One row per key even if the caller listed a person twice; a fixed order keeps concurrent
	// enqueuers from waiting on each other in a circle.
	const unique = [...new Map(mails.map((m) => [keyOf(m), { ...m, recipientEmail: m.recipientEmail.toLowerCase() }])).entries()]
		.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
		.map(([, m]) => m);

	const ids = [...new Set(unique.map((m) => m.recipientId).filter((x): x is string => !!x))];
	const prefs = ids.length
		? await tx.select({ userId: table.userPreference.userId, mode: table.userPreference.mailMode }).from(table.userPreference).where(inArray(table.userPreference.userId, ids))
		: [];
	const digestReaders = new Set(prefs.filter((p) => p.mode === 'digest').map((p) => p.userId));

	let inserted = 0;
	let held = 0;
	for (let i = 0; i < unique.length; i += 500) {
		const rows = unique.slice(i, i + 500).map((m) => ({
			kind: m.kind,
			recordId: m.recordId,
			dueKey: m.dueKey,
			step: m.step,
			recipientId: m.recipientId,
			recipientEmail: m.recipientEmail,
			subject: templates.cleanHeaderText(m.subject),
			textBody: m.text,
			htmlBody: m.html,
			reason: m.reason,
			status: (m.recipientId && digestReaders.has(m.recipientId) && !alwaysImmediate.includes(m.kind) ? 'held' : 'pending') as 'held' | 'pending'
		}));
		const out = await tx
			.insert(table.mailOutbox)
			.values(rows)
			.onConflictDoNothing({ target: [table.mailOutbox.kind, table.mailOutbox.recordId, table.mailOutbox.dueKey, table.mailOutbox.step, table.mailOutbox.recipientEmail] })
			.returning({ status: table.mailOutbox.status });
		inserted += out.length;
		held += out.filter((r) => r.status === 'held').length;
	}
	return { inserted, held };
}

export type DeliverResult = { claimed: number; sent: number; retrying: number; failed: number };

/**
 * Send what is due. Rows are claimed in one statement (pending and due, or stuck in 'sending' for
 * more than ten minutes), so two workers never take the same row; a failure keeps the row pending
 * with a later next attempt, and after MAX_ATTEMPTS it is marked failed, still in the ledger.
 */
export async function deliver(opts: { now?: Date; limit?: number; sender?: MailSender } = {}): Promise<DeliverResult> {
	const now = opts.now ?? new Date();
	const limit = opts.limit ?? 50;
	const t = table.mailOutbox;
	const stuckBefore = new Date(now.getTime() - RECLAIM_AFTER_MS);

	const due = db
		.select({ id: t.id })
		.from(t)
		.where(or(and(eq(t.status, 'pending'), lte(t.nextAttemptAt, now)), and(eq(t.status, 'sending'), lt(t.claimedAt, stuckBefore))))
		.orderBy(asc(t.createdAt))
		.limit(limit)
		.for('update', { skipLocked: true });
	const claimed = await db.update(t).set({ status: 'sending', claimedAt: now }).where(inArray(t.id, due)).returning();
	const result: DeliverResult = { claimed: claimed.length, sent: 0, retrying: 0, failed: 0 };
	if (claimed.length === 0) return result;
	claimed.sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime());

	let sender = opts.sender;
	let ownSender = false;
	let unreachable: string | null = null;
	try {
		if (!sender) {
			sender = createSender(readMailConfig());
			ownSender = true;
		}
	} catch (e) {
		// Bad settings: nothing can be sent; every claimed row waits for the next attempt.
		unreachable = describeError(e);
	}

	const started = Date.now();
	try {
		for (const row of claimed) {
			// The claim is renewed row by row just before sending: a batch behind a slow server would
			// otherwise look stuck to another worker, which would reclaim and send the same rows. A row
			// another worker has taken meanwhile is skipped; the marks below check the claim too.
			const claim = new Date(now.getTime() + (Date.now() - started));
			const [still] = await db
				.update(t)
				.set({ claimedAt: claim })
				.where(and(eq(t.id, row.id), eq(t.status, 'sending'), eq(t.claimedAt, row.claimedAt!)))
				.returning({ id: t.id });
			if (!still) {
				result.claimed--;
				continue;
			}
			row.claimedAt = claim;
			if (unreachable === null && sender) {
				try {
					await sender.send({ messageId: messageIdFor(row.id), to: row.recipientEmail, subject: row.subject, text: row.textBody, html: row.htmlBody, kind: row.kind });
					await markSent(row, now);
					result.sent++;
					continue;
				} catch (e) {
					if (isConnectionError(e)) unreachable = describeError(e);
					else {
						(await markFailedAttempt(row, now, describeError(e))) === 'failed' ? result.failed++ : result.retrying++;
						continue;
					}
				}
			}
			// The server could not be reached (or is not configured): the rest of the batch is
			// released with the same error rather than tried one by one.
			(await markFailedAttempt(row, now, unreachable ?? 'not sent')) === 'failed' ? result.failed++ : result.retrying++;
		}
	} finally {
		if (ownSender) sender?.close();
	}
	return result;
}

async function markSent(row: table.MailOutbox, now: Date) {
	const t = table.mailOutbox;
	// A one-time reset link is not kept in the ledger once it has gone out.
	const redact = row.kind === 'password.reset' ? { textBody: '(removed after sending: it held a one-time link)', htmlBody: '<p>(removed after sending: it held a one-time link)</p>' } : {};
	await db
		.update(t)
		.set({ status: 'sent', sentAt: now, claimedAt: null, lastError: null, attempts: sql`${t.attempts} + 1`, ...redact })
		.where(and(eq(t.id, row.id), eq(t.status, 'sending'), eq(t.claimedAt, row.claimedAt!)));
}

async function markFailedAttempt(row: table.MailOutbox, now: Date, error: string): Promise<'pending' | 'failed'> {
	const t = table.mailOutbox;
	const attempts = row.attempts + 1;
	const status = attempts >= MAX_ATTEMPTS ? 'failed' : 'pending';
	await db
		.update(t)
		.set({ status, attempts, lastError: error, claimedAt: null, nextAttemptAt: new Date(now.getTime() + backoffMs(attempts)) })
		.where(and(eq(t.id, row.id), eq(t.status, 'sending'), eq(t.claimedAt, row.claimedAt!)));
	return status;
}

/** Deliver batch after batch until nothing due is left (bounded, so one job never runs forever). */
export async function deliverAll(opts: { now?: Date; batch?: number; maxBatches?: number } = {}): Promise<DeliverResult> {
	const total: DeliverResult = { claimed: 0, sent: 0, retrying: 0, failed: 0 };
	const batch = opts.batch ?? 50;
	for (let i = 0; i < (opts.maxBatches ?? 40); i++) {
		const r = await deliver({ now: opts.now, limit: batch });
		total.claimed += r.claimed;
		total.sent += r.sent;
		total.retrying += r.retrying;
		total.failed += r.failed;
		// Stop when the batch was not full, or when the server is failing (no point hammering it).
		if (r.claimed < batch || r.sent === 0) break;
	}
	return total;
}

// ---------------------------------------------------------------------------------------------
// Digests

/** Where a ledger row's record lives in the app, for the digest's list. */
async function linksFor(tx: Tx, rows: table.MailOutbox[], appUrl: string): Promise<Map<string, string>> {
	const notificationIds = rows.filter((r) => r.kind === 'notification').map((r) => r.recordId);
	const notes = notificationIds.length
		? await tx.select({ id: table.notification.id, kind: table.notification.kind, pathId: table.notification.pathId }).from(table.notification).where(inArray(table.notification.id, notificationIds))
		: [];
	const byId = new Map(notes.map((n) => [n.id, n]));
	const out = new Map<string, string>();
	for (const r of rows) {
		if (r.kind === 'inspection.due' || r.kind === 'inspection.overdue') out.set(r.id, templates.link(appUrl, 'inspections', r.recordId));
		else if (r.kind === 'review.waiting') out.set(r.id, templates.link(appUrl, 'reviews', r.recordId));
		else if (r.kind === 'training.expiring' || r.kind === 'training.expired') out.set(r.id, templates.link(appUrl, 'training'));
		else if (r.kind === 'incident.eye_exposure') out.set(r.id, templates.link(appUrl, 'incidents', r.recordId));
		else if (r.kind === 'action.overdue') out.set(r.id, templates.link(appUrl, 'incidents'));
		else if (r.kind === 'finding.overdue') out.set(r.id, templates.link(appUrl, 'inspections'));
		else if (r.kind.startsWith('procedure.') || r.kind.startsWith('signoff.')) out.set(r.id, templates.link(appUrl, 'procedures', r.recordId));
		else if (r.kind.startsWith('authorisation.')) out.set(r.id, templates.link(appUrl, 'authorisations', r.recordId));
		else if (r.kind === 'notification') {
			const n = byId.get(r.recordId);
			out.set(r.id, templates.notificationLink(appUrl, n?.kind ?? '', n?.pathId ?? null));
		} else out.set(r.id, templates.link(appUrl, 'overview'));
	}
	return out;
}

/**
 * One digest mail per person with held rows, keyed by (person, day): the held rows are marked
 * 'digested' and point at it. Held rows that arrive after the day's digest wait for the next one.
 */
export async function assembleDigests(today: Date | string): Promise<{ digests: number; items: number }> {
	const day = toIsoDay(today);
	const t = table.mailOutbox;
	const people = await db.selectDistinct({ userId: t.recipientId }).from(t).where(eq(t.status, 'held'));
	if (people.length === 0) return { digests: 0, items: 0 };
	const { appUrl } = readMailConfig();
	let digests = 0;
	let items = 0;
	for (const { userId } of people.sort((a, b) => String(a.userId).localeCompare(String(b.userId)))) {
		if (!userId) continue;
		const out = await db.transaction(async (tx) => {
			// Locks the person's held rows: a second assembler waits here, then finds none held.
			const rows = await tx.select().from(t).where(and(eq(t.status, 'held'), eq(t.recipientId, userId))).orderBy(asc(t.createdAt)).for('update');
			if (rows.length === 0) return null;
			const [person] = await tx.select({ email: table.user.email, disabled: table.user.disabled }).from(table.user).where(eq(table.user.id, userId));
			if (!person || person.disabled) {
				await tx.update(t).set({ status: 'failed', lastError: 'recipient account disabled before the digest went out' }).where(inArray(t.id, rows.map((r) => r.id)));
				return null;
			}
			const links = await linksFor(tx, rows, appUrl);
			const body = templates.digest({ appUrl, date: day, items: rows.map((r) => ({ subject: r.subject, reason: r.reason, url: links.get(r.id)! })) });
			const [created] = await tx
				.insert(t)
				.values({
					kind: 'digest',
					recordId: userId,
					dueKey: day,
					step: 'daily',
					recipientId: userId,
					recipientEmail: person.email.toLowerCase(),
					subject: body.subject,
					textBody: body.text,
					htmlBody: body.html,
					reason: 'You chose one daily digest instead of separate mails.',
					status: 'pending'
				})
				.onConflictDoNothing({ target: [t.kind, t.recordId, t.dueKey, t.step, t.recipientEmail] })
				.returning({ id: t.id });
			if (!created) return null; // today's digest went out already
			await tx.update(t).set({ status: 'digested', digestId: created.id }).where(inArray(t.id, rows.map((r) => r.id)));
			return rows.length;
		});
		if (out) {
			digests++;
			items += out;
		}
	}
	return { digests, items };
}

// ---------------------------------------------------------------------------------------------
// Password reset

/**
 * Put a reset mail in the ledger inside the caller's transaction (next to the password_reset row).
 * Always immediate. The link is `${APP_URL}/reset-password/<token>`; the ledger key holds a hash
 * of the token, never the token, and the body is blanked once the mail has gone out. After the
 * commit, nudge the 'mail-deliver' queue so it goes out within seconds.
 */
export async function enqueuePasswordReset(tx: Tx, input: { user: { id: string; email: string; name: string }; token: string; expiresAt: Date }): Promise<void> {
	const { appUrl } = readMailConfig();
	const body = templates.passwordReset({ appUrl, name: input.user.name, resetUrl: templates.link(appUrl, 'reset-password', input.token), expiresAt: input.expiresAt });
	await enqueue(tx, [
		{
			kind: 'password.reset',
			recordId: createHash('sha256').update(input.token).digest('hex'),
			dueKey: input.expiresAt.toISOString(),
			step: 'once',
			recipientId: input.user.id,
			recipientEmail: input.user.email,
			subject: body.subject,
			text: body.text,
			html: body.html,
			reason: 'Someone asked to reset the password of the account with this address.'
		}
	]);
}

/** The ledger as the admin sees it: newest first, never the bodies of reset mails. */
export async function recentLedger(limit = 50) {
	const t = table.mailOutbox;
	return db
		.select({ id: t.id, kind: t.kind, recipientEmail: t.recipientEmail, subject: t.subject, status: t.status, attempts: t.attempts, nextAttemptAt: t.nextAttemptAt, lastError: t.lastError, sentAt: t.sentAt, createdAt: t.createdAt })
		.from(t)
		.orderBy(sql`${t.createdAt} DESC`)
		.limit(Math.min(Math.max(limit, 1), 500));
}
