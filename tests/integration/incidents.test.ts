// Incidents and near misses against a real PostgreSQL: drafts and sending, the officers' immediate
// mail for a suspected eye exposure (once), who sees what (names, anonymity, other labs, medical),
// the audit of personal views, investigation, actions and closing, laser suspension blocking new
// clearances, overdue-action reminders through the ledger (once), figures and the CSV.
import { and, desc, eq, inArray } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import type { Scope } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import * as medical from '$lib/server/medical';
import * as outbox from '$lib/server/mail/outbox';
import * as paths from '$lib/server/paths';
import { actionOverdueMails } from '$lib/server/reminders';
import * as reviews from '$lib/server/reviews';
import * as suspensions from '$lib/server/suspensions';
import { readUploads } from '$lib/server/uploads';
import * as preferences from '$lib/server/preferences';
import { reportSchema, type ReportForm } from '$lib/schemas/incidents';
import { todayISO } from '$lib/inspectionState';
import { png } from '../../seed/png';
import { lasers, laserForm, limitForm, limits, makeLab, makeUser, must, pathForm, scopeFor } from './factories';

const today = todayISO();
let lab: { id: string };
let otherLab: { id: string };
let areaId: string;
let reporter: Scope;
let reporterName: string;
let colleague: Scope;
let stranger: Scope;
let officer: Scope;
let secondOfficer: Scope;
let manager: Scope;
let admin: Scope;
let laserId: string;

const report = (o: Partial<ReportForm> = {}): ReportForm => ({
	intent: 'submit',
	kind: 'near_miss',
	occurredAt: '2026-03-04T10:15',
	areaId,
	laserId: '',
	pathId: '',
	locationNotes: 'optical table 2',
	description: 'A mirror mount slipped during alignment and the beam swept across the bench edge.',
	peopleInvolved: 'Quentin Example-Bystander',
	medicalAttention: 'not_sought',
	anonymous: false,
	version: 0,
	...o
});

async function sent(by: Scope, o: Partial<ReportForm> = {}) {
	const r = await incidents.saveReport(by, null, report(o));
	if (!r.ok) throw new Error(JSON.stringify(r));
	return r.id;
}

async function personalViews(incidentId: string) {
	return db.select().from(table.auditLog).where(and(eq(table.auditLog.entity, 'incident'), eq(table.auditLog.entityId, incidentId), eq(table.auditLog.action, 'incident.view_personal')));
}

beforeAll(async () => {
	lab = await makeLab();
	otherLab = await makeLab();
	const [area] = await db.insert(table.area).values({ labId: lab.id, name: `Incident test area ${Date.now()}` }).returning();
	areaId = area.id;
	const who = await makeUser('researcher', [lab.id]);
	reporter = await scopeFor(who);
	reporterName = `Reporter ${Date.now()}`;
	await db.update(table.user).set({ name: reporterName }).where(eq(table.user.id, who.id));
	colleague = await scopeFor(await makeUser('researcher', [lab.id]));
	stranger = await scopeFor(await makeUser('researcher', [otherLab.id]));
	officer = await scopeFor(await makeUser('officer'));
	secondOfficer = await scopeFor(await makeUser('officer'));
	manager = await scopeFor(await makeUser('manager'));
	admin = await scopeFor(await makeUser('admin'));
	const created = await lasers.create(reporter, laserForm(lab.id));
	if (!created.ok) throw new Error('laser');
	laserId = created.id;
	await db.update(table.laser).set({ areaId }).where(eq(table.laser.id, laserId));
});

describe('reporting', () => {
	it('keeps a half-filled draft for its reporter only, then sends it', async () => {
		const draft = await incidents.saveReport(reporter, null, report({ intent: 'draft', kind: '', occurredAt: '', areaId: '', description: 'mirror' }));
		if (!draft.ok) throw new Error(JSON.stringify(draft));
		expect(draft.submitted).toBe(false);
		expect(await incidents.levelOf(reporter, draft.id)).toBe('own');
		for (const s of [officer, manager, colleague, admin]) expect(await incidents.levelOf(s, draft.id)).toBeNull();
		expect((await incidents.list(officer, today)).map((r) => r.id)).not.toContain(draft.id);

		// Sending needs kind, time, place and a sentence; the schema says which, and nothing changes.
		const parsed = reportSchema.safeParse({ ...report({ kind: '', occurredAt: '', areaId: '', description: 'mirror' }) });
		expect(parsed.success).toBe(false);
		expect(parsed.error!.issues.map((i) => i.path[0]).sort()).toEqual(['areaId', 'description', 'kind', 'occurredAt']);
		expect(reportSchema.safeParse({ ...report(), role: 'officer' }).success).toBe(false);

		const finished = await incidents.saveReport(reporter, draft.id, report({ version: 1 }));
		expect(finished).toMatchObject({ ok: true, submitted: true });
		expect(await incidents.levelOf(officer, draft.id)).toBe('full');
		expect(await incidents.saveReport(reporter, draft.id, report({ version: 2 }))).toMatchObject({ ok: false, status: 409 });
		const audits = await db.select({ action: table.auditLog.action }).from(table.auditLog).where(eq(table.auditLog.entityId, draft.id));
		expect(audits.map((a) => a.action)).toEqual(expect.arrayContaining(['incident.draft', 'incident.submit']));
	});

	it('refuses another person’s draft, a stale version and a path of another laser, writing nothing', async () => {
		const draft = await incidents.saveReport(reporter, null, report({ intent: 'draft' }));
		if (!draft.ok) throw new Error('draft');
		expect(await incidents.saveReport(colleague, draft.id, report({ version: 1 }))).toMatchObject({ ok: false, status: 404 });
		expect(await incidents.saveReport(reporter, draft.id, report({ version: 7 }))).toMatchObject({ ok: false, status: 409 });
		const other = await lasers.create(reporter, laserForm(lab.id));
		if (!other.ok) throw new Error('laser');
		const [line] = await db.select().from(table.emissionLine).where(eq(table.emissionLine.laserId, other.id));
		const saved = await paths.save(reporter, other.id, null, pathForm(line.id));
		if (!saved.ok) throw new Error('path');
		expect(await incidents.saveReport(reporter, draft.id, report({ version: 1, laserId, pathId: saved.id }))).toMatchObject({ ok: false, status: 400, fields: { pathId: expect.any(Array) } });
		const [row] = await db.select().from(table.incident).where(eq(table.incident.id, draft.id));
		expect(row).toMatchObject({ state: 'draft', version: 1 });
	});

	it('takes the lab and the area from the laser, and photos in the same transaction', async () => {
		const form = new FormData();
		form.append('photos', new File([new Uint8Array(png(40, 30, (x) => x * 5))], 'bench photo by Quentin.png', { type: 'image/png' }));
		const files = await readUploads(form, 'photos');
		if (!files.ok) throw new Error('upload');
		const r = await incidents.saveReport(reporter, null, report({ areaId: '', laserId }), files.files);
		if (!r.ok) throw new Error(JSON.stringify(r));
		const [row] = await db.select().from(table.incident).where(eq(table.incident.id, r.id));
		expect(row).toMatchObject({ labId: lab.id, areaId, laserId });
		const docs = await db.select().from(table.document).where(and(eq(table.document.entity, 'incident'), eq(table.document.entityId, r.id)));
		expect(docs).toHaveLength(1);
		// The file name may name people: only officers and the uploader see it.
		expect((await incidents.documentFor(officer, docs[0].id))?.fileName).toBe('bench photo by Quentin.png');
		expect((await incidents.documentFor(colleague, docs[0].id))?.fileName).not.toMatch(/Quentin/);
		expect(await incidents.documentFor(stranger, docs[0].id)).toBeNull();
	});

	it('mails every officer at once for a suspected eye exposure, even digest readers, once, with no name in it', async () => {
		await preferences.setMailMode(secondOfficer.userId, 'digest');
		const id = await sent(reporter, { kind: 'eye_exposure', medicalAttention: 'sought', anonymous: true });
		const rows = await db.select().from(table.mailOutbox).where(and(eq(table.mailOutbox.kind, 'incident.eye_exposure'), eq(table.mailOutbox.recordId, id)));
		const officers = await db.select({ id: table.user.id }).from(table.user).where(and(eq(table.user.role, 'officer'), eq(table.user.disabled, false)));
		expect(rows.map((r) => r.recipientId).sort()).toEqual(officers.map((o) => o.id).sort());
		expect(rows.every((r) => r.status === 'pending')).toBe(true);
		for (const r of rows) {
			expect(r.subject).toMatch(/Suspected eye exposure/);
			expect(`${r.subject}${r.textBody}${r.htmlBody}`).not.toContain(reporterName);
			expect(`${r.textBody}`).not.toContain('Quentin');
			expect(r.textBody).toMatch(/24 hours/);
		}
		// Sending again is refused, and computing the same mails again adds nothing.
		expect(await incidents.saveReport(reporter, id, report({ kind: 'eye_exposure', version: 1 }))).toMatchObject({ ok: false, status: 409 });
		const again = await db.transaction((tx) =>
			outbox.enqueue(tx, rows.map((r) => ({ kind: 'incident.eye_exposure', recordId: r.recordId, dueKey: r.dueKey, step: r.step, recipientId: r.recipientId, recipientEmail: r.recipientEmail, subject: r.subject, text: r.textBody, html: r.htmlBody, reason: r.reason })))
		);
		expect(again.inserted).toBe(0);
		// A near miss mails nobody.
		const quiet = await sent(reporter);
		expect(await db.$count(table.mailOutbox, eq(table.mailOutbox.recordId, quiet))).toBe(0);
		// Other test files count on every officer reading mail one by one.
		await preferences.setMailMode(secondOfficer.userId, 'immediate');
	});
});

describe('who sees what', () => {
	let id: string;
	beforeAll(async () => {
		id = await sent(reporter, { anonymous: true });
		const a = await incidents.addAction(officer, id, { description: 'Add a second clamp to mirror mounts on table 2', ownerId: colleague.userId, dueOn: '2030-01-01' });
		if (!a.ok) throw new Error('action');
	});

	it('officers see everything, the reporter included', async () => {
		const v = must(await incidents.find(officer, id, today)).incident;
		expect(v.level).toBe('full');
		expect(v.reporter).toEqual({ name: reporterName, anonymous: true });
		expect(v.peopleInvolved).toBe('Quentin Example-Bystander');
		expect(v.actions[0].ownerName).toBeTruthy();
	});

	it('the manager sees the people involved but not an anonymous reporter', async () => {
		const v = must(await incidents.find(manager, id, today)).incident;
		expect(v.level).toBe('manager');
		expect(v.reporter).toBeNull();
		expect(v.reporterWithheld).toBe(true);
		expect(v.peopleInvolved).toBe('Quentin Example-Bystander');
		expect(JSON.stringify(v)).not.toContain(reporterName);
		// Not anonymous: the manager sees who reported.
		const open = await sent(reporter);
		expect(must(await incidents.find(manager, open, today)).incident.reporter?.name).toBe(reporterName);
	});

	it('researchers of the lab see its near misses with every name removed; other labs see nothing', async () => {
		const v = must(await incidents.find(colleague, id, today)).incident;
		expect(v.level).toBe('redacted');
		expect(v.reporter).toBeNull();
		expect(v.peopleInvolved).toBeNull();
		expect(v.actions[0]).toMatchObject({ ownerName: null, ownerIsYou: true });
		const text = JSON.stringify(v);
		expect(text).not.toContain(reporterName);
		expect(text).not.toContain('Quentin');
		expect(await incidents.find(stranger, id, today)).toMatchObject({ ok: false, status: 404 });
		expect((await incidents.list(stranger, today)).map((r) => r.id)).not.toContain(id);
		expect((await incidents.list(colleague, today)).map((r) => r.id)).toContain(id);
		// An incident that is not a near miss stays with the officers, the manager and the reporter.
		const burn = await sent(reporter, { kind: 'skin_exposure' });
		expect(await incidents.find(colleague, burn, today)).toMatchObject({ ok: false, status: 404 });
		expect(must(await incidents.find(reporter, burn, today)).incident.level).toBe('own');
		expect(await incidents.find(admin, burn, today)).toMatchObject({ ok: false, status: 404 });
	});

	it('lists carry no personal field for anyone', async () => {
		for (const s of [officer, manager, colleague]) {
			const text = JSON.stringify(await incidents.list(s, today));
			expect(text).not.toContain(reporterName);
			expect(text).not.toContain('Quentin');
		}
	});

	it('every view of personal fields is in the audit log; a view without them is not', async () => {
		const before = (await personalViews(id)).length;
		await incidents.find(officer, id, today, 'api');
		await incidents.find(manager, id, today);
		await incidents.find(colleague, id, today);
		const after = await personalViews(id);
		expect(after.length).toBe(before + 2);
		expect(after.map((a) => a.actorId)).toEqual(expect.arrayContaining([officer.userId, manager.userId]));
		expect(after.map((a) => a.actorId)).not.toContain(colleague.userId);
	});

	it('the medical follow-up reaches officers only, version-checked, every read audited', async () => {
		for (const s of [manager, colleague, reporter, admin]) {
			expect(await medical.read(s, id, 'api')).toMatchObject({ ok: false, status: 403 });
			expect(await medical.save(s, id, { examinationRequestedOn: '2026-03-04', examinationDoneOn: '', outcome: '', version: 0 })).toMatchObject({ ok: false, status: 403 });
		}
		expect(await medical.save(officer, id, { examinationRequestedOn: '2026-03-04', examinationDoneOn: '2026-03-05', outcome: 'No lesion seen; review in four weeks', version: 0 })).toEqual({ ok: true });
		expect(await medical.save(secondOfficer, id, { examinationRequestedOn: '2026-03-04', examinationDoneOn: '', outcome: '', version: 0 })).toMatchObject({ ok: false, status: 409 });
		expect(await medical.read(officer, id, 'page')).toMatchObject({ ok: true, outcome: 'No lesion seen; review in four weeks', version: 1 });
		// Not in anyone's incident view, nor the officer's (it has its own page and API).
		for (const s of [officer, manager, colleague]) expect(JSON.stringify(await incidents.find(s, id, today))).not.toContain('No lesion seen');
		const reads = await db.select().from(table.auditLog).where(and(eq(table.auditLog.entityId, id), eq(table.auditLog.action, 'incident.view_medical')));
		expect(reads.length).toBeGreaterThanOrEqual(1);
	});
});

describe('investigating, following up and closing', () => {
	it('records the investigation (version-checked), adds actions, closes only when every action is closed', async () => {
		const id = await sent(reporter);
		expect(await incidents.investigate(colleague, id, { severity: 'caught', causes: 'x y z', factors: ['alignment'], pathIds: [], eyewearIds: [], procedures: '', version: 1 })).toMatchObject({ ok: false, status: 403 });
		expect(await incidents.close(officer, id, { closingNote: '', version: 1 })).toMatchObject({ ok: false, status: 409 });
		const inv = { severity: 'slight' as const, causes: 'Mount not tightened after the last change.', factors: ['alignment' as const, 'equipment' as const], pathIds: [], eyewearIds: [], procedures: 'SOP UFL-03\nSOP UFL-03\nAlignment checklist', version: 1 };
		expect(await incidents.investigate(officer, id, inv)).toEqual({ ok: true });
		expect(await incidents.investigate(secondOfficer, id, inv)).toMatchObject({ ok: false, status: 409 });
		const v = must(await incidents.find(officer, id, today)).incident;
		expect(v).toMatchObject({ state: 'investigating', severity: 'slight', factors: ['alignment', 'equipment'] });
		expect(v.links.procedures).toEqual(['Alignment checklist', 'SOP UFL-03']);

		expect(await incidents.addAction(colleague, id, { description: 'x', ownerId: colleague.userId, dueOn: '2030-01-01' })).toMatchObject({ ok: false, status: 403 });
		expect(await incidents.addAction(officer, id, { description: 'Nobody', ownerId: 'no-such-user', dueOn: '2030-01-01' })).toMatchObject({ ok: false, status: 400 });
		const a1 = await incidents.addAction(officer, id, { description: 'Clamp the mounts', ownerId: colleague.userId, dueOn: '2030-01-01' });
		const a2 = await incidents.addAction(officer, id, { description: 'Brief the group', ownerId: secondOfficer.userId, dueOn: '2030-02-01' });
		if (!a1.ok || !a2.ok) throw new Error('actions');
		expect(await incidents.close(officer, id, { closingNote: '', version: 2 })).toMatchObject({ ok: false, status: 409, message: expect.stringMatching(/2 corrective actions are still open/) });

		// The owner closes theirs with evidence and a photo; a stranger cannot touch it.
		expect(await incidents.closeAction(stranger, { actionId: a1.id, evidence: 'done', version: 1 })).toMatchObject({ ok: false, status: 404 });
		const form = new FormData();
		form.append('photos', new File([new Uint8Array(png(20, 20, () => 90))], 'clamp.png', { type: 'image/png' }));
		const files = await readUploads(form, 'photos');
		if (!files.ok) throw new Error('upload');
		expect(await incidents.closeAction(colleague, { actionId: a1.id, evidence: 'Second clamp fitted to all six mounts.', version: 1 }, files.files)).toMatchObject({ ok: true, incidentId: id });
		expect(await incidents.closeAction(colleague, { actionId: a1.id, evidence: 'again', version: 2 })).toMatchObject({ ok: false, status: 409 });
		expect(await incidents.close(officer, id, { closingNote: '', version: 2 })).toMatchObject({ ok: false, status: 409, message: expect.stringMatching(/1 corrective action is still open/) });
		expect(await incidents.closeAction(officer, { actionId: a2.id, evidence: 'Briefed at the group meeting.', version: 1 })).toMatchObject({ ok: true });
		expect(await incidents.close(officer, id, { closingNote: 'Clamp every mount.', version: 2 })).toEqual({ ok: true });
		const closed = must(await incidents.find(officer, id, today)).incident;
		expect(closed.state).toBe('closed');
		expect(closed.actions.map((a) => a.state)).toEqual(['done', 'done']);
		expect(closed.actions[0].photos).toHaveLength(1);
		expect(await incidents.addAction(officer, id, { description: 'late', ownerId: colleague.userId, dueOn: '2030-01-01' })).toMatchObject({ ok: false, status: 409 });
		const trail = await db.select({ action: table.auditLog.action }).from(table.auditLog).where(inArray(table.auditLog.entityId, [id, a1.id, a2.id]));
		expect(trail.map((t) => t.action)).toEqual(expect.arrayContaining(['incident.investigate', 'incident.action_add', 'incident.action_close', 'incident.close']));
	});
});

describe('laser suspension', () => {
	it('blocks a new clearance until lifted, shows wherever the laser is read, and keeps who and why', async () => {
		await limits.create(officer.userId, limitForm({ label: `Incident tests visible ${Date.now()}` }));
		await paths.reassessStale(1000);
		const [line] = await db.select().from(table.emissionLine).where(eq(table.emissionLine.laserId, laserId));
		const saved = await paths.save(reporter, laserId, null, pathForm(line.id, { name: `Suspension test path ${Date.now()}` }));
		if (!saved.ok) throw new Error(JSON.stringify(saved));
		const p = await paths.find(officer, saved.id);
		if (!p.ok) throw new Error('path');
		expect(p.detail.path.reviewState).toBe('awaiting_review');

		const id = await sent(reporter, { laserId });
		expect(await incidents.suspendFrom(colleague, id, { laserId, reason: 'x' })).toMatchObject({ ok: false, status: 403 });
		const s = await incidents.suspendFrom(officer, id, { laserId, reason: 'Mirror mounts under review after incident' });
		if (!s.ok) throw new Error(JSON.stringify(s));
		expect(await suspensions.suspend(secondOfficer, { laserId, reason: 'again' })).toMatchObject({ ok: false, status: 409 });

		const decisionsBefore = await db.$count(table.reviewDecision, eq(table.reviewDecision.pathId, saved.id));
		const clearance = {
			assessmentId: p.detail.latest!.id,
			afterDecisionId: '',
			decision: 'cleared' as const,
			comments: 'ok',
			reviewBy: '',
			controls: [{ kind: 'enclosure' as const, minOd: '', wavelength: '', wavelengthMax: '', details: 'tube' }]
		};
		const refused = await reviews.decide(officer, saved.id, clearance);
		expect(refused).toMatchObject({ ok: false, status: 409, message: expect.stringMatching(/is suspended since .*Mirror mounts under review.*No new clearance/) });
		expect(await db.$count(table.reviewDecision, eq(table.reviewDecision.pathId, saved.id))).toBe(decisionsBefore);

		// Wherever the laser is read: the inventory row, the pages about it (own lab only).
		const inv = await lasers.inventory(reporter, { sort: 'model', dir: 'asc', page: 1, pageSize: 200, labId: lab.id });
		expect(inv.items.find((l) => l.id === laserId)?.suspended).toBe(true);
		expect(await suspensions.forPage(colleague, { pathId: saved.id })).toMatchObject({ laserId, reason: 'Mirror mounts under review after incident' });
		expect(await suspensions.forPage(stranger, { laserId })).toBeNull();
		expect((await reviews.queue(officer)).find((q) => q.pathId === saved.id)?.laserSuspended).toBe(true);

		expect(await suspensions.lift(colleague, { suspensionId: s.id, reason: 'x' })).toMatchObject({ ok: false, status: 403 });
		expect(await suspensions.lift(officer, { suspensionId: s.id, reason: 'Mounts replaced and checked' })).toEqual({ ok: true });
		expect(await suspensions.lift(officer, { suspensionId: s.id, reason: 'again' })).toMatchObject({ ok: false, status: 409 });
		expect(await suspensions.forPage(colleague, { laserId })).toBeNull();
		expect(await reviews.decide(officer, saved.id, clearance)).toMatchObject({ ok: true });

		const [history] = await suspensions.history([laserId]);
		expect(history).toMatchObject({ reason: 'Mirror mounts under review after incident', liftReason: 'Mounts replaced and checked', incidentId: id });
		const audits = await db.select({ action: table.auditLog.action }).from(table.auditLog).where(and(eq(table.auditLog.entity, 'laser'), eq(table.auditLog.entityId, laserId))).orderBy(desc(table.auditLog.id));
		expect(audits.map((a) => a.action)).toEqual(expect.arrayContaining(['laser.suspend', 'laser.lift_suspension']));
		const [laserRow] = await db.select({ status: table.laser.status }).from(table.laser).where(eq(table.laser.id, laserId));
		expect(laserRow.status).toBe('active'); // the laser's own status is never overloaded
	});
});

describe('overdue corrective actions', () => {
	const T = '2033-05-10';
	it('reminds the owner and the officer who set it, weekly, once per week through the ledger', async () => {
		const id = await sent(reporter);
		const late = await incidents.addAction(officer, id, { description: 'Replace the cracked beam tube', ownerId: colleague.userId, dueOn: '2033-05-01' });
		const notYet = await incidents.addAction(officer, id, { description: 'Not due yet', ownerId: colleague.userId, dueOn: '2033-06-01' });
		const closed = await incidents.addAction(officer, id, { description: 'Done already', ownerId: colleague.userId, dueOn: '2033-04-01' });
		if (!late.ok || !notYet.ok || !closed.ok) throw new Error('actions');
		await incidents.closeAction(colleague, { actionId: closed.id, evidence: 'done', version: 1 });
		const ours = (mails: Awaited<ReturnType<typeof actionOverdueMails>>) => mails.filter((m) => [late.id, notYet.id, closed.id].includes(m.recordId));

		const mails = ours(await actionOverdueMails(T, 'http://beamwarden.test'));
		expect(mails.map((m) => `${m.recordId === late.id} ${m.step} ${m.recipientId}`).sort()).toEqual([`true 1 ${colleague.userId}`, `true 1 ${officer.userId}`].sort());
		expect(mails[0].subject).toMatch(/overdue by 9 days \(incident \d+\)/);
		expect(mails.every((m) => !m.text.includes(reporterName))).toBe(true);
		expect(await db.transaction((tx) => outbox.enqueue(tx, mails))).toMatchObject({ inserted: 2 });
		expect(await db.transaction((tx) => outbox.enqueue(tx, mails))).toMatchObject({ inserted: 0 });
		expect(await db.transaction(async (tx) => outbox.enqueue(tx, ours(await actionOverdueMails('2033-05-12', 'http://beamwarden.test'))))).toMatchObject({ inserted: 0 });
		expect(await db.transaction(async (tx) => outbox.enqueue(tx, ours(await actionOverdueMails('2033-05-16', 'http://beamwarden.test'))))).toMatchObject({ inserted: 2 });
	});
});

describe('lessons and export', () => {
	it('counts by month, kind, area and cause for officers and managers, and the CSV holds no personal field', async () => {
		const id = await sent(reporter, { occurredAt: `${today.slice(0, 7)}-01T09:00`, anonymous: true });
		await incidents.investigate(officer, id, { severity: 'caught', causes: 'Beam tube removed for alignment.', factors: ['enclosure'], pathIds: [], eyewearIds: [], procedures: '', version: 1 });
		const l = await incidents.learning(manager, today);
		expect(l.months).toHaveLength(12);
		expect(l.months.at(-1)!.month).toBe(today.slice(0, 7));
		expect(l.months.at(-1)!.nearMisses).toBeGreaterThanOrEqual(1);
		expect(l.byKind.find((k) => k.key === 'near_miss')!.count).toBeGreaterThanOrEqual(1);
		expect(l.byFactor.find((f) => f.key === 'enclosure')!.count).toBeGreaterThanOrEqual(1);
		expect(l.byArea.map((a) => a.name)).toEqual(expect.arrayContaining([expect.stringMatching(/^Incident test area/)]));
		expect((await incidents.learning(colleague, today)).total).toBe(0);

		const csv = incidents.toCsv(await incidents.list(manager, today));
		expect(csv.split('\r\n')[0]).toMatch(/^"number","occurred at","kind","severity","state"/);
		const line = csv.split('\r\n').find((x) => x.includes('enclosure'))!;
		expect(line).toMatch(/"Near miss","caught","investigating"/);
		expect(csv).not.toContain(reporterName);
		expect(csv).not.toContain('Quentin');
	});
});
