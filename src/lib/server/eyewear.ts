// The eyewear store: items with their optical density per wavelength band, and whether a lab
// holds eyewear that meets the controls of its cleared beam paths.
import { and, asc, eq, inArray, ne, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { canEdit, type Scope, inReadableLabs } from '$lib/server/auth/scope';
import { cannotChange, changedMeanwhile, fieldsNeedAttention, notFound, type Failure } from '$lib/server/http/failure';
import { isUuid } from '$lib/server/db/ids';
import { adequacy, type AdequacyResult, type BandOnRecord, type Requirement } from '$lib/server/eyewearAdequacy';
import type { EyewearForm } from '$lib/schemas/eyewear';
import { formatQuantity, parseQuantity } from '$lib/units';
import { can } from '$lib/abilities';

const si = (t: string) => {
	const p = parseQuantity(t, 'wavelength');
	if (!p.ok) throw new Error('eyewear band on an unchecked form');
	return p.value.toString();
};

export async function list(scope: Scope) {
	const items = await db
		.select({ item: table.eyewear, labCode: table.lab.code })
		.from(table.eyewear)
		.innerJoin(table.lab, eq(table.lab.id, table.eyewear.labId))
		.where(inReadableLabs(scope, table.eyewear.labId))
		.orderBy(asc(table.lab.code), asc(table.eyewear.label));
	const ids = items.map((i) => i.item.id);
	const bands = ids.length ? await db.select().from(table.eyewearBand).where(inArray(table.eyewearBand.eyewearId, ids)).orderBy(asc(table.eyewearBand.wavelengthMin)) : [];
	return items.map((i) => ({ ...i.item, labCode: i.labCode, bands: bands.filter((b) => b.eyewearId === i.item.id) }));
}

export async function find(scope: Scope, eyewearId: string) {
	const found = isUuid(eyewearId) ? (await list(scope)).find((e) => e.id === eyewearId) : undefined;
	return found ? { ok: true as const, eyewear: found } : notFound('eyewear');
}

export async function save(scope: Scope, eyewearId: string | null, form: EyewearForm): Promise<{ ok: true; id: string } | Failure> {
	if (!can(scope, 'manageEyewear') || !canEdit(scope, form.labId)) return cannotChange('eyewear');
	const values = {
		labId: form.labId,
		label: form.label,
		location: form.location,
		frame: form.frame,
		condition: form.condition,
		lastCheckedAt: form.lastCheckedAt ? new Date(form.lastCheckedAt + 'T00:00:00Z') : null
	};
	const bands = form.bands.map((b) => ({ wavelengthMin: si(b.wavelengthMin), wavelengthMax: si(b.wavelengthMax), od: b.od }));
	return db.transaction(async (tx) => {
		const [labRow] = await tx.select({ id: table.lab.id }).from(table.lab).where(eq(table.lab.id, form.labId));
		if (!labRow) return fieldsNeedAttention({ labId: 'Unknown lab.' });
		let id: string;
		let before: unknown = null;
		if (eyewearId === null) {
			const [created] = await tx.insert(table.eyewear).values(values).returning();
			id = created.id;
		} else {
			if (!isUuid(eyewearId)) return notFound('eyewear');
			const [old] = await tx.select().from(table.eyewear).where(eq(table.eyewear.id, eyewearId));
			if (!old) return notFound('eyewear');
			before = { ...old, bands: await tx.select().from(table.eyewearBand).where(eq(table.eyewearBand.eyewearId, eyewearId)) };
			const [updated] = await tx
				.update(table.eyewear)
				.set({ ...values, version: form.version + 1 })
				.where(and(eq(table.eyewear.id, eyewearId), eq(table.eyewear.version, form.version)))
				.returning();
			if (!updated) return changedMeanwhile('eyewear');
			id = eyewearId;
			await tx.delete(table.eyewearBand).where(eq(table.eyewearBand.eyewearId, id));
		}
		await tx.insert(table.eyewearBand).values(bands.map((b) => ({ eyewearId: id, ...b })));
		await audit.record(tx, { actorId: scope.userId, action: eyewearId ? 'eyewear.update' : 'eyewear.create', entity: 'eyewear', entityId: id, before, after: { ...values, bands } });
		return { ok: true, id } as const;
	});
}

/** Bands of a lab's usable eyewear (not retired, not damaged). */
async function usableBands(labIds: string[]): Promise<Map<string, BandOnRecord[]>> {
	const byLab = new Map<string, BandOnRecord[]>();
	if (labIds.length === 0) return byLab;
	const rows = await db
		.select({ labId: table.eyewear.labId, eyewearId: table.eyewear.id, label: table.eyewear.label, location: table.eyewear.location, wavelengthMin: table.eyewearBand.wavelengthMin, wavelengthMax: table.eyewearBand.wavelengthMax, od: table.eyewearBand.od })
		.from(table.eyewearBand)
		.innerJoin(table.eyewear, eq(table.eyewear.id, table.eyewearBand.eyewearId))
		.where(and(inArray(table.eyewear.labId, labIds), eq(table.eyewear.retired, false), ne(table.eyewear.condition, 'damaged')));
	for (const r of rows) byLab.set(r.labId, [...(byLab.get(r.labId) ?? []), r]);
	return byLab;
}

/** A cleared path's eyewear: what its clearance requires (each eyewear control, and each line at the OD its cleared assessment asks for) and whether the lab's store covers it with one pair. */
export type EyewearCheck = { requirements: Requirement[]; result: AdequacyResult };

/** For each cleared path (by id): the eyewear controls of its latest clearance against its lab's eyewear. */
export async function checksForPaths(pathIds: string[]): Promise<Map<string, EyewearCheck>> {
	const out = new Map<string, EyewearCheck>();
	if (pathIds.length === 0) return out;
	const rows = await db
		.select({
			pathId: table.beamPath.id,
			labId: table.laser.labId,
			control: table.requiredControl,
			// What the cleared assessment asks per line: a clearance from before controls were checked against it may ask less.
			assessed: sql<{ wavelengthMin: number; wavelengthMax: number; od: { roundedUpWhole: number } }[] | null>`(SELECT a.result->'requiredOpticalDensities' FROM assessment a WHERE a.id = ${table.reviewDecision.assessmentId})`
		})
		.from(table.beamPath)
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.innerJoin(
			table.reviewDecision,
			sql`${table.reviewDecision.id} = (SELECT d.id FROM review_decision d WHERE d.path_id = ${table.beamPath.id} ORDER BY d.decided_at DESC LIMIT 1)`
		)
		.innerJoin(table.requiredControl, and(eq(table.requiredControl.decisionId, table.reviewDecision.id), eq(table.requiredControl.kind, 'eyewear')))
		.where(and(inArray(table.beamPath.id, pathIds), eq(table.reviewDecision.decision, 'cleared')));
	const bands = await usableBands([...new Set(rows.map((r) => r.labId))]);
	const needs = new Map<string, { labId: string; requirements: Requirement[] }>();
	for (const r of rows) {
		const c = r.control;
		if (c.wavelength === null || c.minOd === null) continue;
		const max = c.wavelengthMax ?? c.wavelength;
		const label = `OD ${Number(c.minOd)} at ${formatQuantity(c.wavelength, 'wavelength')}${c.wavelengthMax ? `–${formatQuantity(c.wavelengthMax, 'wavelength')}` : ''}`;
		const entry = needs.get(r.pathId) ?? { labId: r.labId, requirements: [] };
		entry.requirements.push({ wavelengthMin: c.wavelength, wavelengthMax: max, od: c.minOd, label });
		needs.set(r.pathId, entry);
	}
	const assessedAdded = new Set<string>();
	for (const r of rows) {
		if (assessedAdded.has(r.pathId) || !needs.has(r.pathId) || !Array.isArray(r.assessed)) continue;
		assessedAdded.add(r.pathId);
		for (const o of r.assessed) {
			if (!(o.od?.roundedUpWhole > 0)) continue;
			const label = `OD ${o.od.roundedUpWhole} at ${formatQuantity(o.wavelengthMin, 'wavelength')}${o.wavelengthMax > o.wavelengthMin ? `–${formatQuantity(o.wavelengthMax, 'wavelength')}` : ''} (assessed)`;
			needs.get(r.pathId)!.requirements.push({ wavelengthMin: String(o.wavelengthMin), wavelengthMax: String(o.wavelengthMax), od: String(o.od.roundedUpWhole), label });
		}
	}
	for (const [pathId, { labId, requirements }] of needs) out.set(pathId, { requirements, result: adequacy(bands.get(labId) ?? [], requirements) });
	return out;
}

/** Withdraw an item from use (lost, discarded): it stays on record and never counts again. */
/** Cleared paths in scope, each with whether its lab's eyewear meets its eyewear controls. */
export async function clearedPathChecks(scope: Scope) {
	const cleared = await db
		.select({ id: table.beamPath.id, name: table.beamPath.name, labCode: table.lab.code })
		.from(table.beamPath)
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
		.where(
			and(
				eq(table.beamPath.reviewState, 'cleared'),
				eq(table.beamPath.retired, false),
				inReadableLabs(scope, table.laser.labId)
			)
		);
	const checks = await checksForPaths(cleared.map((c) => c.id));
	return cleared.map((c) => ({ ...c, check: checks.get(c.id) ?? null }));
}

export async function retire(scope: Scope, eyewearId: string, version: number): Promise<{ ok: true } | Failure> {
	if (!isUuid(eyewearId)) return notFound('eyewear');
	return db.transaction(async (tx) => {
		const [old] = await tx.select().from(table.eyewear).where(eq(table.eyewear.id, eyewearId)).for('update');
		if (!old) return notFound('eyewear');
		if (!can(scope, 'manageEyewear') || !canEdit(scope, old.labId)) return cannotChange('eyewear');
		if (old.version !== version || old.retired) return changedMeanwhile('eyewear');
		const [after] = await tx.update(table.eyewear).set({ retired: true, version: version + 1 }).where(eq(table.eyewear.id, eyewearId)).returning();
		await audit.record(tx, { actorId: scope.userId, action: 'eyewear.retire', entity: 'eyewear', entityId: eyewearId, before: old, after });
		return { ok: true } as const;
	});
}
