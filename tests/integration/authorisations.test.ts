// Authorisations to operate against the real database: the derived state for every combination of
// conditions, requests and decisions, what each person must do, the door list, and the daily
// reminders going out once per cause (lapses recorded and audited once).
import { addDays, format, subMonths } from 'date-fns';
import { and, desc, eq, inArray } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as authorisations from '$lib/server/authorisations';
import { runDaily } from '$lib/server/reminders';
import * as procedures from '$lib/server/procedures';
import * as training from '$lib/server/training';
import type { Scope } from '$lib/server/auth/scope';
import { todayISO } from '$lib/inspectionState';
import { lasers, laserForm, makeLab, makeUser, scopeFor } from './factories';

const today = todayISO();
const day = (offset: number) => format(addDays(new Date(`${today}T12:00:00Z`), offset), 'yyyy-MM-dd');
const longAgo = new Date(Date.now() - 2 * 365 * 86_400_000);

let lab: { id: string };
let areaId: string;
let laserId: string;
let officer: Scope;
let secondOfficer: Scope;
let drafter: Scope;
/** P: approved once. Q: version 1, then version 2 approved after everyone signed version 1. */
let P: string;
let Q: string;

async function approve(id: string) {
	const [d] = await db.select().from(table.procedureDraft).where(eq(table.procedureDraft.procedureId, id));
	await procedures.submit(drafter, id, d.version, { id: drafter.userId, name: 'D' });
	const r = await procedures.approve(officer, id, { reviewBy: day(365), comment: '', version: d.version + 1 }, today);
	if (!r.ok) throw new Error(JSON.stringify(r));
}

async function currentVersionId(procedureId: string) {
	const [v] = await db.select().from(table.procedureVersion).where(eq(table.procedureVersion.procedureId, procedureId)).orderBy(desc(table.procedureVersion.number)).limit(1);
	return v.id;
}

beforeAll(async () => {
	lab = await makeLab();
	officer = await scopeFor(await makeUser('officer'));
	secondOfficer = await scopeFor(await makeUser('officer'));
	drafter = await scopeFor(await makeUser('researcher', [lab.id]));
	const [area] = await db.insert(table.area).values({ labId: lab.id, name: `Area ${lab.id.slice(0, 6)}`, room: 'B1' }).returning();
	areaId = area.id;
	const created = await lasers.create(drafter, laserForm(lab.id));
	if (!created.ok) throw new Error('laser');
	laserId = created.id;
	await db.update(table.laser).set({ areaId }).where(eq(table.laser.id, laserId));
	const p = await procedures.create(drafter, { target: `laser:${laserId}`, kind: 'operating', title: 'Operating the green laser', pathIds: [], body: 'Steps' });
	const q = await procedures.create(drafter, { target: `area:${areaId}`, kind: 'emergency', title: 'Emergency in the area', pathIds: [], body: 'Steps' });
	if (!p.ok || !q.ok) throw new Error('procedures');
	P = p.id;
	Q = q.id;
	await approve(P);
	await approve(Q);
});

type TrainingCase = 'current' | 'expired' | 'missing';
type SignoffCase = 'signed' | 'signoff_lapsed' | 'new_version' | 'never';
type ExpiryCase = 'none' | 'future' | 'past';

/** A person with one grant of the given conditions, granted two years ago. */
async function grantCase(t: TrainingCase, s: SignoffCase, e: ExpiryCase) {
	const person = await makeUser('researcher', [lab.id]);
	const topic = 'Laser safety induction';
	if (t !== 'missing') await training.record(officer.userId, { userId: person.id, topic, completedOn: day(-700), expiresOn: t === 'current' ? day(400) : day(-1), notes: '' }, today);
	const procedureId = s === 'new_version' ? Q : P;
	const signedAt = s === 'signed' ? new Date() : s === 'signoff_lapsed' ? subMonths(new Date(), 13) : s === 'new_version' ? new Date() : null;
	if (signedAt) await db.insert(table.procedureSignoff).values({ versionId: await currentVersionId(procedureId), procedureId, userId: person.id, signedAt });
	const g = await authorisations.grant(officer, { userId: person.id, target: `laser:${laserId}`, trainingTopics: [topic], procedureIds: [procedureId], expiresOn: e === 'future' ? day(200) : '', reason: '' }, today);
	if (!g.ok) throw new Error(JSON.stringify(g));
	// Granted two years ago; an end date in the past cannot be entered, so it is set here.
	await db.update(table.authorisation).set({ decidedAt: longAgo, ...(e === 'past' ? { expiresOn: day(-1) } : {}) }).where(eq(table.authorisation.id, g.id));
	return { id: g.id, person };
}

describe('the derived state, for every combination of conditions', () => {
	const cases: { t: TrainingCase; s: SignoffCase; e: ExpiryCase; id?: string }[] = [];
	for (const t of ['current', 'expired', 'missing'] as const) for (const s of ['signed', 'signoff_lapsed', 'new_version', 'never'] as const) for (const e of ['none', 'future', 'past'] as const) cases.push({ t, s, e });

	beforeAll(async () => {
		// Everyone signs Q's version 1 first where the case needs it; then Q's version 2 is approved.
		for (const c of cases) c.id = (await grantCase(c.t, c.s, c.e)).id;
		await procedures.saveDraft(drafter, Q, { body: 'Steps, revised', changeNote: 'revised', version: 0 });
		await approve(Q);
	}, 120_000);

	it('active only when every condition holds; lapsed when one held and stopped; pending when one was never met', async () => {
		const rows = new Map((await authorisations.list(null, today, { ids: cases.map((c) => c.id!) })).map((r) => [r.id, r]));
		for (const c of cases) {
			const lapses = [c.t === 'expired', c.s === 'signoff_lapsed' || c.s === 'new_version', c.e === 'past'].filter(Boolean).length;
			const unmet = [c.t === 'missing', c.s === 'never'].filter(Boolean).length;
			const expected = lapses ? 'lapsed' : unmet ? 'pending' : 'active';
			const row = rows.get(c.id!)!;
			expect(row.outcome.state, JSON.stringify(c)).toBe(expected);
			expect(row.outcome.reasons, JSON.stringify(c)).toHaveLength(lapses + unmet);
			expect(row.outcome.lapses, JSON.stringify(c)).toHaveLength(lapses);
		}
	});

	it('says which condition fails, in words', async () => {
		const find = (t: TrainingCase, s: SignoffCase, e: ExpiryCase) => cases.find((c) => c.t === t && c.s === s && c.e === e)!.id!;
		const [expired] = await authorisations.list(null, today, { ids: [find('expired', 'signed', 'none')] });
		expect(expired.outcome.reasons).toEqual([`The training “Laser safety induction” expired on ${day(-1)}.`]);
		const [newVersion] = await authorisations.list(null, today, { ids: [find('current', 'new_version', 'none')] });
		expect(newVersion.outcome.reasons[0]).toMatch(/^Version 2 of “Emergency in the area”, approved on .* is not signed yet \(version 1 was\)\.$/);
		const [ended] = await authorisations.list(null, today, { ids: [find('current', 'signed', 'past')] });
		expect(ended.outcome.reasons).toEqual([`The authorisation ended on ${day(-1)}.`]);
		const [pending] = await authorisations.list(null, today, { ids: [find('missing', 'never', 'future')] });
		expect(pending.outcome.reasons).toEqual(['No record of the training “Laser safety induction”.', 'Version 1 of “Operating the green laser” is not signed yet.']);
	});

	it('the door list and the area show only who is in force, by laser or by area', async () => {
		const inForce = await authorisations.inForceForArea(areaId, today);
		const active = cases.filter((c) => c.t === 'current' && c.s === 'signed' && c.e !== 'past').map((c) => c.id);
		expect(inForce.map((r) => r.id).sort()).toEqual(active.sort());
	});

	it('the daily run records each lapse once, with its audit row, and mails it once per cause', async () => {
		const ids = cases.map((c) => c.id!);
		await runDaily(today);
		const lapses = await db.select().from(table.authorisationLapse).where(inArray(table.authorisationLapse.authorisationId, ids));
		const expectedLapses = cases.reduce((n, c) => n + [c.t === 'expired', c.s === 'signoff_lapsed' || c.s === 'new_version', c.e === 'past'].filter(Boolean).length, 0);
		expect(lapses).toHaveLength(expectedLapses);
		const audits = await db.select().from(table.auditLog).where(and(eq(table.auditLog.action, 'authorisation.lapse'), inArray(table.auditLog.entityId, ids)));
		expect(audits).toHaveLength(expectedLapses);
		const officers = await db.select({ id: table.user.id }).from(table.user).where(and(eq(table.user.role, 'officer'), eq(table.user.disabled, false)));
		const mails = await db.select().from(table.mailOutbox).where(and(eq(table.mailOutbox.kind, 'authorisation.lapsed'), inArray(table.mailOutbox.recordId, ids)));
		expect(mails).toHaveLength(expectedLapses * (1 + officers.length));
		const one = cases.find((c) => c.t === 'expired' && c.s === 'signed' && c.e === 'none')!;
		const toPerson = mails.filter((m) => m.recordId === one.id && m.reason === 'This is your own authorisation.');
		expect(toPerson).toHaveLength(1);
		expect(toPerson[0].subject).toMatch(/^Authorisation lapsed: /);
		expect(toPerson[0].textBody).toContain('expired on');

		// Again, the same day and the next: nothing new anywhere.
		await runDaily(today);
		await runDaily(day(1));
		expect(await db.$count(table.authorisationLapse, inArray(table.authorisationLapse.authorisationId, ids))).toBe(expectedLapses);
		expect(await db.$count(table.auditLog, and(eq(table.auditLog.action, 'authorisation.lapse'), inArray(table.auditLog.entityId, ids)))).toBe(expectedLapses);
		expect(await db.$count(table.mailOutbox, and(eq(table.mailOutbox.kind, 'authorisation.lapsed'), inArray(table.mailOutbox.recordId, ids)))).toBe(mails.length);
	});
});

describe('reminders before anything lapses', () => {
	it('a training ending within 30 days: one “lapsing” mail naming it; an unsigned version: one “sign” mail; digest readers get them in the digest', async () => {
		const person = await makeUser('researcher', [lab.id]);
		await db.insert(table.userPreference).values({ userId: person.id, mailMode: 'digest' });
		await training.record(officer.userId, { userId: person.id, topic: 'Class 4 user course', completedOn: day(-300), expiresOn: day(10), notes: '' }, today);
		const g = await authorisations.grant(officer, { userId: person.id, target: `area:${areaId}`, trainingTopics: ['class 4 USER course'], procedureIds: [P], expiresOn: '', reason: '' }, today);
		if (!g.ok) throw new Error(JSON.stringify(g));
		let [row] = await authorisations.list(null, today, { ids: [g.id] });
		expect(row.outcome.state).toBe('pending'); // granted, not signed yet
		const duties = await authorisations.dutiesOf(await scopeFor(person), today);
		expect(duties.map((d) => d.kind)).toEqual(expect.arrayContaining(['sign']));

		await procedures.sign(await scopeFor(person), P, await currentVersionId(P), today);
		[row] = await authorisations.list(null, today, { ids: [g.id] });
		expect(row.outcome).toMatchObject({ state: 'lapses_soon', validUntil: day(10) });
		const renew = await authorisations.dutiesOf(await scopeFor(person), today);
		expect(renew.map((d) => d.kind)).toContain('renew');

		await runDaily(today);
		await runDaily(today);
		const lapsing = await db.select().from(table.mailOutbox).where(and(eq(table.mailOutbox.kind, 'authorisation.lapsing'), eq(table.mailOutbox.recordId, g.id)));
		expect(lapsing).toHaveLength(1);
		expect(lapsing[0]).toMatchObject({ recipientId: person.id, dueKey: day(10), status: 'digested' });
		expect(lapsing[0].textBody).toMatch(/class 4 user course/i); // the condition names the topic in any case
	});

	it('a person who must sign gets one “sign” mail per version', async () => {
		const person = await makeUser('researcher', [lab.id]);
		const g = await authorisations.grant(officer, { userId: person.id, target: `laser:${laserId}`, trainingTopics: [], procedureIds: [P], expiresOn: '', reason: '' }, today);
		if (!g.ok) throw new Error('grant');
		await runDaily(today);
		await runDaily(day(1));
		const rows = await db.select().from(table.mailOutbox).where(and(eq(table.mailOutbox.kind, 'signoff.needed'), eq(table.mailOutbox.recipientId, person.id)));
		expect(rows).toHaveLength(1);
		expect(rows[0]).toMatchObject({ recordId: P, step: 'needed' });
	});
});

describe('requests and decisions', () => {
	it('a researcher asks; the officers are mailed at once and weekly, not daily; a second request is refused', async () => {
		const person = await scopeFor(await makeUser('researcher', [lab.id]));
		const r = await authorisations.request(person, { target: `area:${areaId}`, note: 'Joining the group' });
		if (!r.ok) throw new Error(JSON.stringify(r));
		expect(await authorisations.request(person, { target: `area:${areaId}`, note: '' })).toMatchObject({ ok: false, status: 400, fields: { target: expect.any(Array) } });
		const waiting = () => db.select().from(table.mailOutbox).where(and(eq(table.mailOutbox.kind, 'authorisation.waiting'), eq(table.mailOutbox.recordId, r.id)));
		const first = await waiting();
		expect(first.map((m) => m.recipientId)).toEqual(expect.arrayContaining([officer.userId, secondOfficer.userId]));
		expect(first.every((m) => m.step === '0')).toBe(true);
		await runDaily(today);
		expect((await waiting()).length).toBe(first.length);
		await runDaily(day(8));
		expect((await waiting()).filter((m) => m.step === '1').length).toBe(first.length);
		const [row] = await authorisations.list(null, today, { ids: [r.id] });
		expect(row.outcome.state).toBe('requested');
	});

	it('the officer grants with conditions or refuses with a reason; each answer is audited and version-checked', async () => {
		const person = await scopeFor(await makeUser('researcher', [lab.id]));
		const asked = await authorisations.request(person, { target: `laser:${laserId}`, note: '' });
		if (!asked.ok) throw new Error('request');
		const grantForm = { decision: 'granted' as const, trainingTopics: ['Laser safety induction'], procedureIds: [P, Q], expiresOn: day(90), reason: '', version: 1 };
		expect(await authorisations.decide(person, asked.id, grantForm, today)).toMatchObject({ ok: false, status: 403 });
		expect(await authorisations.decide(officer, asked.id, { ...grantForm, version: 7 }, today)).toMatchObject({ ok: false, status: 409 });
		expect(await authorisations.decide(officer, asked.id, { ...grantForm, expiresOn: day(-3) }, today)).toMatchObject({ ok: false, status: 400, fields: { expiresOn: expect.any(Array) } });
		const otherLaser = await lasers.create(drafter, laserForm(lab.id));
		if (!otherLaser.ok) throw new Error('laser');
		const foreign = await procedures.create(drafter, { target: `laser:${otherLaser.id}`, kind: 'service', title: 'Another laser’s', pathIds: [], body: 'x' });
		if (!foreign.ok) throw new Error('procedure');
		expect(await authorisations.decide(officer, asked.id, { ...grantForm, procedureIds: [foreign.id] }, today)).toMatchObject({ ok: false, status: 400, fields: { procedureIds: expect.any(Array) } });
		expect(await db.$count(table.authorisationCondition, eq(table.authorisationCondition.authorisationId, asked.id))).toBe(0);

		expect(await authorisations.decide(officer, asked.id, grantForm, today)).toEqual({ ok: true });
		expect(await authorisations.decide(officer, asked.id, { ...grantForm, version: 2 }, today)).toMatchObject({ ok: false, status: 409 });
		const [granted] = await authorisations.list(null, today, { ids: [asked.id] });
		expect(granted.outcome.conditions.map((c) => c.kind)).toEqual(['expiry', 'training', 'procedure', 'procedure']);
		expect(granted.outcome.state).toBe('pending');

		expect(await authorisations.withdraw(person, asked.id, 'no', 2)).toMatchObject({ ok: false, status: 403 });
		expect(await authorisations.withdraw(officer, asked.id, 'Left the group', 2)).toEqual({ ok: true });
		expect(await authorisations.withdraw(officer, asked.id, 'Again', 3)).toMatchObject({ ok: false, status: 409 });
		const [withdrawn] = await authorisations.list(null, today, { ids: [asked.id] });
		expect(withdrawn.outcome.state).toBe('withdrawn');

		const again = await authorisations.request(person, { target: `laser:${laserId}`, note: 'Back in the group' });
		if (!again.ok) throw new Error('request');
		expect(await authorisations.decide(officer, again.id, { ...grantForm, decision: 'refused', reason: 'Finish the induction first', version: 1 }, today)).toEqual({ ok: true });
		const [refused] = await authorisations.list(null, today, { ids: [again.id] });
		expect(refused).toMatchObject({ decisionReason: 'Finish the induction first', outcome: { state: 'refused' } });
		const actions = (await db.select().from(table.auditLog).where(inArray(table.auditLog.entityId, [asked.id, again.id]))).map((a) => a.action).sort();
		expect(actions).toEqual(['authorisation.grant', 'authorisation.refuse', 'authorisation.request', 'authorisation.request', 'authorisation.withdraw']);
	});

	it('an officer cannot answer their own request; a person outside the lab or a manager cannot be granted', async () => {
		const own = await authorisations.request(secondOfficer, { target: `laser:${laserId}`, note: '' });
		if (!own.ok) throw new Error('request');
		expect(await authorisations.decide(secondOfficer, own.id, { decision: 'granted', trainingTopics: [], procedureIds: [], expiresOn: '', reason: '', version: 1 }, today)).toMatchObject({ ok: false, status: 403 });
		const outsider = await makeUser('researcher', []);
		const manager = await makeUser('manager', []);
		for (const who of [outsider, manager])
			expect(await authorisations.grant(officer, { userId: who.id, target: `laser:${laserId}`, trainingTopics: [], procedureIds: [], expiresOn: '', reason: '' }, today)).toMatchObject({ ok: false, status: 400, fields: { userId: expect.any(Array) } });
	});

	it('a researcher sees their labs’ authorisations and their own, not another lab’s', async () => {
		const otherLab = await makeLab();
		const outsider = await scopeFor(await makeUser('researcher', [otherLab.id]));
		const mine = await authorisations.list(drafter, today);
		const theirs = await authorisations.list(outsider, today);
		expect(mine.length).toBeGreaterThan(0);
		expect(theirs.filter((r) => r.labId === lab.id)).toEqual([]);
		const someone = mine[0].id;
		expect(await authorisations.find(outsider, someone, today)).toMatchObject({ ok: false, status: 404 });
	});
});
