// Limit rows to the hazard engine: the one place that evaluates a path against the library, so a
// preview, a save and a background re-evaluation compute exactly the same thing.
import { and, desc, eq, sql } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { evaluate, type EvaluateOptions, type Outcome } from '$lib/server/hazard';
import { limitFromRow, type BeamPath, type LimitSI } from '$lib/schemas/assessment';

type Executor = typeof db | Tx;

export type LimitRow = table.ExposureLimitVersion;

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

/** The current version of every limit in force today (not retired, within its validity dates). */
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

/** What a snapshot stores as its inputs: the path and the limits, in the one SI shape. */
export type SnapshotInputs = { path: BeamPath; limits: LimitSI[] };

/** The one evaluation of a path against limit rows: preview, save and re-evaluation all come here. */
export function evaluatePath(path: BeamPath, limitRows: LimitRow[], options: EvaluateOptions = {}): { inputs: SnapshotInputs; outcome: Outcome } {
	const inputs = { path, limits: limitRows.map(limitFromRow) };
	return { inputs, outcome: evaluate(inputs.path, inputs.limits, options) };
}

/** Anything that is not shown to be within limit needs the officer's eyes. */
export function needsReview(verdict: table.Assessment['verdict']): boolean {
	return verdict !== 'within_limit';
}

export async function latestFor(pathId: string, ex: Executor = db) {
	const [row] = await ex.select().from(table.assessment).where(eq(table.assessment.pathId, pathId)).orderBy(desc(table.assessment.createdAt)).limit(1);
	return row ?? null;
}

/** One stored snapshot's inputs and result, or null. */
export async function snapshot(assessmentId: string, ex: Executor = db) {
	const [row] = await ex.select({ inputs: table.assessment.inputs, result: table.assessment.result }).from(table.assessment).where(eq(table.assessment.id, assessmentId));
	return row ?? null;
}
