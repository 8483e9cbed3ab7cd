// Assessments: the one evaluation of a path against limit rows (so a preview, a save and a
// background re-evaluation compute exactly the same thing), and the stored snapshots.
import { desc, eq } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { evaluate, type EvaluateOptions, type InputError, type Outcome } from '$lib/server/hazard';
import type { LimitRow } from '$lib/server/limits';
import { limitFromRow, type BeamPath, type LimitSI } from '$lib/schemas/assessment';

type Executor = typeof db | Tx;


/** What a snapshot stores as its inputs: the path and the limits, in the one SI shape. */
export type SnapshotInputs = { path: BeamPath; limits: LimitSI[] };

/** The one evaluation of a path against limit rows: preview, save and re-evaluation all come here. */
export function evaluatePath(path: BeamPath, limitRows: LimitRow[], options: EvaluateOptions = {}): { inputs: SnapshotInputs; outcome: Outcome } {
	const inputs = { path, limits: limitRows.map(limitFromRow) };
	return { inputs, outcome: evaluate(inputs.path, inputs.limits, options) };
}

/** The engine's refusals of its input by field path (`(body)`: the path as a whole), as the API and the forms name fields. */
export function errorsByField(errors: InputError[]): Record<string, string[]> {
	const fields: Record<string, string[]> = {};
	for (const e of errors) (fields[e.field || '(body)'] ??= []).push(e.reason);
	return fields;
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
