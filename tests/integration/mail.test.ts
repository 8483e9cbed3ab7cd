// The mail ledger against the real PostgreSQL and the real fake SMTP server on loopback.
import { randomUUID } from 'node:crypto';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import nodemailer from 'nodemailer';
import { and, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as outbox from '$lib/server/mail/outbox';
import type { MailSender } from '$lib/server/mail/transport';
import { listMailbox, readMailboxDir, readMailboxMessage, type StoredMail } from '$lib/server/mail/mailbox';
import * as templates from '$lib/server/mail/templates';
import { createSender } from '$lib/server/mail/transport';
import { readMailConfig } from '$lib/server/mail/config';
import { handlersAtWork, stopJobs } from '$lib/server/jobs/workers';
import { nudge, queueDefinitions, queues } from '$lib/server/jobs/queues';
import { startFakeMailServer, type FakeMailServer } from '../../scripts/fake-mail';
import { makeUser, startJobsForTest } from './factories';
import { freePort } from '../free-port';

let SMTP_PORT = 0;
/** Nothing listens here: the "SMTP server is down" case. */
let DEAD_PORT = 0;
const APP_URL = 'http://beamwarden.test';

let dir: string;
let server: FakeMailServer | null = null;
const savedEnv = { ...process.env };

async function startServer() {
	server = await startFakeMailServer({ port: SMTP_PORT, dir });
	return server;
}
async function stopServer() {
	await server?.close();
	server = null;
}

beforeAll(async () => {
	dir = await mkdtemp(join(tmpdir(), 'beamwarden-mailbox-'));
	[SMTP_PORT, DEAD_PORT] = [await freePort(), await freePort()];
	process.env.APP_URL = APP_URL;
	process.env.SMTP_HOST = '127.0.0.1';
	await startServer();
});

beforeEach(() => {
	process.env.SMTP_PORT = String(SMTP_PORT);
});

afterAll(async () => {
	await stopServer();
	await rm(dir, { recursive: true, force: true });
	for (const k of ['APP_URL', 'SMTP_HOST', 'SMTP_PORT']) {
		if (savedEnv[k] === undefined) delete process.env[k];
		else process.env[k] = savedEnv[k];
	}
});

type Recipient = { id: string; email: string };

function mail(to: Recipient, overrides: Partial<outbox.MailInput> = {}): outbox.MailInput {
	const recordId = overrides.recordId ?? randomUUID();
	const body = templates.inspectionDue({
		appUrl: APP_URL,
		inspectionId: recordId,
		area: { id: 'a', name: 'Test bay', room: '1.01', building: 'Main', labName: 'Test lab' },
		dueOn: '2027-03-08',
		daysUntil: 7,
		reason: 'You are the inspector of this area.'
	});
	return {
		kind: 'inspection.due',
		recordId,
		dueKey: '2027-03-08',
		step: '7',
		recipientId: to.id,
		recipientEmail: to.email,
		subject: body.subject,
		text: body.text,
		html: body.html,
		reason: 'You are the inspector of this area.',
		...overrides
	};
}

async function enqueue(mails: outbox.MailInput[]) {
	return db.transaction((tx) => outbox.enqueue(tx, mails));
}

async function rowsFor(recordIds: string[]) {
	return db.select().from(table.mailOutbox).where(inArray(table.mailOutbox.recordId, recordIds));
}

async function mailbox(): Promise<Map<string, StoredMail>> {
	return new Map((await readMailboxDir(dir)).map((m) => [m.messageId, m]));
}

const minutes = (n: number) => n * 60_000;

describe('the fake SMTP server', () => {
	it('keeps one JSON file per Message-ID and the mailbox reader lists it', async () => {
		const t = nodemailer.createTransport({ host: '127.0.0.1', port: SMTP_PORT, secure: false, auth: { user: 'any', pass: 'thing' } });
		const messageId = `<${randomUUID()}@fake.test>`;
		const before = server!.received();
		for (let i = 0; i < 2; i++)
			await t.sendMail({ from: 'a@test.example', to: 'b@test.example', bcc: 'c@test.example', subject: 'Hello twice', text: 'plain', html: '<p>rich</p>', messageId });
		t.close();
		expect(server!.received() - before).toBe(2);

		const stored = (await mailbox()).get(messageId)!;
		expect(stored).toMatchObject({ messageId, subject: 'Hello twice', text: 'plain', html: '<p>rich</p>' });
		expect(stored.to.sort()).toEqual(['b@test.example', 'c@test.example']);
		expect(stored.headers['message-id']).toBe(messageId);
		expect((await readdir(dir)).filter((f) => f.startsWith(stored.id))).toHaveLength(1);

		const env = { BEAMWARDEN_MAILBOX_DIR: dir, NODE_ENV: 'development' };
		const page = await listMailbox({ page: 1, pageSize: 10 }, env);
		if (!page.available) throw new Error(page.reason);
		expect(page.messages[0].messageId).toBe(messageId);
		const one = await readMailboxMessage(stored.id, env);
		expect(one.available && one.message?.subject).toBe('Hello twice');
		expect(await readMailboxMessage('../../etc/passwd', env)).toEqual({ available: true, message: null });
		expect(await listMailbox({}, { ...env, NODE_ENV: 'production' })).toMatchObject({ available: false });
		expect(await listMailbox({}, {})).toMatchObject({ available: false, reason: expect.stringContaining('BEAMWARDEN_MAILBOX_DIR') });
	});
});

describe('the ledger', () => {
	let person: Recipient;
	beforeAll(async () => {
		person = await makeUser('officer');
	});

	it('waits 1, 2, 4 … minutes between attempts, never more than an hour', () => {
		expect([1, 2, 3, 4, 6, 7, 20].map((n) => outbox.backoffMs(n) / 60_000)).toEqual([1, 2, 4, 8, 32, 60, 60]);
	});

	it('a batch behind a slow server is not sent twice when another worker reclaims rows that look stuck', async () => {
		await outbox.deliverAll(); // what other tests left due
		const [m1, m2] = [mail(person), mail(person)];
		await enqueue([m1, m2]);
		const [r1, r2] = (await rowsFor([m1.recordId, m2.recordId])).sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime() || (a.recordId === m1.recordId ? -1 : 1));
		const sends: string[] = [];
		const quick: MailSender = { send: async (m) => void sends.push(m.messageId), close: () => {} };
		const slow: MailSender = {
			async send(m) {
				sends.push(m.messageId);
				if (sends.length > 1) return;
				// Meanwhile the second row has waited in the batch past the reclaim time, and another
				// worker runs: it takes that row as stuck and sends it.
				await db.update(table.mailOutbox).set({ claimedAt: new Date(Date.now() - outbox.RECLAIM_AFTER_MS - minutes(1)) }).where(inArray(table.mailOutbox.id, [r1.id, r2.id].filter((id) => id !== idOf(m.messageId))));
				await outbox.deliver({ sender: quick });
			},
			close: () => {}
		};
		const idOf = (messageId: string) => [r1, r2].find((r) => outbox.messageIdFor(r.id) === messageId)!.id;
		await outbox.deliver({ sender: slow });
		const ours = sends.filter((id) => id === outbox.messageIdFor(r1.id) || id === outbox.messageIdFor(r2.id));
		expect(ours.sort()).toEqual([outbox.messageIdFor(r1.id), outbox.messageIdFor(r2.id)].sort()); // each once
		expect((await rowsFor([m1.recordId, m2.recordId])).map((r) => r.status)).toEqual(['sent', 'sent']);
	});

	it('never adds a second row for the same key', async () => {
		const m = mail(person);
		expect(await enqueue([m, { ...m, recipientEmail: m.recipientEmail.toUpperCase() }])).toEqual({ inserted: 1, held: 0 });
		expect(await enqueue([m])).toEqual({ inserted: 0, held: 0 });
		expect(await rowsFor([m.recordId])).toHaveLength(1);
		await outbox.deliver();
	});

	it('sends each row once with the Message-ID fixed by its id', async () => {
		const mails = [mail(person), mail(person), mail(person)];
		await enqueue(mails);
		const before = server!.received();
		const r = await outbox.deliver();
		expect(r).toMatchObject({ claimed: 3, sent: 3, retrying: 0 });
		expect(await outbox.deliver()).toMatchObject({ claimed: 0 });
		expect(server!.received() - before).toBe(3);

		const rows = await rowsFor(mails.map((m) => m.recordId));
		const box = await mailbox();
		for (const row of rows) {
			expect(row).toMatchObject({ status: 'sent', attempts: 1, claimedAt: null, lastError: null });
			expect(row.sentAt).toBeInstanceOf(Date);
			const got = box.get(`<${row.id}@beamwarden.local>`)!;
			expect(got.to).toEqual([person.email]);
			expect(got.subject).toBe(row.subject);
			expect(got.from).toContain('beamwarden@localhost');
			expect(got.headers['auto-submitted']).toBe('auto-generated');
			expect(got.text).toContain('Why you got this: You are the inspector of this area.');
			expect(got.text).toContain(`${APP_URL}/inspections/${row.recordId}`);
			expect(got.html).toContain(`href="${APP_URL}/inspections/${row.recordId}"`);
		}
	});

	it('lets concurrent deliverers share the work without sending a row twice', async () => {
		const mails = Array.from({ length: 24 }, () => mail(person));
		await enqueue(mails);
		const before = server!.received();
		const results = await Promise.all([1, 2, 3, 4].map(() => outbox.deliver({ limit: 5 })));
		const more = await outbox.deliverAll({ batch: 5 });
		const sent = results.reduce((n, r) => n + r.sent, 0) + more.sent;
		expect(sent).toBe(24);
		expect(server!.received() - before).toBe(24);
		const rows = await rowsFor(mails.map((m) => m.recordId));
		expect(rows.every((r) => r.status === 'sent' && r.attempts === 1)).toBe(true);
	});

	it('keeps mail pending while the SMTP server is down and sends it, once, when it is back', async () => {
		const mails = [mail(person), mail(person), mail(person)];
		await enqueue(mails);
		await stopServer();
		const t0 = new Date();

		const down = await outbox.deliver({ now: t0 });
		expect(down).toMatchObject({ claimed: 3, sent: 0, retrying: 3 });
		let rows = await rowsFor(mails.map((m) => m.recordId));
		for (const r of rows) {
			expect(r).toMatchObject({ status: 'pending', attempts: 1, claimedAt: null });
			expect(r.nextAttemptAt.getTime()).toBe(t0.getTime() + minutes(1));
			expect(r.lastError).toMatch(/ECONN|ESOCKET/);
		}
		// Not before the backoff has passed.
		expect(await outbox.deliver({ now: new Date(t0.getTime() + 30_000) })).toMatchObject({ claimed: 0 });
		// Still down a minute later: the wait doubles.
		await outbox.deliver({ now: new Date(t0.getTime() + minutes(1)) });
		rows = await rowsFor(mails.map((m) => m.recordId));
		for (const r of rows) {
			expect(r).toMatchObject({ status: 'pending', attempts: 2 });
			expect(r.nextAttemptAt.getTime()).toBe(t0.getTime() + minutes(1) + minutes(2));
		}

		await startServer();
		const before = server!.received();
		expect(await outbox.deliver({ now: new Date(t0.getTime() + minutes(2)) })).toMatchObject({ claimed: 0 });
		const up = await outbox.deliver({ now: new Date(t0.getTime() + minutes(3)) });
		expect(up).toMatchObject({ claimed: 3, sent: 3 });
		expect(await outbox.deliver({ now: new Date(t0.getTime() + minutes(60)) })).toMatchObject({ claimed: 0 });
		expect(server!.received() - before).toBe(3);

		rows = await rowsFor(mails.map((m) => m.recordId));
		const box = await mailbox();
		for (const r of rows) {
			expect(r).toMatchObject({ status: 'sent', attempts: 3 });
			expect(box.has(outbox.messageIdFor(r.id))).toBe(true);
		}
	});

	it('takes back a row a dead worker left in sending; the reader still sees one message', async () => {
		const [stuck, fresh] = [mail(person), mail(person)];
		await enqueue([stuck, fresh]);
		const [stuckRow] = await rowsFor([stuck.recordId]);
		const [freshRow] = await rowsFor([fresh.recordId]);
		const now = new Date();
		// The dead worker got as far as handing the message to the server.
		const sender = createSender(readMailConfig());
		await sender.send({ messageId: outbox.messageIdFor(stuckRow.id), to: stuckRow.recipientEmail, subject: stuckRow.subject, text: stuckRow.textBody, html: stuckRow.htmlBody, kind: stuckRow.kind });
		sender.close();
		await db.update(table.mailOutbox).set({ status: 'sending', claimedAt: new Date(now.getTime() - minutes(11)) }).where(eq(table.mailOutbox.id, stuckRow.id));
		// A live worker claimed this one five minutes ago: not taken.
		await db.update(table.mailOutbox).set({ status: 'sending', claimedAt: new Date(now.getTime() - minutes(5)) }).where(eq(table.mailOutbox.id, freshRow.id));

		const before = server!.stored();
		expect(await outbox.deliver({ now })).toMatchObject({ claimed: 1, sent: 1 });
		expect(server!.stored() - before).toBe(0);
		const files = (await readMailboxDir(dir)).filter((m) => m.messageId === outbox.messageIdFor(stuckRow.id));
		expect(files).toHaveLength(1);
		expect((await rowsFor([fresh.recordId]))[0].status).toBe('sending');

		// Ten minutes on, the second one is taken back too.
		expect(await outbox.deliver({ now: new Date(now.getTime() + minutes(6)) })).toMatchObject({ claimed: 1, sent: 1 });
	});

	it('marks a row failed after the last attempt and keeps it in the ledger', async () => {
		const m = mail(person);
		await enqueue([m]);
		await db.update(table.mailOutbox).set({ attempts: outbox.MAX_ATTEMPTS - 1 }).where(eq(table.mailOutbox.recordId, m.recordId));
		process.env.SMTP_PORT = String(DEAD_PORT);
		expect(await outbox.deliver()).toMatchObject({ claimed: 1, failed: 1 });
		const [row] = await rowsFor([m.recordId]);
		expect(row).toMatchObject({ status: 'failed', attempts: outbox.MAX_ATTEMPTS });
		expect(row.lastError).toBeTruthy();
		process.env.SMTP_PORT = String(SMTP_PORT);
		expect(await outbox.deliver({ now: new Date(Date.now() + minutes(120)) })).toMatchObject({ claimed: 0 });
	});

	it('keeps mail pending with a message naming the variable when the settings are wrong', async () => {
		const m = mail(person);
		await enqueue([m]);
		process.env.SMTP_PORT = 'twenty-five';
		const now = new Date();
		expect(await outbox.deliver({ now })).toMatchObject({ claimed: 1, retrying: 1 });
		const [row] = await rowsFor([m.recordId]);
		expect(row.status).toBe('pending');
		expect(row.lastError).toContain('SMTP_PORT');
		process.env.SMTP_PORT = String(SMTP_PORT);
		expect(await outbox.deliver({ now: new Date(now.getTime() + minutes(2)) })).toMatchObject({ sent: 1 });
	});

	it('cleans CR/LF out of subjects built from record titles', async () => {
		const evil = 'Bench 2\r\nBcc: intruder@evil.example\r\n\r\nInjected body';
		const body = templates.reviewWaiting({ appUrl: APP_URL, pathId: randomUUID(), pathName: evil, laserLabel: 'Test laser', labName: 'Test lab', waitingSince: '2027-02-01', daysWaiting: 9, reason: 'You are a laser safety officer.' });
		const m = mail(person, { kind: 'review.waiting', subject: body.subject, text: body.text, html: body.html });
		// Even a subject handed in raw is cleaned by the ledger.
		const raw = mail(person, { subject: `Raw ${evil}` });
		await enqueue([m, raw]);
		await outbox.deliver();
		const rows = await rowsFor([m.recordId, raw.recordId]);
		const box = await mailbox();
		for (const r of rows) {
			const got = box.get(outbox.messageIdFor(r.id))!;
			expect(got.subject).not.toMatch(/[\r\n]/);
			expect(got.subject).toContain('Bench 2 Bcc: intruder@evil.example Injected body');
			expect(got.headerNames).not.toContain('bcc');
			expect(got.to).toEqual([person.email]);
		}
	});
});

describe('digests and password resets', () => {
	let reader: Recipient & { password: string };
	beforeAll(async () => {
		reader = await makeUser('researcher');
		await db.insert(table.userPreference).values({ userId: reader.id, mailMode: 'digest' });
	});

	it('holds mail for digest readers and sends one digest a day', async () => {
		const a = mail(reader);
		const b = mail(reader, { kind: 'inspection.overdue', step: '2', subject: 'Inspection overdue by 2 weeks: Test bay' });
		expect(await enqueue([a, b])).toEqual({ inserted: 2, held: 2 });
		expect(await outbox.deliver()).toMatchObject({ claimed: 0 });

		expect(await outbox.assembleDigests('2027-03-01')).toEqual({ digests: 1, items: 2 });
		expect(await outbox.assembleDigests('2027-03-01')).toEqual({ digests: 0, items: 0 });
		const held = await rowsFor([a.recordId, b.recordId]);
		const [digest] = await db.select().from(table.mailOutbox).where(eq(table.mailOutbox.id, held[0].digestId!));
		expect(held.every((r) => r.status === 'digested' && r.digestId === digest.id)).toBe(true);
		expect(digest).toMatchObject({ kind: 'digest', recordId: reader.id, dueKey: '2027-03-01', status: 'pending', recipientEmail: reader.email });

		const before = server!.received();
		expect(await outbox.deliver()).toMatchObject({ sent: 1 });
		expect(server!.received() - before).toBe(1);
		const got = (await mailbox()).get(outbox.messageIdFor(digest.id))!;
		expect(got.subject).toBe('Your Beamwarden digest for 1 March 2027: 2 items');
		expect(got.to).toEqual([reader.email]);
		for (const m of [a, b]) {
			expect(got.text).toContain(m.subject);
			expect(got.text).toContain(`${APP_URL}/inspections/${m.recordId}`);
		}
		expect(got.text).toContain('Why you got this: You chose one daily digest');

		// Held after today's digest: it waits for tomorrow's.
		const c = mail(reader);
		await enqueue([c]);
		expect(await outbox.assembleDigests('2027-03-01')).toEqual({ digests: 0, items: 0 });
		expect((await rowsFor([c.recordId]))[0].status).toBe('held');
		expect(await outbox.assembleDigests('2027-03-02')).toEqual({ digests: 1, items: 1 });
		expect(await outbox.deliver()).toMatchObject({ sent: 1 });
	});

	it('sends a password reset at once even to a digest reader, and forgets the link once sent', async () => {
		const token = `tok-${randomUUID()}`;
		await db.transaction((tx) => outbox.enqueuePasswordReset(tx, { user: { id: reader.id, email: reader.email, name: 'Reader' }, token, expiresAt: new Date(Date.now() + minutes(30)) }));
		const [row] = await db.select().from(table.mailOutbox).where(and(eq(table.mailOutbox.kind, 'password.reset'), eq(table.mailOutbox.recipientId, reader.id)));
		expect(row.status).toBe('pending');
		expect(row.recordId).not.toContain(token);
		expect(row.textBody).toContain(`${APP_URL}/reset-password/${token}`);

		expect(await outbox.deliver()).toMatchObject({ sent: 1 });
		const got = (await mailbox()).get(outbox.messageIdFor(row.id))!;
		expect(got.text).toContain(`${APP_URL}/reset-password/${token}`);
		expect(got.text).not.toContain('/preferences');
		const [after] = await db.select().from(table.mailOutbox).where(eq(table.mailOutbox.id, row.id));
		expect(after.status).toBe('sent');
		expect(JSON.stringify(after)).not.toContain(token);
	});
});

describe('the job queue', () => {
	it('has the mail queues and a mail-deliver nudge sends what the ledger has due', { timeout: 60_000 }, async () => {
		expect(queueDefinitions.map((q) => q.name)).toEqual(expect.arrayContaining([queues.reassessPaths, queues.mailDaily, queues.mailDeliver]));
		const person = await makeUser('officer');
		const m = mail(person);
		await enqueue([m]);
		const boss = await startJobsForTest();
		try {
			for (const q of [queues.mailDaily, queues.mailDeliver]) expect(await boss.getQueue(q)).toMatchObject({ name: q, policy: 'stately' });
			await nudge(queues.mailDeliver);
			const deadline = Date.now() + 30_000;
			let status = 'pending';
			while (Date.now() < deadline && status !== 'sent') {
				await new Promise((r) => setTimeout(r, 250));
				status = (await rowsFor([m.recordId]))[0].status;
			}
			expect(status).toBe('sent');
		} finally {
			await stopJobs();
		}
		// Stopped means stopped: the daily run the start-up caught up on is not still sending.
		expect(handlersAtWork()).toBe(0);
		const [row] = await rowsFor([m.recordId]);
		expect((await mailbox()).has(outbox.messageIdFor(row.id))).toBe(true);
	});
});
