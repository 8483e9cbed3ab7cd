// Inspections as recorded and followed up: a checklist cannot be recorded with unanswered items,
// findings are closed with who, when and what was done, overdue findings are reminded through the
// mail ledger, and the daily reminder run knows when a start-up must catch it up.
import { randomUUID } from 'node:crypto';
import { and, eq, isNull } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as inspections from '$lib/server/inspections';
import * as dailyRun from '$lib/server/jobs/dailyRun';
import * as outbox from '$lib/server/mail/outbox';
import { shiftDay } from '$lib/server/mail/schedule';
import { findingOverdueMails, runDaily } from '$lib/server/reminders';
import type { RecordInspectionForm } from '$lib/schemas/inspections';
import { makeLab, makeUser, scopeFor } from './factories';

/** Far from the real date and from the other files' days, so their rows are not in these windows. */
const T = '2036-09-10';
const APP_URL = 'http://beamwarden.test';

let officer: Awaited<ReturnType<typeof makeUser>>;
let responsible: Awaited<ReturnType<typeof makeUser>>;
let templateId: string;
let items: string[];

beforeAll(async () => {
	const lab = await makeLab();
	officer = await makeUser('officer');
	responsible = await makeUser('researcher', [lab.id]);
	items = ['Signs at the door', 'Interlock drops the shutter', 'Eyewear on hand'];
	templateId = await inspections.createTemplate(officer.id, `Test checklist ${randomUUID().slice(0, 6)}`, items);
	const [area] = await db.insert(table.area).values({ labId: lab.id, name: `Bay ${randomUUID().slice(0, 4)}`, room: 'C3', building: 'Optics hall', responsibleId: responsible.id, inspectorId: officer.id }).returning();
	areaId = area.id;
});
let areaId: string;

async function openInspection() {
	await db.update(table.inspection).set({ completedOn: '2020-01-01' }).where(and(eq(table.inspection.areaId, areaId), isNull(table.inspection.completedOn)));
	const [row] = await db.insert(table.inspection).values({ areaId, inspectorId: officer.id, dueOn: shiftDay(T, -20) }).returning();
	return row;
}

const form = (version: number, outcomes: string[], findings: RecordInspectionForm['findings'] = []): RecordInspectionForm => ({
	completedOn: shiftDay(T, -14),
	templateId,
	results: items.map((itemText, i) => ({ itemText, outcome: outcomes[i] as RecordInspectionForm['results'][number]['outcome'], notes: outcomes[i] === 'fail' ? 'Broken' : '' })),
	findings,
	notes: '',
	version
});

describe('recording an inspection', () => {
	it('refuses unanswered items by name and writes nothing', async () => {
		const open = await openInspection();
		const r = await inspections.record(await scopeFor(officer), open.id, form(open.version, ['pass', '', '']));
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.status).toBe(400);
		expect(r.fields?.results?.[0]).toContain('2. Interlock drops the shutter');
		expect(r.fields?.results?.[0]).toContain('3. Eyewear on hand');
		expect(r.fields?.results?.[0]).not.toContain('1. Signs');
		const [after] = await db.select().from(table.inspection).where(eq(table.inspection.id, open.id));
		expect(after.completedOn).toBeNull();
		expect(await db.select().from(table.inspectionResult).where(eq(table.inspectionResult.inspectionId, open.id))).toHaveLength(0);
	});
});

describe('findings', () => {
	let inspectionId: string;
	let finding: typeof table.finding.$inferSelect;

	beforeAll(async () => {
		const open = await openInspection();
		const r = await inspections.record(await scopeFor(officer), open.id, form(open.version, ['pass', 'fail', 'not_applicable'], [{ description: 'Interlock switch worn', action: 'Replace the switch', dueOn: shiftDay(T, -10) }]));
		expect(r.ok).toBe(true);
		inspectionId = open.id;
		[finding] = await db.select().from(table.finding).where(eq(table.finding.inspectionId, inspectionId));
	});

	it('an overdue finding is reminded weekly through the ledger, to the responsible person, the inspector and the recorder', async () => {
		const counts = await runDaily(T);
		expect(counts.findingOverdue).toBeGreaterThanOrEqual(1);
		const rows = await db.select().from(table.mailOutbox).where(and(eq(table.mailOutbox.kind, 'finding.overdue'), eq(table.mailOutbox.recordId, finding.id)));
		// Officer is both the area's inspector and the recorder: one mail, both reasons.
		expect(rows.map((r) => `${r.step} ${r.recipientEmail}`).sort()).toEqual([`1 ${officer.email}`, `1 ${responsible.email}`].sort());
		const toOfficer = rows.find((r) => r.recipientEmail === officer.email)!;
		expect(toOfficer.reason).toContain('inspector of this area');
		expect(toOfficer.reason).toContain('recorded the inspection');
		expect(toOfficer.subject).toContain('Inspection finding overdue by 10 days');
		expect(toOfficer.textBody).toContain('Interlock switch worn');
		expect(toOfficer.textBody).toContain(`/inspections/${inspectionId}`);

		// The same day or week again adds nothing; the next week is its own step.
		expect((await runDaily(T)).findingOverdue).toBe(0);
		const again = (await findingOverdueMails(shiftDay(T, 3), APP_URL)).filter((m) => m.recordId === finding.id);
		expect((await db.transaction((tx) => outbox.enqueue(tx, again))).inserted).toBe(0);
		const nextWeek = (await findingOverdueMails(shiftDay(T, 7), APP_URL)).filter((m) => m.recordId === finding.id);
		expect(nextWeek.map((m) => m.step)).toEqual(['2', '2']);
	});

	it('is closed with who, when and what was done, once, with an audit row; then it is no longer reminded', async () => {
		const scope = await scopeFor(officer);
		const stale = await inspections.closeFinding(scope, inspectionId, { findingId: finding.id, closedOn: shiftDay(T, -1), closureNote: 'Switch replaced', version: finding.version + 5 });
		expect(stale).toMatchObject({ ok: false, status: 409 });

		const researcher = await inspections.closeFinding(await scopeFor(responsible), inspectionId, { findingId: finding.id, closedOn: shiftDay(T, -1), closureNote: 'Switch replaced', version: finding.version });
		expect(researcher).toMatchObject({ ok: false, status: 403 });

		const r = await inspections.closeFinding(scope, inspectionId, { findingId: finding.id, closedOn: shiftDay(T, -1), closureNote: 'Switch replaced, interlock tested', version: finding.version });
		expect(r).toEqual({ ok: true, description: 'Interlock switch worn' });
		const [after] = await db.select().from(table.finding).where(eq(table.finding.id, finding.id));
		expect(after).toMatchObject({ closedOn: shiftDay(T, -1), closedBy: officer.id, closureNote: 'Switch replaced, interlock tested', version: finding.version + 1 });
		const audits = await db.select().from(table.auditLog).where(and(eq(table.auditLog.entityId, finding.id), eq(table.auditLog.action, 'finding.close')));
		expect(audits).toHaveLength(1);

		expect(await inspections.closeFinding(scope, inspectionId, { findingId: finding.id, closedOn: T, closureNote: 'again', version: after.version })).toMatchObject({ ok: false, status: 409 });
		const later = (await findingOverdueMails(shiftDay(T, 14), APP_URL)).filter((m) => m.recordId === finding.id);
		expect(later).toEqual([]);
	});
});

describe('the daily reminder run at start-up', () => {
	const now = new Date('2036-09-10T09:30:00Z');

	it('is owed when it never ran or last finished more than a day ago, not otherwise', async () => {
		await db.delete(table.jobRun).where(eq(table.jobRun.queue, 'mail-daily'));
		expect(await dailyRun.owedAt(now)).toBe(true); // never ran (a fresh demo)

		await dailyRun.recordRun(new Date('2036-09-09T06:00:05Z'), { inspectionDue: 1 });
		expect(await dailyRun.owedAt(now)).toBe(true); // 27.5 hours ago: the server was down at 06:00

		await dailyRun.recordRun(new Date('2036-09-09T09:31:00Z'), { inspectionDue: 0 });
		expect(await dailyRun.owedAt(now)).toBe(false); // 23 h 59 min ago

		await dailyRun.recordRun(new Date('2036-09-10T06:00:05Z'), { inspectionDue: 2 });
		expect(await dailyRun.owedAt(now)).toBe(false);
		expect(await dailyRun.lastRun()).toEqual({ finishedAt: new Date('2036-09-10T06:00:05Z'), result: { inspectionDue: 2 } });
		await db.delete(table.jobRun).where(eq(table.jobRun.queue, 'mail-daily'));
	});

	it('runs next at the scheduled hour (06:00 UTC), today or tomorrow', () => {
		expect(dailyRun.nextScheduled(new Date('2036-09-10T05:59:59Z')).toISOString()).toBe('2036-09-10T06:00:00.000Z');
		expect(dailyRun.nextScheduled(new Date('2036-09-10T06:00:00Z')).toISOString()).toBe('2036-09-11T06:00:00.000Z');
		expect(dailyRun.nextScheduled(new Date('2036-12-31T23:00:00Z')).toISOString()).toBe('2037-01-01T06:00:00.000Z');
	});
});
