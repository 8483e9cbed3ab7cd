// Laser controlled areas as a page of their own: where they are, who answers for them, the lasers
// standing in them, and the visits recorded there.
import { aliasedTable, and, asc, desc, eq, gte, lt } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { canEdit, canRead, type Scope } from '$lib/server/auth/scope';
import { fieldsNeedAttention, notFound, notYours, type Failure } from '$lib/server/http/failure';
import { isUuid } from '$lib/server/db/ids';
import type { VisitForm } from '$lib/schemas/authorisations';

const responsible = aliasedTable(table.user, 'responsible');

export async function find(scope: Scope, areaId: string) {
	if (!isUuid(areaId)) return notFound('area');
	const [row] = await db
		.select({ area: table.area, labCode: table.lab.code, labName: table.lab.name, responsibleName: responsible.name })
		.from(table.area)
		.innerJoin(table.lab, eq(table.lab.id, table.area.labId))
		.leftJoin(responsible, eq(responsible.id, table.area.responsibleId))
		.where(eq(table.area.id, areaId));
	if (!row || !canRead(scope, row.area.labId)) return notFound('area');
	const lasers = await db
		.select({ id: table.laser.id, maker: table.laser.maker, model: table.laser.model, laserClass: table.laser.laserClass, status: table.laser.status })
		.from(table.laser)
		.where(eq(table.laser.areaId, areaId))
		.orderBy(asc(table.laser.maker), asc(table.laser.model));
	return { ok: true as const, ...row, lasers: lasers.filter((l) => l.status !== 'retired'), editable: canEdit(scope, row.area.labId) };
}

/** Visits that end today or later, then the most recent past ones. */
export async function visits(areaId: string, today: string) {
	const v = table.visit;
	const recorder = aliasedTable(table.user, 'recorder');
	const cols = { visit: v, recordedByName: recorder.name };
	const [coming, past] = await Promise.all([
		db.select(cols).from(v).innerJoin(recorder, eq(recorder.id, v.recordedBy)).where(and(eq(v.areaId, areaId), gte(v.endsOn, today))).orderBy(asc(v.startsOn)).limit(100),
		db.select(cols).from(v).innerJoin(recorder, eq(recorder.id, v.recordedBy)).where(and(eq(v.areaId, areaId), lt(v.endsOn, today))).orderBy(desc(v.endsOn)).limit(20)
	]);
	return { coming: coming.map((r) => ({ ...r.visit, recordedByName: r.recordedByName })), past: past.map((r) => ({ ...r.visit, recordedByName: r.recordedByName })) };
}

/** A visitor or contractor for given days, with the escort's name and the briefing given. */
export async function recordVisit(scope: Scope, areaId: string, form: VisitForm): Promise<{ ok: true; id: string } | Failure> {
	if (!isUuid(areaId)) return notFound('area');
	return db.transaction(async (tx) => {
		const [area] = await tx.select().from(table.area).where(eq(table.area.id, areaId));
		if (!area || !canRead(scope, area.labId)) return notFound('area');
		if (!canEdit(scope, area.labId)) return notYours('area');
		if (form.visitorName.toLowerCase() === form.escortName.toLowerCase()) return fieldsNeedAttention({ escortName: 'The escort is an authorised person of the lab, not the visitor.' });
		const [row] = await tx
			.insert(table.visit)
			.values({ ...form, endsOn: form.endsOn || form.startsOn, labId: area.labId, areaId, recordedBy: scope.userId })
			.returning();
		await audit.record(tx, { actorId: scope.userId, action: 'visit.record', entity: 'visit', entityId: row.id, after: row });
		return { ok: true as const, id: row.id };
	});
}
