// The medical follow-up of an incident (examination requested, done, outcome in one line). Officers
// only: no other role reaches it through any page, API or export, and every read is audited.
import { and, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import type { Scope } from '$lib/server/auth/scope';
import { changedMeanwhile, failure, notFound, type Failure } from '$lib/server/http/failure';
import { isUuid } from '$lib/server/db/ids';
import type { MedicalForm } from '$lib/schemas/incidents';
import { can } from '$lib/abilities';

export type MedicalRecord = { examinationRequestedOn: string | null; examinationDoneOn: string | null; outcome: string; version: number; updatedAt: string | null; updatedByName: string | null };

const empty: MedicalRecord = { examinationRequestedOn: null, examinationDoneOn: null, outcome: '', version: 0, updatedAt: null, updatedByName: null };

async function sentIncident(incidentId: string) {
	if (!isUuid(incidentId)) return null;
	const [row] = await db.select({ id: table.incident.id, number: table.incident.number, state: table.incident.state }).from(table.incident).where(eq(table.incident.id, incidentId));
	return row && row.state !== 'draft' ? row : null;
}

export async function read(scope: Scope, incidentId: string, via: 'page' | 'api'): Promise<({ ok: true; number: number } & MedicalRecord) | Failure> {
	if (!can(scope, 'investigateIncidents')) return failure(403, 'The medical follow-up is for laser safety officers only.');
	const incident = await sentIncident(incidentId);
	if (!incident) return notFound('incident');
	const [row] = await db
		.select({ m: table.incidentMedical, by: table.user.name })
		.from(table.incidentMedical)
		.innerJoin(table.user, eq(table.user.id, table.incidentMedical.updatedBy))
		.where(eq(table.incidentMedical.incidentId, incidentId));
	await db.transaction((tx) => audit.record(tx, { actorId: scope.userId, action: 'incident.view_medical', entity: 'incident', entityId: incidentId, after: { via } }));
	const record = row
		? { examinationRequestedOn: row.m.examinationRequestedOn, examinationDoneOn: row.m.examinationDoneOn, outcome: row.m.outcome, version: row.m.version, updatedAt: row.m.updatedAt.toISOString(), updatedByName: row.by }
		: empty;
	return { ok: true, number: incident.number, ...record };
}

/** Create (version 0) or change (its version) the follow-up; a stale version is a 409. */
export async function save(scope: Scope, incidentId: string, f: MedicalForm): Promise<{ ok: true } | Failure> {
	if (!can(scope, 'investigateIncidents')) return failure(403, 'The medical follow-up is for laser safety officers only.');
	const incident = await sentIncident(incidentId);
	if (!incident) return notFound('incident');
	const values = { examinationRequestedOn: f.examinationRequestedOn || null, examinationDoneOn: f.examinationDoneOn || null, outcome: f.outcome, updatedBy: scope.userId, updatedAt: new Date() };
	return db.transaction(async (tx) => {
		const m = table.incidentMedical;
		const [before] = await tx.select().from(m).where(eq(m.incidentId, incidentId)).for('update');
		if ((before?.version ?? 0) !== f.version) return changedMeanwhile('medical follow-up');
		if (before) await tx.update(m).set({ ...values, version: before.version + 1 }).where(and(eq(m.incidentId, incidentId), eq(m.version, f.version)));
		else {
			const inserted = await tx.insert(m).values({ incidentId, ...values }).onConflictDoNothing().returning();
			if (inserted.length === 0) return changedMeanwhile('medical follow-up');
		}
		await audit.record(tx, { actorId: scope.userId, action: 'incident.medical_update', entity: 'incident', entityId: incidentId, before: before ?? null, after: values });
		return { ok: true as const };
	});
}
