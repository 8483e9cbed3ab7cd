// The posting for the door of a laser controlled area: the highest class inside, every wavelength
// with the eyewear optical density it needs (from the latest snapshot of each path carrying it), the
// people authorised, the officers to call. A line without a usable assessment is said so plainly:
// it is never posted as needing no eyewear.
import { and, desc, eq, inArray } from 'drizzle-orm';
import { isCurrentResult } from '$lib/assessmentResult';
import { laserClasses } from '$lib/enums';
import type { Scope } from '$lib/server/auth/scope';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as areas from '$lib/server/areas';
import * as authorisations from '$lib/server/authorisations';
import type { Failure } from '$lib/server/http/failure';
import type { SnapshotInputs } from '$lib/server/assessments';

/** What the door says about one wavelength (a line, or a tunable line's range). */
export type WavelengthNeed = {
	lineId: string;
	laserLabel: string;
	wavelength: string;
	wavelengthMax: string | null;
	/** Whole OD to post (the largest over the paths), null when no assessment gives one. */
	od: number | null;
	/** 'assessed': every path carrying it has a usable snapshot; 'partly': some do not; 'not_assessed': none does. */
	state: 'assessed' | 'partly' | 'not_assessed';
	note: string;
};

export type Snapshot = { pathId: string; inputs: unknown; result: unknown; stale: boolean };

/** The needs of each line, from the latest snapshot of every path of the area (pure). */
export function needsOf(lines: { id: string; laserLabel: string; wavelength: string; wavelengthMax: string | null }[], pathLines: { pathId: string; lineId: string }[], snapshots: Snapshot[]): WavelengthNeed[] {
	return lines.map((line) => {
		const pathIds = pathLines.filter((pl) => pl.lineId === line.id).map((pl) => pl.pathId);
		const ods: number[] = [];
		let unknown = 0;
		for (const pathId of pathIds) {
			const snap = snapshots.find((s) => s.pathId === pathId);
			const od = snap ? odForLine(snap, line.id) : null;
			if (od === null) unknown++;
			else ods.push(od);
		}
		const base = { lineId: line.id, laserLabel: line.laserLabel, wavelength: line.wavelength, wavelengthMax: line.wavelengthMax };
		if (pathIds.length === 0) return { ...base, od: null, state: 'not_assessed', note: 'No beam path of this line is assessed: eyewear not determined. Ask the laser safety officer before working here.' };
		if (ods.length === 0) return { ...base, od: null, state: 'not_assessed', note: 'The assessment is incomplete or has no applicable limit: eyewear not determined. Ask the laser safety officer.' };
		const od = Math.max(...ods);
		if (unknown > 0) return { ...base, od, state: 'partly', note: `At least OD ${od}: ${unknown} of ${pathIds.length} paths of this line are not fully assessed. Ask the laser safety officer.` };
		return { ...base, od, state: 'assessed', note: od === 0 ? 'Below the limit at every assessed point.' : '' };
	});
}

/** The whole OD a snapshot asks at a line, or null when it cannot say (incomplete, no limit, out of date, older engine). */
function odForLine(snap: Snapshot, lineId: string): number | null {
	if (snap.stale || !isCurrentResult(snap.result)) return null;
	const r = snap.result;
	if (r.verdict === 'incomplete' || r.verdict === 'no_applicable_limit') return null;
	const inputs = snap.inputs as SnapshotInputs;
	const index = inputs?.path?.lines?.findIndex((l) => l.id === lineId) ?? -1;
	if (index < 0) return null;
	const need = r.requiredOpticalDensities.find((x) => x.line === index);
	return need ? need.od.roundedUpWhole : r.verdict === 'within_limit' ? 0 : null;
}

export async function find(scope: Scope, areaId: string, today: string) {
	const found = await areas.find(scope, areaId);
	if (!found.ok) return found as Failure;
	const laserIds = found.lasers.map((l) => l.id);
	const labelOf = new Map(found.lasers.map((l) => [l.id, `${l.maker} ${l.model}`]));
	const [lines, pathLines, people, officers] = await Promise.all([
		laserIds.length
			? db.select().from(table.emissionLine).where(inArray(table.emissionLine.laserId, laserIds)).orderBy(table.emissionLine.wavelength)
			: Promise.resolve([] as table.EmissionLine[]),
		laserIds.length
			? db
					.select({ pathId: table.pathLine.pathId, lineId: table.pathLine.lineId })
					.from(table.pathLine)
					.innerJoin(table.beamPath, eq(table.beamPath.id, table.pathLine.pathId))
					.where(and(inArray(table.beamPath.laserId, laserIds), eq(table.beamPath.retired, false)))
			: Promise.resolve([]),
		authorisations.inForceForArea(areaId, today),
		db.select({ name: table.user.name, email: table.user.email }).from(table.user).where(and(eq(table.user.role, 'officer'), eq(table.user.disabled, false))).orderBy(table.user.name)
	]);
	const pathIds = [...new Set(pathLines.map((p) => p.pathId))];
	const snapshots = pathIds.length
		? await db
				.selectDistinctOn([table.assessment.pathId], { pathId: table.assessment.pathId, inputs: table.assessment.inputs, result: table.assessment.result, stale: table.assessment.stale })
				.from(table.assessment)
				.where(inArray(table.assessment.pathId, pathIds))
				.orderBy(table.assessment.pathId, desc(table.assessment.createdAt))
		: [];
	const highest = found.lasers.map((l) => l.laserClass).sort((a, b) => laserClasses.indexOf(b) - laserClasses.indexOf(a))[0] ?? null;
	return {
		ok: true as const,
		area: found.area,
		labName: found.labName,
		responsibleName: found.responsibleName,
		highestClass: highest,
		lasers: found.lasers.map((l) => ({ id: l.id, label: `${l.maker} ${l.model}`, laserClass: l.laserClass })),
		needs: needsOf(
			lines.map((l) => ({ id: l.id, laserLabel: labelOf.get(l.laserId) ?? '', wavelength: l.wavelength, wavelengthMax: l.wavelengthMax })),
			pathLines,
			snapshots
		),
		people: people.map((p) => ({ id: p.id, name: p.personName, forWhat: p.areaId ? 'the whole area' : p.targetLabel })).sort((a, b) => a.name.localeCompare(b.name)),
		officers
	};
}
