// Beam paths: their ordered elements and points of concern, saved together with an assessment
// snapshot in one transaction, so a path is never stored without the result it had when saved.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { canEdit, canRead, type Scope } from '$lib/server/auth/scope';
import { cannotChange, changedMeanwhile, failure, fieldsNeedAttention, notFound, notYours, type Failure } from '$lib/server/http/failure';
import { errorsByField, evaluatePath, latestFor, needsReview } from '$lib/server/assessments';
import { currentLimits, lockLimitLibrary } from '$lib/server/limits';
import { isUuid } from '$lib/server/db/ids';
import * as reviews from '$lib/server/reviews';
import { ENGINE_VERSION, type AssessmentResult, type InputError } from '$lib/server/hazard';
import { beamPathFromRows, beamPathSchema, lineFromRow, type BeamPath } from '$lib/schemas/assessment';
import { pathToSI, type PathForm } from '$lib/schemas/register';
import { diffInputs } from '$lib/server/snapshotDiff';
import { draftGaps } from '$lib/assessmentResult';

async function loadPath(pathId: string, ex: typeof db | Tx = db) {
	const [row] = await ex
		.select({ path: table.beamPath, laser: table.laser, lab: { id: table.lab.id, code: table.lab.code, name: table.lab.name } })
		.from(table.beamPath)
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
		.where(eq(table.beamPath.id, pathId));
	if (!row) return null;
	const [lines, elements, points, latest] = await Promise.all([
		linesOf(pathId, ex),
		ex.select().from(table.pathElement).where(eq(table.pathElement.pathId, pathId)).orderBy(asc(table.pathElement.sequence)),
		ex.select().from(table.pointOfConcern).where(eq(table.pointOfConcern.pathId, pathId)).orderBy(asc(table.pointOfConcern.sequence)),
		latestFor(pathId, ex)
	]);
	return { ...row, lines, elements, points, latest };
}

/** The emission lines a path carries, in their order. */
async function linesOf(pathId: string, ex: typeof db | Tx = db) {
	const rows = await ex
		.select({ line: table.emissionLine })
		.from(table.pathLine)
		.innerJoin(table.emissionLine, eq(table.emissionLine.id, table.pathLine.lineId))
		.where(eq(table.pathLine.pathId, pathId))
		.orderBy(asc(table.pathLine.sequence));
	return rows.map((r) => r.line);
}

/**
 * The lines a save may give a path: lines of its laser, emitted together (one group, or one line on
 * its own); a subset of a group needs a reason. Read under a share lock (see save).
 */
async function chosenLines(tx: Tx, laserId: string, form: PathForm): Promise<{ ok: true; lines: table.EmissionLine[] } | Failure> {
	const ids = [...new Set(form.lineIds)];
	const lines = await tx
		.select()
		.from(table.emissionLine)
		.where(and(inArray(table.emissionLine.id, ids), eq(table.emissionLine.laserId, laserId)))
		.orderBy(asc(table.emissionLine.createdAt), asc(table.emissionLine.id))
		.for('share');
	if (lines.length !== ids.length) return fieldsNeedAttention({ lineIds: 'Choose emission lines of this laser.' });
	const group = lines[0].emissionGroup;
	if (lines.length > 1 && (group === '' || lines.some((l) => l.emissionGroup !== group)))
		return fieldsNeedAttention({ lineIds: 'A path carries lines that are emitted together (one group of the laser), or one line: describe lines emitted at other times as paths of their own.' });
	if (group !== '') {
		const [{ count }] = await tx.select({ count: sql<number>`count(*)::int` }).from(table.emissionLine).where(and(eq(table.emissionLine.laserId, laserId), eq(table.emissionLine.emissionGroup, group)));
		if (count > lines.length && form.lineChoiceReason.trim() === '')
			return fieldsNeedAttention({ lineChoiceReason: `The group “${group}” emits ${count} lines together: say why this path carries only ${lines.length} (a filter, a separator before it).` });
	}
	return { ok: true, lines };
}

export type PathDetail = NonNullable<Awaited<ReturnType<typeof loadPath>>>;

export async function find(scope: Scope, pathId: string): Promise<{ ok: true; detail: PathDetail; editable: boolean } | Failure> {
	if (!isUuid(pathId)) return notFound('beam path');
	const detail = await loadPath(pathId);
	if (!detail) return notFound('beam path');
	if (!canRead(scope, detail.laser.labId)) return notYours('beam path');
	return { ok: true, detail, editable: canEdit(scope, detail.laser.labId) && detail.laser.status !== 'retired' };
}

/** A stored path in the one SI shape. */
export function beamPathOf(detail: Pick<PathDetail, 'lines' | 'elements' | 'points' | 'path'>): BeamPath {
	return beamPathFromRows({ path: detail.path, lines: detail.lines, elements: detail.elements, points: detail.points });
}

/** Engine errors as form fields: line problems go into the message (they are fixed on the laser's page). */
function engineFailure(errors: InputError[]): Failure {
	const byField = Object.entries(errorsByField(errors));
	const onLine = ([field]: [string, string[]]) => field === '(body)' || field.startsWith('lines');
	const lineProblems = byField.filter(onLine).flatMap(([, reasons]) => reasons);
	const fields = Object.fromEntries(byField.filter((f) => !onLine(f)));
	const message = lineProblems.length ? `The emission line cannot be assessed: ${lineProblems.join(' ')} Correct it on the laser’s page.` : 'The assessment cannot be computed from these values.';
	return failure(400, message, Object.keys(fields).length ? fields : undefined);
}

export type SaveOutcome = { ok: true; id: string; verdict: AssessmentResult['verdict']; version: number } | Failure;

/** Create (pathId null, version 0) or replace a path, and snapshot its assessment in the same transaction. */
export async function save(scope: Scope, laserId: string, pathId: string | null, form: PathForm): Promise<SaveOutcome> {
	if (!isUuid(laserId)) return notFound('laser');
	const [laserRow] = await db.select().from(table.laser).where(eq(table.laser.id, laserId));
	if (!laserRow) return notFound('laser');
	if (!canRead(scope, laserRow.labId)) return notYours('laser');
	if (!canEdit(scope, laserRow.labId)) return cannotChange('laser');
	if (laserRow.status === 'retired') return failure(403, 'This laser is retired: its beam paths are kept for the record and can no longer be changed.');
	const si = pathToSI(form);
	if (!si.ok) return fieldsNeedAttention(si.errors);
	if (pathId !== null && !isUuid(pathId)) return notFound('beam path');

	return db.transaction(async (tx) => {
		// The limit library first (shared; see lockLimitLibrary), then the line and the path in the
		// order a line edit takes them (line, then its paths): the same order everywhere, no deadlock.
		await lockLimitLibrary(tx, 'read');
		// The line is read under a share lock, so an edit of it cannot commit between this read and the
		// snapshot (which would leave the path looking current); the path row is locked before its
		// review state is read, so a decision committed meanwhile is seen, never overwritten.
		const chosen = await chosenLines(tx, laserId, form);
		if (!chosen.ok) return chosen;
		if (pathId !== null) await tx.select({ id: table.beamPath.id }).from(table.beamPath).where(eq(table.beamPath.id, pathId)).for('update');
		const limits = await currentLimits(tx);
		// The one shape, checked by the one schema before the engine sees it.
		const parsed = beamPathSchema.safeParse({ lines: chosen.lines.map(lineFromRow), ...si.value });
		if (!parsed.success) return failure(400, 'The path cannot be saved as entered.', Object.fromEntries(parsed.error.issues.map((i) => [i.path.join('.'), [i.message]])));
		const { inputs, outcome } = evaluatePath(parsed.data, limits);
		if (!outcome.ok) return engineFailure(outcome.errors);
		const result = outcome.result;
		const now = new Date();
		let before: unknown = null;
		let id: string;
		let version: number;
		let previous: table.BeamPath;
		// Point ids kept from the form: only ids of this path's own points (never another path's).
		let ownPointIds = new Set<string>();
		const draft = draftGaps(result).length > 0;
		const status = { verdict: result.verdict, flagged: needsReview(result.verdict) && !draft, draft, stale: false, updatedBy: scope.userId, updatedAt: now };
		const common = { name: form.name, purpose: form.purpose, lineChoiceReason: form.lineChoiceReason, nohdExposureDuration: si.value.nohdExposureDuration, ...status };
		if (pathId === null) {
			const [created] = await tx.insert(table.beamPath).values({ laserId, createdBy: scope.userId, ...common }).returning();
			id = created.id;
			version = created.version;
			previous = created;
		} else {
			const old = await loadPath(pathId, tx);
			if (!old || old.path.laserId !== laserId) return notFound('beam path');
			ownPointIds = new Set(old.points.map((p) => p.id));
			before = { path: old.path, ...beamPathOf(old) };
			const [updated] = await tx
				.update(table.beamPath)
				.set({ ...common, version: form.version + 1 })
				.where(and(eq(table.beamPath.id, pathId), eq(table.beamPath.version, form.version)))
				.returning();
			if (!updated) return changedMeanwhile('beam path');
			previous = { ...old.path, name: form.name };
			id = pathId;
			version = updated.version;
			await tx.delete(table.pathElement).where(eq(table.pathElement.pathId, id));
			await tx.delete(table.pathLine).where(eq(table.pathLine.pathId, id));
			await tx.delete(table.pointOfConcern).where(eq(table.pointOfConcern.pathId, id));
		}
		const stored = parsed.data;
		await tx.insert(table.pathLine).values(chosen.lines.map((l, i) => ({ pathId: id, lineId: l.id, sequence: i })));
		if (stored.elements.length) await tx.insert(table.pathElement).values(stored.elements.map((e, i) => ({ pathId: id, sequence: i, ...e })));
		const keptIds = stored.points.map((p) => (ownPointIds.delete(p.id) ? p.id : null)); // each id once
		const pointRows = await tx
			.insert(table.pointOfConcern)
			.values(stored.points.map(({ id: _formKey, ...p }, i) => ({ ...(keptIds[i] ? { id: keptIds[i]! } : {}), pathId: id, sequence: i, ...p })))
			.returning({ id: table.pointOfConcern.id });
		await tx.insert(table.assessment).values({
			pathId: id,
			pathVersion: version,
			engineVersion: ENGINE_VERSION,
			inputs: { ...inputs, path: { ...inputs.path, points: inputs.path.points.map((p, i) => ({ ...p, id: pointRows[i].id })) } },
			result: remapPointIds(result, stored.points.map((p) => p.id), pointRows.map((r) => r.id)),
			verdict: result.verdict,
			worstRatio: numeric(result.worstRatio),
			requiredOd: numeric(result.requiredOpticalDensity?.value ?? null),
			limitVersions: result.limitsConsidered,
			cause: 'save',
			createdBy: scope.userId
		});
		const review = await reviews.afterSnapshot(tx, previous, result.verdict, 'save', draft);
		if (Object.keys(review).length) await tx.update(table.beamPath).set(review).where(eq(table.beamPath.id, id));
		await audit.record(tx, {
			actorId: scope.userId,
			action: pathId === null ? 'path.create' : 'path.update',
			entity: 'beam_path',
			entityId: id,
			before,
			after: { name: form.name, lineIds: chosen.lines.map((l) => l.id), lineChoiceReason: form.lineChoiceReason, elements: stored.elements, points: stored.points, verdict: result.verdict }
		});
		return { ok: true, id, verdict: result.verdict, version } as const;
	});
}

/** A float64 for a PostgreSQL numeric column (its shortest exact decimal text). */
const numeric = (v: number | null): string | null => (v === null ? null : String(v));

/** The engine saw the form's point keys; the snapshot keeps the stored points' ids. */
function remapPointIds(result: AssessmentResult, keys: string[], ids: string[]): AssessmentResult {
	const map = new Map(keys.map((k, i) => [k, ids[i]]));
	return {
		...result,
		worstPointId: result.worstPointId ? map.get(result.worstPointId) ?? result.worstPointId : null,
		points: result.points.map((p) => ({ ...p, id: map.get(p.id) ?? p.id }))
	};
}

/** Re-evaluate stale paths against the limits in force now; each in its own transaction. */
export async function reassessStale(batch = 200): Promise<{ reassessed: number }> {
	const stale = await db
		.select({ id: table.beamPath.id })
		.from(table.beamPath)
		.where(and(eq(table.beamPath.stale, true), eq(table.beamPath.retired, false)))
		.orderBy(asc(table.beamPath.updatedAt))
		.limit(batch);
	let reassessed = 0;
	for (const { id } of stale) {
		const done = await db.transaction(async (tx) => {
			await lockLimitLibrary(tx, 'read'); // before the row, as every snapshot takes them
			// Lock the row: two workers never snapshot the same path twice, and a concurrent save wins.
			const [locked] = await tx.execute<{ id: string }>(sql`SELECT id FROM beam_path WHERE id = ${id} AND stale FOR UPDATE SKIP LOCKED`);
			if (!locked) return false;
			const detail = await loadPath(id, tx);
			if (!detail) return false;
			const limits = await currentLimits(tx);
			const { inputs, outcome } = evaluatePath(beamPathOf(detail), limits);
			const result = outcome.ok ? outcome.result : null;
			const verdict = result ? result.verdict : 'incomplete';
			// Only the engine changed (same path, line and limits): the clearance holds unless the answer changed.
			const previous = detail.latest;
			const engineOnly = previous !== null && previous.engineVersion !== ENGINE_VERSION && diffInputs(previous.inputs, inputs).length === 0;
			const answerChanged = !engineOnly || changedAnswer(previous!.result, result);
			await tx.insert(table.assessment).values({
				pathId: id,
				pathVersion: detail.path.version,
				engineVersion: ENGINE_VERSION,
				inputs,
				result: result ?? { errors: outcome.ok ? [] : outcome.errors },
				verdict,
				worstRatio: numeric(result?.worstRatio ?? null),
				requiredOd: numeric(result?.requiredOpticalDensity?.value ?? null),
				limitVersions: result?.limitsConsidered ?? limits.map((l) => ({ id: l.limitId, version: String(l.version) })),
				cause: engineOnly ? 'engine' : 'reassess'
			});
			const draft = result !== null && draftGaps(result).length > 0;
			const review = answerChanged ? await reviews.afterSnapshot(tx, detail.path, verdict, 'reassess', draft) : {};
			await tx.update(table.beamPath).set({ verdict, flagged: needsReview(verdict) && !draft, draft, stale: false, ...review }).where(eq(table.beamPath.id, id));
			await audit.record(tx, { actorId: null, action: 'path.reassess', entity: 'beam_path', entityId: id, before: { verdict: detail.path.verdict }, after: { verdict } });
			return true;
		});
		if (done) reassessed++;
	}
	return { reassessed };
}

/** Did a re-evaluation change what the officer decided on: the verdict, or the whole OD eyewear needs? */
function changedAnswer(before: unknown, after: AssessmentResult | null): boolean {
	const b = before as { verdict?: string; requiredOpticalDensity?: { roundedUpWhole?: number | string } | null } | null;
	if (!after || !b || b.verdict !== after.verdict) return true;
	return Number(after.requiredOpticalDensity?.roundedUpWhole ?? 0) > Number(b.requiredOpticalDensity?.roundedUpWhole ?? 0);
}

/**
 * Snapshots made by an older engine version: their paths are marked stale, so that the
 * re-evaluation brings every live path to the engine that runs now. Run by the re-evaluation job.
 */
export async function markStaleByEngine(): Promise<number> {
	return db.transaction(async (tx) => {
		const marked = await tx.execute<{ id: string }>(sql`
			UPDATE beam_path bp SET stale = true
			WHERE NOT bp.retired AND NOT bp.stale AND bp.verdict IS NOT NULL
				AND (SELECT a.engine_version FROM assessment a WHERE a.path_id = bp.id ORDER BY a.created_at DESC LIMIT 1) <> ${ENGINE_VERSION}
			RETURNING bp.id`);
		if (marked.length === 0) return 0;
		const ids = sql.join(marked.map((m) => sql`${m.id}::uuid`), sql`, `);
		await tx.execute(sql`
			UPDATE assessment a SET stale = true, stale_reason = ${`The hazard engine changed (now ${ENGINE_VERSION})`}
			WHERE a.id IN (SELECT DISTINCT ON (path_id) id FROM assessment WHERE path_id IN (${ids}) ORDER BY path_id, created_at DESC)`);
		await audit.record(tx, { actorId: null, action: 'engine.updated', entity: 'beam_path', entityId: 'many', after: { engineVersion: ENGINE_VERSION, paths: marked.map((m) => m.id) } });
		return marked.length;
	});
}

/**
 * Limits also come into force and lapse by date (valid from / valid until, each a whole UTC day).
 * Every live path whose latest snapshot was taken before such a boundary that has since passed, on
 * a limit that covers its line, is marked stale, so the re-evaluation takes the library as it now
 * stands. Run by the re-evaluation job (every five minutes): a late run catches up.
 */
export async function markStaleByLimitDates(now = new Date()): Promise<number> {
	return db.transaction(async (tx) => {
		await lockLimitLibrary(tx, 'change');
		const at = now.toISOString();
		const marked = await tx.execute<{ id: string }>(sql`
			UPDATE beam_path bp SET stale = true
			WHERE NOT bp.retired AND NOT bp.stale AND bp.verdict IS NOT NULL
				AND EXISTS (
					SELECT 1 FROM path_line pl JOIN emission_line l ON l.id = pl.line_id
					CROSS JOIN exposure_limit el
					JOIN exposure_limit_version v ON v.limit_id = el.id AND v.version = el.current_version
					CROSS JOIN LATERAL (SELECT max(a.created_at) AS at FROM assessment a WHERE a.path_id = bp.id) latest
					WHERE pl.path_id = bp.id AND NOT el.retired
						AND l.wavelength <= v.wavelength_max AND coalesce(l.wavelength_max, l.wavelength) >= v.wavelength_min
						AND ((v.valid_from > latest.at AND v.valid_from <= ${at}::timestamptz)
							OR (v.valid_until + interval '1 day' > latest.at AND v.valid_until + interval '1 day' <= ${at}::timestamptz)))
			RETURNING bp.id`);
		if (marked.length === 0) return 0;
		const ids = sql.join(marked.map((m) => sql`${m.id}::uuid`), sql`, `);
		await tx.execute(sql`
			UPDATE assessment a SET stale = true, stale_reason = 'A limit came into force or lapsed by date'
			WHERE a.id IN (SELECT DISTINCT ON (path_id) id FROM assessment WHERE path_id IN (${ids}) ORDER BY path_id, created_at DESC)`);
		await audit.record(tx, { actorId: null, action: 'limits.dates-passed', entity: 'beam_path', entityId: 'many', after: { paths: marked.map((m) => m.id) } });
		return marked.length;
	});
}

export async function countStale(): Promise<number> {
	return db.$count(table.beamPath, and(eq(table.beamPath.stale, true), eq(table.beamPath.retired, false)));
}
