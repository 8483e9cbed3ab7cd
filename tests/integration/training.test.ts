// Training records: who may see what, nothing half-saved, and the expiry reminders (recipients,
// steps, renewal, idempotent ledger).
import { and, eq, inArray } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as outbox from '$lib/server/mail/outbox';
import { shiftDay } from '$lib/server/mail/schedule';
import { trainingMails } from '$lib/server/reminders';
import * as training from '$lib/server/training';
import { makeLab, makeUser } from './factories';

const APP_URL = 'http://beamwarden.test';
/** Far from the real date and from the other reminder tests' dates. */
const T = '2032-03-10';

type Person = Awaited<ReturnType<typeof makeUser>>;
let officer: Person;
let researcher: Person;
let colleague: Person;
let disabled: Person;

beforeAll(async () => {
	const lab = await makeLab();
	officer = await makeUser('officer');
	researcher = await makeUser('researcher', [lab.id]);
	colleague = await makeUser('researcher', [lab.id]);
	disabled = await makeUser('researcher', [lab.id]);
	await db.update(table.user).set({ disabled: true }).where(eq(table.user.id, disabled.id));
});

const form = (userId: string, topic: string, completedOn: string, expiresOn: string) => ({ userId, topic, completedOn, expiresOn, notes: '' });

describe('training records', () => {
	it('an officer records a training, with its audit row; a researcher sees only their own', async () => {
		const r = await training.record(officer.id, form(researcher.id, 'Laser safety induction', '2026-01-10', '2027-01-10'), '2026-06-01');
		if (!r.ok) throw new Error(JSON.stringify(r));
		await training.record(officer.id, form(colleague.id, 'Laser safety induction', '2026-01-11', ''), '2026-06-01');
		const [entry] = await db.select().from(table.auditLog).where(and(eq(table.auditLog.entity, 'training_record'), eq(table.auditLog.entityId, r.id)));
		expect(entry).toMatchObject({ action: 'training.record', actorId: officer.id });
		const own = await training.list('2026-06-01', researcher.id);
		expect(own.map((x) => x.userId)).toEqual([researcher.id]);
		expect(own[0]).toMatchObject({ topic: 'Laser safety induction', expiresOn: '2027-01-10', state: 'current' });
		const all = await training.list('2026-06-01');
		expect(all.map((x) => x.userId)).toEqual(expect.arrayContaining([researcher.id, colleague.id]));
		expect(all.find((x) => x.userId === colleague.id)!.state).toBe('no_expiry');
	});

	it('refuses a completion in the future and a disabled person, writing nothing', async () => {
		const before = await db.$count(table.trainingRecord);
		expect(await training.record(officer.id, form(researcher.id, 'Induction', '2026-06-02', ''), '2026-06-01')).toMatchObject({ ok: false, status: 400, fields: { completedOn: expect.any(Array) } });
		expect(await training.record(officer.id, form(disabled.id, 'Induction', '2026-05-01', ''), '2026-06-01')).toMatchObject({ ok: false, status: 400, fields: { userId: expect.any(Array) } });
		expect(await db.$count(table.trainingRecord)).toBe(before);
	});

	it('a later record of the same topic renews the earlier one (case aside)', async () => {
		const person = await makeUser('researcher');
		await training.record(officer.id, form(person.id, 'Fibre laser briefing', '2025-01-01', '2026-01-01'), '2026-06-01');
		await training.record(officer.id, form(person.id, 'fibre laser briefing', '2026-02-01', '2027-02-01'), '2026-06-01');
		const states = (await training.list('2026-06-01', person.id)).map((x) => [x.completedOn, x.state]);
		expect(states).toEqual([
			['2026-02-01', 'current'],
			['2025-01-01', 'renewed']
		]);
	});

	it('withdraws a record once; it stays, marked, with the reason', async () => {
		const r = await training.record(officer.id, form(researcher.id, 'Entered for the wrong person', '2026-02-01', ''), '2026-06-01');
		if (!r.ok) throw new Error('record');
		expect(await training.withdraw(officer.id, { recordId: r.id, reason: 'Wrong person' })).toEqual({ ok: true });
		expect(await training.withdraw(officer.id, { recordId: r.id, reason: 'Again' })).toMatchObject({ ok: false, status: 409 });
		expect(await training.withdraw(officer.id, { recordId: '00000000-0000-4000-8000-000000000000', reason: 'None' })).toMatchObject({ ok: false, status: 404 });
		const row = (await training.list('2026-06-01')).find((x) => x.id === r.id)!;
		expect(row).toMatchObject({ state: 'withdrawn', withdrawnReason: 'Wrong person' });
	});
});

describe('training expiry reminders', () => {
	let ids: Record<string, string>;
	beforeAll(async () => {
		const add = async (userId: string, topic: string, completedOn: string, expiresOn: string) => {
			const r = await training.record(officer.id, form(userId, topic, completedOn, expiresOn), T);
			if (!r.ok) throw new Error(JSON.stringify(r));
			return r.id;
		};
		ids = {
			in30: await add(researcher.id, 'Class 4 authorisation A', '2031-03-10', shiftDay(T, 30)),
			in31: await add(researcher.id, 'Class 4 authorisation B', '2031-03-10', shiftDay(T, 31)),
			today: await add(colleague.id, 'Class 4 authorisation C', '2031-03-10', T),
			expired3: await add(colleague.id, 'Class 4 authorisation D', '2031-03-10', shiftDay(T, -3)),
			expired8: await add(colleague.id, 'Class 4 authorisation E', '2031-03-10', shiftDay(T, -8)),
			renewed: await add(researcher.id, 'Fibre laser briefing', '2031-03-01', shiftDay(T, 5)),
			renewal: await add(researcher.id, 'fibre laser briefing', '2032-03-01', '2034-03-01'),
			disabled: await add(colleague.id, 'Class 4 authorisation F', '2031-03-10', shiftDay(T, 2))
		};
		const withdrawn = await add(researcher.id, 'Class 4 authorisation G', '2031-03-10', shiftDay(T, 1));
		await training.withdraw(officer.id, { recordId: withdrawn, reason: 'test' });
		ids.withdrawn = withdrawn;
	});

	it('expiring within 30 days (to the person) and expired in the last week (to the person and every officer)', async () => {
		const mails = (await trainingMails(T, APP_URL)).filter((m) => Object.values(ids).includes(m.recordId));
		const to = (id: string) => mails.filter((m) => m.recordId === id).map((m) => m.recipientEmail);
		expect(to(ids.in30)).toEqual([researcher.email]);
		expect(to(ids.in31)).toEqual([]);
		expect(to(ids.today)).toEqual([colleague.email]); // valid through its expiry day
		expect(to(ids.expired3)).toEqual(expect.arrayContaining([colleague.email, officer.email]));
		expect(to(ids.expired8)).toEqual([]); // past the catch-up week
		expect(to(ids.renewed)).toEqual([]); // a later record of the same topic renews it
		expect(to(ids.withdrawn)).toEqual([]);
		const expired = mails.find((m) => m.recordId === ids.expired3 && m.recipientEmail === officer.email)!;
		expect(expired).toMatchObject({ kind: 'training.expired', step: 'after' });
		expect(expired.reason).toMatch(/laser safety officer/);
		expect(expired.subject).toMatch(/^Training expired on 7 March 2032: Class 4 authorisation D/);
		expect(mails.find((m) => m.recordId === ids.in30)!.subject).toMatch(/^Training expires in 30 days: Class 4 authorisation A/);
	});

	it('a disabled person is not reminded', async () => {
		await db.update(table.user).set({ disabled: true }).where(eq(table.user.id, colleague.id));
		try {
			const mails = await trainingMails(T, APP_URL);
			expect(mails.filter((m) => m.recordId === ids.disabled)).toEqual([]);
		} finally {
			await db.update(table.user).set({ disabled: false }).where(eq(table.user.id, colleague.id));
		}
	});

	it('each reminder enters the ledger once, however often it is computed; a new day adds only the steps that came due', async () => {
		const mine = async (day: string) => (await trainingMails(day, APP_URL)).filter((m) => Object.values(ids).includes(m.recordId));
		const a = await mine(T);
		expect((await db.transaction((tx) => outbox.enqueue(tx, a))).inserted).toBe(a.length);
		expect((await db.transaction(async (tx) => outbox.enqueue(tx, await mine(T)))).inserted).toBe(0);
		// The next day: the record valid through T has moved on to "expired", and the one 31 days out
		// has come into the 30-day window; nothing else is new.
		const next = await mine(shiftDay(T, 1));
		const added = await db.transaction((tx) => outbox.enqueue(tx, next));
		const newRows = next.filter((m) => !a.some((x) => x.recordId === m.recordId && x.step === m.step && x.recipientEmail === m.recipientEmail));
		expect(added.inserted).toBe(newRows.length);
		expect(new Set(newRows.map((m) => `${m.recordId} ${m.kind}`))).toEqual(new Set([`${ids.today} training.expired`, `${ids.in31} training.expiring`]));
		const rows = await db.select().from(table.mailOutbox).where(inArray(table.mailOutbox.recordId, Object.values(ids)));
		expect(rows).toHaveLength(a.length + newRows.length);
	});

	it('a digest reader gets the reminder in the day’s digest, linked to the training records', async () => {
		const saved = process.env.APP_URL;
		process.env.APP_URL = APP_URL;
		try {
			const reader = await makeUser('researcher');
			await db.insert(table.userPreference).values({ userId: reader.id, mailMode: 'digest' });
			const r = await training.record(officer.id, form(reader.id, 'Digest reader induction', '2031-03-10', shiftDay(T, 10)), T);
			if (!r.ok) throw new Error('record');
			const mails = (await trainingMails(T, APP_URL)).filter((m) => m.recordId === r.id);
			expect((await db.transaction((tx) => outbox.enqueue(tx, mails))).held).toBe(1);
			await outbox.assembleDigests(T);
			const [digest] = await db.select().from(table.mailOutbox).where(and(eq(table.mailOutbox.kind, 'digest'), eq(table.mailOutbox.recipientId, reader.id)));
			expect(digest.textBody).toContain(`${APP_URL}/training`);
			expect(digest.textBody).toContain('Digest reader induction');
		} finally {
			if (saved === undefined) delete process.env.APP_URL;
			else process.env.APP_URL = saved;
		}
	});
});
