// From register rows to the hazard engine and back: the one place that builds engine input,
// so a preview, a save and a background re-evaluation compute exactly the same thing.
import { and, desc, eq, sql } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { assess, type AssessmentInput, type AssessmentOutcome, type ElementInput, type LimitInput, type LineInput, type PointInput } from '$lib/server/hazard';
import type { ElementSI, LineSI, PointSI } from '$lib/schemas/register';

type Executor = typeof db | Tx;

export type LimitRow = table.ExposureLimitVersion;

/** The current version of every limit in force today (not retired, within its validity dates). */
/**
 * The limit library's lock. Every snapshot transaction (a save, a re-evaluation) reads the library
 * under the shared lock; a change to the library (new limit, revision, withdrawal) takes it
 * exclusively before marking paths stale. So a snapshot is either taken wholly before a change
 * (and then marked stale by it) or wholly after it (with the new limits): never from the old
 * library while the change's stale flags pass it by.
 */
const LIMIT_LIBRARY_LOCK = 7_241_011;
export async function lockLimitLibrary(tx: Tx, mode: 'read' | 'change'): Promise<void> {
	await tx.execute(mode === 'read' ? sql`SELECT pg_advisory_xact_lock_shared(${LIMIT_LIBRARY_LOCK})` : sql`SELECT pg_advisory_xact_lock(${LIMIT_LIBRARY_LOCK})`);
}

export async function currentLimits(ex: Executor = db, at = new Date()): Promise<LimitRow[]> {
	const iso = at.toISOString();
	const rows = await ex
		.select({ v: table.exposureLimitVersion })
		.from(table.exposureLimit)
		.innerJoin(
			table.exposureLimitVersion,
			and(eq(table.exposureLimitVersion.limitId, table.exposureLimit.id), eq(table.exposureLimitVersion.version, table.exposureLimit.currentVersion))
		)
		.where(
			and(
				eq(table.exposureLimit.retired, false),
				sql`(${table.exposureLimitVersion.validFrom} IS NULL OR ${table.exposureLimitVersion.validFrom} <= ${iso}::timestamptz)`,
				// Valid until a day means through that whole (UTC) day.
				sql`(${table.exposureLimitVersion.validUntil} IS NULL OR ${table.exposureLimitVersion.validUntil} + interval '1 day' > ${iso}::timestamptz)`
			)
		);
	return rows.map((r) => r.v);
}

export function limitInput(l: LimitRow): LimitInput {
	return {
		id: l.limitId,
		version: String(l.version),
		label: l.label,
		tissue: l.tissue,
		wavelengthMin: l.wavelengthMin,
		wavelengthMax: l.wavelengthMax,
		durationMin: l.durationMin,
		durationMax: l.durationMax,
		quantity: l.quantity,
		k: l.k,
		n: l.n,
		limitingAperture: l.limitingAperture,
		pulseBasis: l.pulseBasis,
		pulseTrainExponent: l.pulseTrainExponent,
		citation: l.citation
	};
}

type LineLike = Pick<LineSI, 'mode' | 'wavelength' | 'power' | 'pulseEnergy' | 'pulseDuration' | 'repetitionRate' | 'beamDiameter' | 'beamDiameterDefinition' | 'divergence' | 'divergenceDefinition' | 'beamQuality'>;

export function lineInput(l: LineLike): LineInput {
	return {
		mode: l.mode,
		wavelength: l.wavelength ?? '',
		power: l.power,
		pulseEnergy: l.pulseEnergy,
		pulseDuration: l.pulseDuration,
		repetitionRate: l.repetitionRate,
		beamDiameter: l.beamDiameter ?? '',
		beamDiameterDefinition: l.beamDiameterDefinition,
		divergence: l.divergence ?? '',
		divergenceDefinition: l.divergenceDefinition,
		beamQuality: l.beamQuality
	};
}

export function elementInput(e: ElementSI): ElementInput {
	const label = e.label || null;
	switch (e.kind) {
		case 'propagate':
		case 'enclosure':
			return { kind: e.kind, length: e.length ?? '', label };
		case 'transmission':
			return { kind: 'transmission', transmission: e.transmission ?? '', label };
		case 'mirror':
			return { kind: 'mirror', reflectance: e.reflectance ?? null, label };
		case 'expander':
			return { kind: 'expander', magnification: e.magnification ?? '', label };
		case 'lens':
			return { kind: 'lens', focalLength: e.focalLength ?? '', label };
		case 'fibre':
			return { kind: 'fibre', coreDiameter: e.coreDiameter ?? '', numericalAperture: e.numericalAperture ?? '', couplingTransmission: e.couplingTransmission ?? null, label };
	}
}

export function pointInput(p: PointSI): PointInput {
	return {
		id: p.key,
		label: p.label,
		position: p.position ?? '',
		tissue: p.tissue,
		exposureDuration: p.exposureDuration,
		kind: p.kind,
		reflectance: p.reflectance,
		viewingAngle: p.viewingAngle,
		viewingDistance: p.viewingDistance
	};
}

export type PathSnapshotInput = { line: LineLike; elements: ElementSI[]; points: PointSI[]; nohdExposureDuration: string | null };

export function engineInput(path: PathSnapshotInput, limits: LimitRow[]): AssessmentInput {
	return {
		line: lineInput(path.line),
		elements: path.elements.map(elementInput),
		points: path.points.map(pointInput),
		limits: limits.map(limitInput),
		nohd: { exposureDuration: path.nohdExposureDuration }
	};
}

export function evaluate(path: PathSnapshotInput, limits: LimitRow[]): { input: AssessmentInput; outcome: AssessmentOutcome } {
	const input = engineInput(path, limits);
	return { input, outcome: assess(input) };
}

/** Anything that is not shown to be within limit needs the officer's eyes. */
export function needsReview(verdict: table.Assessment['verdict']): boolean {
	return verdict !== 'within_limit';
}

export async function latestFor(pathId: string, ex: Executor = db) {
	const [row] = await ex.select().from(table.assessment).where(eq(table.assessment.pathId, pathId)).orderBy(desc(table.assessment.createdAt)).limit(1);
	return row ?? null;
}
