// The daily reminder computation end to end: register rows → runDaily → ledger → real SMTP → mailbox.
import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq, inArray, isNull } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as outbox from '$lib/server/mail/outbox';
import { readMailboxDir, type StoredMail } from '$lib/server/mail/mailbox';
import { shiftDay } from '$lib/server/mail/schedule';
import { runDaily } from '$lib/server/reminders';
import { startFakeMailServer, type FakeMailServer } from '../../scripts/fake-mail';
import { makeLab, makeUser } from './factories';
import { freePort } from '../free-port';

let SMTP_PORT = 0;
const APP_URL = 'http://beamwarden.test';
/** Far from the real date, so rows other test files wrote at "now" are not in its windows. */
const T = '2031-05-15';

let dir: string;
let server: FakeMailServer;
const savedEnv = { ...process.env };

type Person = { id: string; email: string };
let lab: { id: string; name: string };
let inspector: Person;
let responsible: Person;
let digestReader: Person;
let disabledPerson: Person;

beforeAll(async () => {
	dir = await mkdtemp(join(tmpdir(), 'beamwarden-reminders-'));
	SMTP_PORT = await freePort();
	Object.assign(process.env, { APP_URL, SMTP_HOST: '127.0.0.1', SMTP_PORT: String(SMTP_PORT) });
	server = await startFakeMailServer({ port: SMTP_PORT, dir });
	// Rows other test files left due are sent now, so the counts below are this file's own.
	await outbox.deliverAll();

	lab = await makeLab();
	inspector = await makeUser('officer');
	responsible = await makeUser('researcher', [lab.id]);
	digestReader = await makeUser('researcher', [lab.id]);
	disabledPerson = await makeUser('researcher', [lab.id]);
	await makeUser('manager');
	await makeUser('manager');
	await db.update(table.user).set({ disabled: true }).where(eq(table.user.id, disabledPerson.id));
	await db.insert(table.userPreference).values({ userId: digestReader.id, mailMode: 'digest' });
});

/** What this file wrote with far-future dates, removed afterwards so other files' "newest" queries never see it. */
const created = { inspections: [] as string[], areas: [] as string[], notifications: [] as string[], paths: [] as string[], lines: [] as string[], lasers: [] as string[] };

afterAll(async () => {
	// Best effort, one step at a time: what others may since have linked to is retired, not removed.
	const step = async (f: () => Promise<unknown>) => f().catch((e: Error) => console.warn('reminders cleanup:', e.message));
	if (created.notifications.length) await step(() => db.delete(table.notification).where(inArray(table.notification.id, created.notifications)));
	if (created.paths.length)
		await step(() => db.update(table.beamPath).set({ retired: true, flagged: false, reviewState: 'not_needed', awaitingSince: null }).where(inArray(table.beamPath.id, created.paths)));
	if (created.lasers.length) await step(() => db.update(table.laser).set({ status: 'retired' }).where(inArray(table.laser.id, created.lasers)));
	if (created.inspections.length) {
		await step(async () => {
			await db.transaction(async (tx) => {
				await tx.delete(table.inspection).where(inArray(table.inspection.id, created.inspections));
				await tx.delete(table.area).where(inArray(table.area.id, created.areas));
			});
		});
		await step(() => db.update(table.inspection).set({ completedOn: '2020-01-01' }).where(and(inArray(table.inspection.id, created.inspections), isNull(table.inspection.completedOn))));
	}
	await server.close();
	await rm(dir, { recursive: true, force: true });
	for (const k of ['APP_URL', 'SMTP_HOST', 'SMTP_PORT']) {
		if (savedEnv[k] === undefined) delete process.env[k];
		else process.env[k] = savedEnv[k];
	}
});

// ---------------------------------------------------------------------------------------------
// Local factories: straight rows through drizzle (the inspection data module is not ours).

async function makeInspection(o: { dueOn: string; inspectorId?: string | null; areaInspectorId?: string | null; responsibleId?: string | null; completedOn?: string; name?: string }) {
	const [area] = await db
		.insert(table.area)
		.values({ labId: lab.id, name: o.name ?? `Bay ${randomUUID().slice(0, 4)}`, room: 'B12', building: 'Optics hall', responsibleId: o.responsibleId ?? null, inspectorId: o.areaInspectorId ?? null })
		.returning();
	const [insp] = await db
		.insert(table.inspection)
		.values({ areaId: area.id, inspectorId: o.inspectorId === undefined ? inspector.id : o.inspectorId, dueOn: o.dueOn, completedOn: o.completedOn ?? null })
		.returning();
	created.areas.push(area.id);
	created.inspections.push(insp.id);
	return insp.id;
}

async function makeAwaitingPath(o: { name: string; awaitingSince: Date | null; reviewState?: 'awaiting_review' | 'cleared' }) {
	const [laser] = await db.insert(table.laser).values({ labId: lab.id, maker: 'Test Optics', model: 'CW 532', laserClass: '4' }).returning();
	const [line] = await db
		.insert(table.emissionLine)
		.values({ laserId: laser.id, mode: 'continuous', wavelength: '5.32e-7', power: '5', beamDiameter: '0.002', beamDiameterDefinition: '1/e2', divergence: '0.001', divergenceDefinition: '1/e2' })
		.returning();
	const [path] = await db
		.insert(table.beamPath)
		.values({ laserId: laser.id, name: o.name, flagged: true, verdict: 'exceeds_limit', reviewState: o.reviewState ?? 'awaiting_review', awaitingSince: o.awaitingSince })
		.returning();
	await db.insert(table.pathLine).values({ pathId: path.id, lineId: line.id, sequence: 0 });
	created.lasers.push(laser.id);
	created.lines.push(line.id);
	created.paths.push(path.id);
	return path.id;
}

async function makeNotification(o: { userId: string; kind: string; pathId: string | null; title: string; createdAt: Date }) {
	const [n] = await db.insert(table.notification).values({ ...o, body: 'See the comments on the path.' }).returning();
	created.notifications.push(n.id);
	return n.id;
}

const at = (day: string, time = '09:00:00') => new Date(`${day}T${time}Z`);

async function activeEmails(role: 'officer' | 'manager') {
	const rows = await db.select({ email: table.user.email }).from(table.user).where(and(eq(table.user.role, role), eq(table.user.disabled, false)));
	return rows.map((r) => r.email);
}

async function ledgerFor(recordIds: string[]) {
	return db.select().from(table.mailOutbox).where(inArray(table.mailOutbox.recordId, recordIds));
}

/** 'kind step email' for each ledger row of these records, sorted. */
async function keysFor(recordIds: string[]) {
	return (await ledgerFor(recordIds)).map((r) => `${r.recordId} ${r.kind} ${r.step} ${r.recipientEmail}`).sort();
}

const key = (recordId: string, kind: string, step: string, emails: string[]) => emails.map((e) => `${recordId} ${kind} ${step} ${e}`);

async function mailboxById(): Promise<Map<string, StoredMail>> {
	return new Map((await readMailboxDir(dir)).map((m) => [m.messageId, m]));
}

// ---------------------------------------------------------------------------------------------

describe('runDaily', () => {
	const ids: Record<string, string> = {};
	let paths: Record<string, string> = {};
	let notes: Record<string, string> = {};
	let officers: string[];
	let managers: string[];

	beforeAll(async () => {
		ids.in20 = await makeInspection({ dueOn: shiftDay(T, 20), responsibleId: responsible.id });
		ids.in5 = await makeInspection({ dueOn: shiftDay(T, 5), responsibleId: disabledPerson.id });
		ids.today = await makeInspection({ dueOn: T });
		ids.twoDaysAgo = await makeInspection({ dueOn: shiftDay(T, -2), inspectorId: null, areaInspectorId: inspector.id });
		ids.over9 = await makeInspection({ dueOn: shiftDay(T, -9), responsibleId: responsible.id });
		ids.over16 = await makeInspection({ dueOn: shiftDay(T, -16) });
		ids.over40 = await makeInspection({ dueOn: shiftDay(T, -40) });
		ids.done = await makeInspection({ dueOn: shiftDay(T, -16), completedOn: shiftDay(T, -20) });
		ids.in45 = await makeInspection({ dueOn: shiftDay(T, 45) });
		ids.noInspector = await makeInspection({ dueOn: shiftDay(T, 3), inspectorId: null });
		ids.digest = await makeInspection({ dueOn: shiftDay(T, 25), inspectorId: digestReader.id });

		paths = {
			waiting10: await makeAwaitingPath({ name: 'Amplifier pick-off', awaitingSince: at(shiftDay(T, -10), '16:30:00') }),
			waiting3: await makeAwaitingPath({ name: 'Fresh path', awaitingSince: at(shiftDay(T, -3)) }),
			cleared: await makeAwaitingPath({ name: 'Cleared path', awaitingSince: at(shiftDay(T, -30)), reviewState: 'cleared' }),
			evil: await makeAwaitingPath({ name: 'Bench 2\r\nBcc: intruder@evil.example', awaitingSince: at(shiftDay(T, -20)) })
		};
		notes = {
			returned: await makeNotification({ userId: responsible.id, kind: 'review.returned', pathId: paths.waiting10, title: 'Returned: “Amplifier pick-off”', createdAt: at(T, '05:00:00') }),
			flagged: await makeNotification({ userId: inspector.id, kind: 'path.flagged', pathId: paths.waiting3, title: 'New path awaiting review: “Fresh path”', createdAt: at(shiftDay(T, -3)) }),
			old: await makeNotification({ userId: inspector.id, kind: 'path.flagged', pathId: paths.waiting3, title: 'Old news', createdAt: at(shiftDay(T, -30)) }),
			toDigest: await makeNotification({ userId: digestReader.id, kind: 'review.cleared', pathId: paths.cleared, title: 'Cleared: “Cleared path”', createdAt: at(T, '04:00:00') }),
			toDisabled: await makeNotification({ userId: disabledPerson.id, kind: 'review.cleared', pathId: paths.cleared, title: 'Cleared', createdAt: at(T, '04:00:00') })
		};
		officers = await activeEmails('officer');
		managers = await activeEmails('manager');
	});

	it('puts exactly the due reminders for the day in the ledger, for the right people', async () => {
		const counts = await runDaily(T);
		expect(counts.today).toBe(T);
		expect(counts.digests).toBeGreaterThanOrEqual(1);

		const I = inspector.email;
		const R = responsible.email;
		expect(await keysFor(Object.values(ids))).toEqual(
			[
				...key(ids.in20, 'inspection.due', '30', [I, R]),
				...key(ids.in5, 'inspection.due', '7', [I]), // the disabled responsible person gets nothing
				...key(ids.today, 'inspection.due', '0', [I]),
				...key(ids.twoDaysAgo, 'inspection.due', '0', [I]), // the day was missed: caught up, the area's inspector
				...key(ids.over9, 'inspection.overdue', '1', [I, R]), // week 1: no escalation yet
				...key(ids.over16, 'inspection.overdue', '2', [I, ...managers]), // week 2: the managers too
				...key(ids.over40, 'inspection.overdue', '5', [I, ...managers]), // only the current week, not weeks 1–4
				...key(ids.noInspector, 'inspection.due', '7', officers), // nobody assigned: every officer
				...key(ids.digest, 'inspection.due', '30', [digestReader.email])
			].sort()
		);
		expect(await keysFor(Object.values(paths))).toEqual(
			[...key(paths.waiting10, 'review.waiting', '1', officers), ...key(paths.evil, 'review.waiting', '2', officers)].sort()
		);
		expect(await keysFor(Object.values(notes))).toEqual(
			[
				...key(notes.returned, 'notification', 'once', [R]),
				...key(notes.flagged, 'notification', 'once', [I]),
				...key(notes.toDigest, 'notification', 'once', [digestReader.email])
			].sort()
		);

		// The digest reader's two items are folded into one digest.
		const mine = await db.select().from(table.mailOutbox).where(eq(table.mailOutbox.recipientId, digestReader.id));
		const digest = mine.filter((r) => r.kind === 'digest');
		expect(digest).toHaveLength(1);
		expect(digest[0]).toMatchObject({ dueKey: T, status: 'pending' });
		expect(mine.filter((r) => r.kind !== 'digest').every((r) => r.status === 'digested' && r.digestId === digest[0].id)).toBe(true);
	});

	it('sends them: each person gets their mails once, saying why, with a link back', async () => {
		const before = server.received();
		const r = await outbox.deliverAll();
		expect(r.retrying + r.failed).toBe(0);
		expect(server.received() - before).toBe(r.sent);

		const box = await mailboxById();
		const rows = await ledgerFor([...Object.values(ids), ...Object.values(paths), ...Object.values(notes)]);
		for (const row of rows.filter((x) => x.status !== 'digested')) {
			expect(row.status).toBe('sent');
			const got = box.get(outbox.messageIdFor(row.id))!;
			expect(got.to).toEqual([row.recipientEmail]);
			expect(got.subject).toBe(row.subject);
			expect(got.subject).not.toMatch(/[\r\n]/);
			expect(got.headerNames).not.toContain('bcc');
			expect(got.text).toContain(`Why you got this: ${row.reason}`);
			expect(got.text).toContain(`${APP_URL}/preferences`);
			const link =
				row.kind === 'review.waiting' ? `/reviews/${row.recordId}` : row.kind === 'notification' ? '' : `/inspections/${row.recordId}`;
			expect(got.text).toContain(`${APP_URL}${link}`);
			expect(got.html).toContain(`href="${APP_URL}${link}`);
		}
		const returned = rows.find((x) => x.recordId === notes.returned)!;
		expect(box.get(outbox.messageIdFor(returned.id))!.text).toContain(`${APP_URL}/paths/${paths.waiting10}`);
		const flagged = rows.find((x) => x.recordId === notes.flagged)!;
		expect(box.get(outbox.messageIdFor(flagged.id))!.text).toContain(`${APP_URL}/reviews/${paths.waiting3}`);

		// The manager escalation says why.
		const escalated = rows.find((x) => x.recordId === ids.over16 && x.recipientEmail === managers[0])!;
		expect(escalated.reason).toMatch(/facility manager/);
		expect(box.get(outbox.messageIdFor(escalated.id))!.subject).toMatch(/^Inspection overdue by 2 weeks: /);

		// The header-injection attempt arrives as one clean subject line.
		const evil = rows.find((x) => x.recordId === paths.evil)!;
		expect(box.get(outbox.messageIdFor(evil.id))!.subject).toBe('Awaiting review for 20 days: Bench 2 Bcc: intruder@evil.example');

		// The digest reader gets one mail: the digest, listing both items with their links.
		const toReader = [...box.values()].filter((m) => m.to.includes(digestReader.email));
		expect(toReader).toHaveLength(1);
		expect(toReader[0].subject).toMatch(/^Your Beamwarden digest for 15 May 2031: 2 items$/);
		expect(toReader[0].text).toContain(`${APP_URL}/inspections/${ids.digest}`);
		expect(toReader[0].text).toContain(`${APP_URL}/paths/${paths.cleared}`);
	});

	it('sends nothing new when run again for the same day', async () => {
		const before = server.received();
		const counts = await runDaily(T);
		expect(counts).toMatchObject({ inspectionDue: 0, inspectionOverdue: 0, reviewWaiting: 0, notifications: 0, digests: 0 });
		expect(await outbox.deliverAll()).toMatchObject({ claimed: 0 });
		expect(server.received()).toBe(before);
	});

	it('on later days adds only the steps that came due', async () => {
		const before = await keysFor(Object.values(ids));
		await runDaily(shiftDay(T, 1)); // nothing moved to a new step
		expect(await keysFor(Object.values(ids))).toEqual(before);

		await runDaily(shiftDay(T, 7));
		const added = (await keysFor(Object.values(ids))).filter((k) => !before.includes(k));
		expect(added).toEqual(
			[
				// ids.in20 has 13 days left: still in its 30-day window, nothing new
				...key(ids.in5, 'inspection.due', '0', [inspector.email]), // due two days ago: the day's reminder, caught up
				...key(ids.today, 'inspection.overdue', '1', [inspector.email]),
				...key(ids.over9, 'inspection.overdue', '2', [inspector.email, responsible.email, ...managers]),
				...key(ids.over16, 'inspection.overdue', '3', [inspector.email, ...managers]),
				...key(ids.over40, 'inspection.overdue', '6', [inspector.email, ...managers]),
				...key(ids.noInspector, 'inspection.due', '0', officers),
				...key(ids.twoDaysAgo, 'inspection.overdue', '1', [inspector.email])
			].sort()
		);
		await outbox.deliverAll();
	});
});

describe('two processes at once', () => {
	function runCli(today: string) {
		return new Promise<{ code: number | null; out: string; err: string }>((done) => {
			const child = spawn('npx', ['tsx', 'scripts/run-reminders.ts', `--today=${today}`, '--deliver'], {
				cwd: process.cwd(),
				env: { ...process.env, SMTP_PORT: String(SMTP_PORT), APP_URL },
				stdio: ['ignore', 'pipe', 'pipe']
			});
			let out = '';
			let err = '';
			child.stdout.on('data', (d) => (out += d));
			child.stderr.on('data', (d) => (err += d));
			child.on('close', (code) => done({ code, out, err }));
		});
	}

	it('send each mail once', { timeout: 120_000 }, async () => {
		const day = '2032-01-10';
		const a = await makeInspection({ dueOn: shiftDay(day, 4), responsibleId: responsible.id });
		const b = await makeInspection({ dueOn: shiftDay(day, -15) });
		// Enough mail that both processes are at work at the same time.
		const many = await Promise.all(Array.from({ length: 100 }, () => makeInspection({ dueOn: shiftDay(day, 20), responsibleId: responsible.id })));
		// The rows sent meanwhile are those not sent before: other tests send with a simulated clock,
		// so a row's sending time does not say whether it was sent during this test.
		const sentBefore = new Set((await db.select({ id: table.mailOutbox.id }).from(table.mailOutbox).where(eq(table.mailOutbox.status, 'sent'))).map((r) => r.id));
		const receivedBefore = server.received();
		const storedBefore = server.stored();

		const [one, two] = await Promise.all([runCli(day), runCli(day)]);
		const managers = await activeEmails('manager');
		expect(one.code, one.err).toBe(0);
		expect(two.code, two.err).toBe(0);
		expect(one.out).toMatch(/reminders for 2032-01-10/);
		const sentBy = (out: string) => Number(/(\d+) sent/.exec(out)?.[1] ?? NaN);

		expect(await keysFor([a, b])).toEqual(
			[...key(a, 'inspection.due', '7', [inspector.email, responsible.email]), ...key(b, 'inspection.overdue', '2', [inspector.email, ...managers])].sort()
		);
		expect((await keysFor(many)).length).toBe(200);
		const sentNow = (await db.select().from(table.mailOutbox).where(eq(table.mailOutbox.status, 'sent'))).filter((r) => !sentBefore.has(r.id));
		expect(sentNow.length).toBeGreaterThanOrEqual(200 + 2 + 1 + managers.length);
		expect(sentBy(one.out) + sentBy(two.out)).toBe(sentNow.length);
		// Every row sent once over SMTP, and one file per row in the mailbox.
		expect(server.received() - receivedBefore).toBe(sentNow.length);
		expect(server.stored() - storedBefore).toBe(sentNow.length);
		const box = await mailboxById();
		for (const row of sentNow) expect(box.get(outbox.messageIdFor(row.id))?.to).toEqual([row.recipientEmail]);
		const left = await db.select().from(table.mailOutbox).where(inArray(table.mailOutbox.status, ['pending', 'sending']));
		expect(left.filter((r) => r.nextAttemptAt <= new Date())).toEqual([]);
	});

	it('exits with 2 on a bad argument', { timeout: 60_000 }, async () => {
		const r = await runCli('2032-02-30');
		expect(r.code).toBe(2);
		expect(r.err).toMatch(/calendar date/);
	});
});

describe('an SMTP outage', () => {
	it('leaves the day’s mail pending and sends it once the server is back', async () => {
		const day = '2033-03-01';
		const id = await makeInspection({ dueOn: day, responsibleId: responsible.id });
		await server.close();
		await runDaily(day);
		const t0 = new Date();
		const down = await outbox.deliverAll({ now: t0 });
		expect(down.sent).toBe(0);
		let rows = await ledgerFor([id]);
		expect(rows).toHaveLength(2);
		for (const r of rows) {
			expect(r).toMatchObject({ status: 'pending', attempts: 1 });
			expect(r.nextAttemptAt.getTime()).toBe(t0.getTime() + 60_000);
		}

		server = await startFakeMailServer({ port: SMTP_PORT, dir });
		await runDaily(day); // computing again while the mail waits adds nothing
		expect(await ledgerFor([id])).toHaveLength(2);
		const back = new Date(t0.getTime() + 61_000);
		const up = await outbox.deliverAll({ now: back });
		expect(up.retrying + up.failed).toBe(0);
		rows = await ledgerFor([id]);
		const box = await mailboxById();
		for (const r of rows) {
			expect(r.status).toBe('sent');
			expect([...box.values()].filter((m) => m.messageId === outbox.messageIdFor(r.id))).toHaveLength(1);
		}
		// The restarted server saw every row sent since, once (the day's mail for older records too).
		const sentSince = await db.select().from(table.mailOutbox).where(eq(table.mailOutbox.sentAt, back));
		expect(sentSince.length).toBe(up.sent);
		expect(server.received()).toBe(up.sent);
		expect(await outbox.deliverAll({ now: new Date(t0.getTime() + 3_600_000) })).toMatchObject({ claimed: 0 });
	});
});
