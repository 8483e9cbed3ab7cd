// Inspections of laser controlled areas: the schedule, recording one (with its checklist,
// findings and photos) and the next due date, the manager's dashboard and its export.
import { addMonths, format, parseISO, startOfMonth, endOfMonth, subMonths } from 'date-fns';
import { and, asc, desc, eq, inArray, isNull, sql, type SQL } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { canRead, type Scope, inReadableLabs } from '$lib/server/auth/scope';
import { changedMeanwhile, failure, fieldsNeedAttention, notFound, type Failure } from '$lib/server/http/failure';
import { writeCsv } from '$lib/server/csv';
import { isUuid } from '$lib/server/db/ids';
import type { StoredUpload } from '$lib/server/uploads';
import type { MonthCount } from '$lib/inspectionState';
import { inspectionState, type InspectionState } from '$lib/inspectionState';
import { unansweredItems, type CheckOutcome, type CloseFindingForm, type RecordInspectionForm } from '$lib/schemas/inspections';
import { can } from '$lib/abilities';

const labScope = (scope: Scope): SQL | undefined =>
	inReadableLabs(scope, table.area.labId);

const inspectorUser = db
	.select({ id: table.user.id, name: table.user.name })
	.from(table.user)
	.as('inspector_user');
const responsibleUser = db.select({ id: table.user.id, name: table.user.name }).from(table.user).as('responsible_user');
const closerUser = db.select({ id: table.user.id, name: table.user.name }).from(table.user).as('closer_user');

export type ScheduleRow = {
	id: string;
	areaId: string;
	areaName: string;
	labCode: string;
	dueOn: string;
	completedOn: string | null;
	inspectorId: string | null;
	inspectorName: string | null;
	responsibleId: string | null;
	responsibleName: string | null;
	intervalMonths: number;
	version: number;
	state: InspectionState;
};

/** Every open inspection in scope with its state on `today`; one query. */
export async function schedule(scope: Scope, today: string): Promise<ScheduleRow[]> {
	const rows = await db
		.select({
			id: table.inspection.id,
			areaId: table.area.id,
			areaName: table.area.name,
			labCode: table.lab.code,
			dueOn: table.inspection.dueOn,
			completedOn: table.inspection.completedOn,
			inspectorId: table.inspection.inspectorId,
			inspectorName: inspectorUser.name,
			responsibleId: table.area.responsibleId,
			responsibleName: responsibleUser.name,
			intervalMonths: table.area.inspectionIntervalMonths,
			version: table.inspection.version
		})
		.from(table.inspection)
		.innerJoin(table.area, eq(table.area.id, table.inspection.areaId))
		.innerJoin(table.lab, eq(table.lab.id, table.area.labId))
		.leftJoin(inspectorUser, eq(inspectorUser.id, table.inspection.inspectorId))
		.leftJoin(responsibleUser, eq(responsibleUser.id, table.area.responsibleId))
		.where(and(isNull(table.inspection.completedOn), labScope(scope)))
		.orderBy(asc(table.inspection.dueOn));
	return rows.map((r) => ({ ...r, state: inspectionState(r.dueOn, r.completedOn, today) }));
}


/**
 * Due per month over the next 12 months (each open inspection, then every interval after it) and,
 * over the last 12, how many inspections stood overdue at each month's end; `overdueNow` counts the
 * open ones past their due day today, which the current month shows as overdue, not as due.
 */
export async function chart(scope: Scope, today: string): Promise<{ upcoming: MonthCount[]; overdue: MonthCount[]; overdueNow: number }> {
	const open = await schedule(scope, today);
	const start = startOfMonth(parseISO(today));
	const upcoming = Array.from({ length: 12 }, (_, i) => ({ month: format(addMonths(start, i), 'yyyy-MM'), count: 0 }));
	const horizon = addMonths(start, 12);
	let overdueNow = 0;
	for (const r of open) {
		let due = parseISO(r.dueOn);
		if (r.dueOn < today) {
			overdueNow++;
			due = addMonths(parseISO(today), r.intervalMonths); // its next round, at the earliest (done today)
		}
		for (; due < horizon; due = addMonths(due, r.intervalMonths)) {
			if (due < start) continue;
			const slot = upcoming.find((u) => u.month === format(due, 'yyyy-MM'));
			if (slot) slot.count++;
		}
	}
	const monthEnds = Array.from({ length: 12 }, (_, i) => endOfMonth(subMonths(start, 12 - i)));
	const rows = await db
		.select({ dueOn: table.inspection.dueOn, completedOn: table.inspection.completedOn })
		.from(table.inspection)
		.innerJoin(table.area, eq(table.area.id, table.inspection.areaId))
		.where(and(labScope(scope), sql`${table.inspection.dueOn} <= ${format(monthEnds[11], 'yyyy-MM-dd')}`));
	const overdue = monthEnds.map((end) => {
		const e = format(end, 'yyyy-MM-dd');
		return { month: format(end, 'yyyy-MM'), count: rows.filter((r) => r.dueOn < e && (r.completedOn === null || r.completedOn > e)).length };
	});
	return { upcoming, overdue, overdueNow };
}

export async function openFindings(scope: Scope) {
	return db
		.select({ id: table.finding.id, description: table.finding.description, action: table.finding.action, dueOn: table.finding.dueOn, areaName: table.area.name, labCode: table.lab.code, inspectionId: table.inspection.id })
		.from(table.finding)
		.innerJoin(table.inspection, eq(table.inspection.id, table.finding.inspectionId))
		.innerJoin(table.area, eq(table.area.id, table.inspection.areaId))
		.innerJoin(table.lab, eq(table.lab.id, table.area.labId))
		.where(and(isNull(table.finding.closedOn), labScope(scope)))
		.orderBy(asc(sql`coalesce(${table.finding.dueOn}, '9999-12-31')`));
}

export async function find(scope: Scope, inspectionId: string) {
	if (!isUuid(inspectionId)) return notFound('inspection');
	const [row] = await db
		.select({ inspection: table.inspection, area: table.area, labCode: table.lab.code, inspectorName: inspectorUser.name })
		.from(table.inspection)
		.innerJoin(table.area, eq(table.area.id, table.inspection.areaId))
		.innerJoin(table.lab, eq(table.lab.id, table.area.labId))
		.leftJoin(inspectorUser, eq(inspectorUser.id, table.inspection.inspectorId))
		.where(eq(table.inspection.id, inspectionId));
	if (!row || !canRead(scope, row.area.labId)) return notFound('inspection');
	const [results, findings, photos, history] = await Promise.all([
		db.select().from(table.inspectionResult).where(eq(table.inspectionResult.inspectionId, inspectionId)).orderBy(asc(table.inspectionResult.sequence)),
		db
			.select({ finding: table.finding, closedByName: closerUser.name })
			.from(table.finding)
			.leftJoin(closerUser, eq(closerUser.id, table.finding.closedBy))
			.where(eq(table.finding.inspectionId, inspectionId))
			.orderBy(asc(table.finding.createdAt), asc(table.finding.id))
			.then((rows) => rows.map((r) => ({ ...r.finding, closedByName: r.closedByName }))),
		db
			.select({ id: table.document.id, fileName: table.document.fileName, mediaType: table.document.mediaType, size: table.document.size })
			.from(table.document)
			.where(and(eq(table.document.entity, 'inspection'), eq(table.document.entityId, inspectionId))),
		db
			.select({ id: table.inspection.id, dueOn: table.inspection.dueOn, completedOn: table.inspection.completedOn })
			.from(table.inspection)
			.where(eq(table.inspection.areaId, row.area.id))
			.orderBy(desc(table.inspection.dueOn))
			.limit(20)
	]);
	return { ok: true as const, ...row, results, findings, photos, history };
}

export async function templates() {
	const list = await db.select().from(table.checklistTemplate).where(eq(table.checklistTemplate.active, true)).orderBy(asc(table.checklistTemplate.name));
	const items = list.length ? await db.select().from(table.checklistItem).where(inArray(table.checklistItem.templateId, list.map((t) => t.id))).orderBy(asc(table.checklistItem.sequence)) : [];
	return list.map((t) => ({ ...t, items: items.filter((i) => i.templateId === t.id) }));
}

export async function createTemplate(actorId: string, name: string, lines: string[]) {
	return db.transaction(async (tx) => {
		const [t] = await tx.insert(table.checklistTemplate).values({ name }).returning();
		await tx.insert(table.checklistItem).values(lines.map((text, sequence) => ({ templateId: t.id, sequence, text })));
		await audit.record(tx, { actorId, action: 'checklist.create', entity: 'checklist_template', entityId: t.id, after: { name, items: lines } });
		return t.id;
	});
}

/** Record an open inspection as done, with its results, findings and photos; schedule the next one. */
export async function record(scope: Scope, inspectionId: string, form: RecordInspectionForm): Promise<{ ok: true; nextId: string; nextDueOn: string } | Failure> {
	if (!can(scope, 'recordInspections')) return failure(403, 'Only a laser safety officer records inspections.');
	const found = await find(scope, inspectionId);
	if (!found.ok) return found;
	if (found.inspection.completedOn) return failure(409, 'This inspection is already recorded as done.');
	const [template] = await db.select().from(table.checklistTemplate).where(eq(table.checklistTemplate.id, form.templateId));
	if (!template) return fieldsNeedAttention({ templateId: 'Unknown checklist.' });
	// The schema refuses unanswered items already; this keeps them out of the table whatever the caller.
	const open = unansweredItems(form.results);
	if (open.length) return fieldsNeedAttention({ results: `Answer every item before recording the inspection. Not answered yet: ${open.join('; ')}.` });
	const results = form.results.map((r, sequence) => ({ inspectionId, sequence, itemText: r.itemText, outcome: r.outcome as CheckOutcome, notes: r.notes }));
	return db.transaction(async (tx) => {
		const [done] = await tx
			.update(table.inspection)
			.set({ completedOn: form.completedOn, completedBy: scope.userId, templateId: form.templateId, notes: form.notes, version: form.version + 1 })
			.where(and(eq(table.inspection.id, inspectionId), eq(table.inspection.version, form.version), isNull(table.inspection.completedOn)))
			.returning();
		if (!done) return changedMeanwhile('inspection');
		await tx.insert(table.inspectionResult).values(results);
		if (form.findings.length)
			await tx.insert(table.finding).values(form.findings.map((f) => ({ inspectionId, description: f.description, action: f.action, dueOn: f.dueOn || null, ownerId: found.area.responsibleId })));
		const nextDueOn = format(addMonths(parseISO(form.completedOn), found.area.inspectionIntervalMonths), 'yyyy-MM-dd');
		const [next] = await tx.insert(table.inspection).values({ areaId: found.area.id, inspectorId: found.inspection.inspectorId ?? found.area.inspectorId, dueOn: nextDueOn }).returning();
		await audit.record(tx, {
			actorId: scope.userId,
			action: 'inspection.record',
			entity: 'inspection',
			entityId: inspectionId,
			before: { completedOn: null },
			after: { completedOn: form.completedOn, failed: form.results.filter((r) => r.outcome === 'fail').length, findings: form.findings.length, nextDueOn }
		});
		return { ok: true, nextId: next.id, nextDueOn } as const;
	});
}

/** Close a finding of a recorded inspection: who, on which day, and what was done about it. */
export async function closeFinding(scope: Scope, inspectionId: string, form: CloseFindingForm): Promise<{ ok: true; description: string } | Failure> {
	if (!can(scope, 'recordInspections')) return failure(403, 'Only a laser safety officer closes findings.');
	const found = await find(scope, inspectionId);
	if (!found.ok) return found;
	const before = found.findings.find((f) => f.id === form.findingId);
	if (!before) return notFound('finding');
	if (before.closedOn) return failure(409, 'This finding is already closed.');
	return db.transaction(async (tx) => {
		const [after] = await tx
			.update(table.finding)
			.set({ closedOn: form.closedOn, closedBy: scope.userId, closureNote: form.closureNote, version: form.version + 1 })
			.where(and(eq(table.finding.id, form.findingId), eq(table.finding.version, form.version), isNull(table.finding.closedOn)))
			.returning();
		if (!after) return changedMeanwhile('finding');
		await audit.record(tx, {
			actorId: scope.userId,
			action: 'finding.close',
			entity: 'finding',
			entityId: after.id,
			before: { closedOn: null },
			after: { closedOn: form.closedOn, closureNote: form.closureNote, inspectionId }
		});
		return { ok: true, description: after.description } as const;
	});
}

/** Photos and documents of an inspection (officers), stored in PostgreSQL with their audit row. */
export async function attach(scope: Scope, inspectionId: string, files: StoredUpload[]): Promise<{ ok: true; count: number } | Failure> {
	if (!can(scope, 'recordInspections')) return failure(403, 'Only a laser safety officer adds photos to inspections.');
	const found = await find(scope, inspectionId);
	if (!found.ok) return found;
	if (files.length === 0) return fieldsNeedAttention({ photos: 'Choose a file to upload.' });
	await db.transaction(async (tx) => {
		const rows = await tx
			.insert(table.document)
			.values(files.map((f) => ({ ...f, entity: 'inspection', entityId: inspectionId, uploadedBy: scope.userId })))
			.returning({ id: table.document.id, fileName: table.document.fileName });
		await audit.record(tx, { actorId: scope.userId, action: 'inspection.attach', entity: 'inspection', entityId: inspectionId, after: rows });
	});
	return { ok: true, count: files.length };
}

/** A document, if the person may see the record it belongs to. */
export async function documentFor(scope: Scope, documentId: string) {
	if (!isUuid(documentId)) return null;
	const [doc] = await db.select().from(table.document).where(eq(table.document.id, documentId));
	if (!doc || doc.entity !== 'inspection') return null;
	return (await find(scope, doc.entityId)) ? doc : null;
}

export async function assign(scope: Scope, inspectionId: string, inspectorId: string, version: number): Promise<{ ok: true; areaName: string; inspectorName: string } | Failure> {
	if (!can(scope, 'assignInspectors')) return failure(403, 'Only facility managers and laser safety officers assign inspectors.');
	if (!isUuid(inspectionId)) return notFound('inspection');
	const [person] = await db.select().from(table.user).where(and(eq(table.user.id, inspectorId), eq(table.user.disabled, false)));
	if (!person || !can(person.role, 'recordInspections')) return fieldsNeedAttention({ inspectorId: 'Choose an active laser safety officer.' });
	return db.transaction(async (tx: Tx) => {
		const [before] = await tx.select().from(table.inspection).where(eq(table.inspection.id, inspectionId));
		if (!before) return notFound('inspection');
		const [after] = await tx
			.update(table.inspection)
			.set({ inspectorId, version: version + 1 })
			.where(and(eq(table.inspection.id, inspectionId), eq(table.inspection.version, version), isNull(table.inspection.completedOn)))
			.returning();
		if (!after) return changedMeanwhile('inspection');
		await audit.record(tx, { actorId: scope.userId, action: 'inspection.assign', entity: 'inspection', entityId: inspectionId, before: { inspectorId: before.inspectorId }, after: { inspectorId } });
		const [area] = await tx.select({ name: table.area.name }).from(table.area).where(eq(table.area.id, after.areaId));
		return { ok: true, areaName: area.name, inspectorName: person.name } as const;
	});
}

export async function officers() {
	return db.select({ id: table.user.id, name: table.user.name }).from(table.user).where(and(eq(table.user.role, 'officer'), eq(table.user.disabled, false))).orderBy(asc(table.user.name));
}

/** CSV of the schedule; every field quoted, formula-leading characters neutralised for spreadsheets. */
export function toCsv(rows: ScheduleRow[]): string {
	const head = ['area', 'lab', 'state', 'due on', 'inspector', 'responsible', 'interval (months)'];
	return writeCsv(
		head,
		rows.map((r) => [r.areaName, r.labCode, r.state.replace('_', ' '), r.dueOn, r.inspectorName, r.responsibleName, r.intervalMonths])
	);
}
