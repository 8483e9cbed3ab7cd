// The officer's review of flagged beam paths. A decision is an immutable record of who decided
// what, when, on which assessment snapshot; a later decision supersedes it, nothing edits it.
import { and, asc, desc, eq, inArray, sql, type SQL } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { canRead, type Scope, inReadableLabs } from '$lib/server/auth/scope';
import { cannotChange, failure, fieldsNeedAttention, notFound, notYours, type Failure } from '$lib/server/http/failure';
import { isUuid } from '$lib/server/db/ids';
import { needsReview } from '$lib/server/assessments';
import { notify, officerIds } from '$lib/server/notifications';
import * as suspensions from '$lib/server/suspensions';
import * as procedures from '$lib/server/procedures';
import { nudge, queues } from '$lib/server/jobs/queues';
import { describeControl, type DecisionForm } from '$lib/schemas/reviews';
import * as eyewear from '$lib/server/eyewear';
import { isCurrentResult, type AssessmentResult } from '$lib/assessmentResult';
import { pathStateOf, pathStates, type PathState } from '$lib/pathState';
import { controlShortfalls, type EyewearControl, type Need } from '$lib/server/eyewearAdequacy';
import { formatQuantity, parseQuantity } from '$lib/units';
import { can } from '$lib/abilities';

type PathRow = typeof table.beamPath.$inferSelect;

/**
 * After a new snapshot of a path: where it stands with the officer. A path that is not shown to be
 * within limit waits for review — again after a clearance, whose snapshot no longer matches. A
 * returned path waits for its researcher, unless the researcher saved a change (cause 'save').
 */
export async function afterSnapshot(tx: Tx, path: PathRow, verdict: table.Assessment['verdict'], cause: 'save' | 'reassess', draft = false): Promise<Partial<PathRow>> {
	// A draft is not submitted: it waits for its researcher to complete it, whatever it stood at before.
	if (draft || !needsReview(verdict)) return { reviewState: 'not_needed', awaitingSince: null };
	if (path.reviewState === 'returned' && cause === 'reassess') return {};
	if (path.reviewState === 'awaiting_review') return {};
	const again = path.reviewState === 'cleared';
	await procedures.pathReviewReopened(tx, path); // procedures covering the path: to be reviewed
	await notify(tx, {
		userIds: await officerIds(tx),
		kind: 'path.flagged',
		pathId: path.id,
		title: again ? `Clearance of “${path.name}” is stale` : `“${path.name}” awaits review`,
		body: again
			? 'The path, its laser line or a limit it used changed after it was cleared. It is back on the review desk.'
			: 'Its latest assessment is not within limit. Review the working and decide on the controls.'
	});
	return { reviewState: 'awaiting_review', awaitingSince: new Date() };
}

const wl = (v: number | string) => formatQuantity(v, 'wavelength', { significantDigits: 8 });

/** Per line of the path, what the assessment asks of eyewear (OD 0: none). */
export function eyewearNeeds(result: AssessmentResult): Need[] {
	return result.lines.map((line) => {
		const od = result.requiredOpticalDensities.find((o) => o.line === line.index)?.od ?? null;
		const max = line.wavelengthMax ?? line.wavelength;
		return { wavelengthMin: String(line.wavelength), wavelengthMax: String(max), od: od?.roundedUpWhole ?? 0, odAssessed: od?.value ?? 0, label: max > line.wavelength ? `${wl(line.wavelength)}–${wl(max)}` : wl(line.wavelength) };
	});
}

function eyewearControlsOf(controls: DecisionForm['controls'], wavelengths: ({ min: string; max: string | null } | null)[]): EyewearControl[] {
	const out: EyewearControl[] = [];
	controls.forEach((c, index) => {
		const w = wavelengths[index];
		if (c.kind !== 'eyewear' || !w) return;
		out.push({ index, wavelengthMin: w.min, wavelengthMax: w.max ?? w.min, od: c.minOd, label: `OD ${c.minOd} at ${wl(w.min)}${w.max ? `–${wl(w.max)}` : ''}` });
	});
	return out;
}

/** The eyewear controls a clearance starts from: one per line that needs it, at the whole OD the assessment asks for. */
export function eyewearControls(result: AssessmentResult | null): DecisionForm['controls'] {
	return (result?.requiredOpticalDensities ?? [])
		.filter((o) => o.od.roundedUpWhole > 0)
		.map((o) => ({ kind: 'eyewear' as const, minOd: String(o.od.roundedUpWhole), wavelength: wl(o.wavelengthMin), wavelengthMax: o.wavelengthMax > o.wavelengthMin ? wl(o.wavelengthMax) : '', details: '' }));
}

/** pathStateOf (src/lib/pathState.ts) in SQL, for filters and counters. */
const pathStateSql = sql<PathState>`(CASE WHEN ${table.beamPath.stale} THEN 'being_reevaluated' WHEN ${table.beamPath.draft} THEN 'draft' WHEN ${table.beamPath.reviewState} = 'awaiting_review' AND ${table.beamPath.clearedAssessmentId} IS NOT NULL THEN 'changed_since_clearance' WHEN ${table.beamPath.reviewState} = 'not_needed' THEN 'no_review_needed' ELSE ${table.beamPath.reviewState}::text END)`;

/** 'waiting': everything the officer has to decide on; 'all': every path that was ever reviewed or waits. */
export type QueueFilter = { labId?: string; state?: PathState | 'waiting' | 'all'; page?: number };
/** Rows per page of the review desk: the oldest first, a page at a time. */
export const QUEUE_PAGE_SIZE = 50;

/** Paths waiting for review (or as filtered), oldest first; one query for the page. */
export async function queue(scope: Scope, filter: QueueFilter = {}) {
	const where: SQL[] = [eq(table.beamPath.retired, false)];
	const readable = inReadableLabs(scope, table.laser.labId);
	if (readable) where.push(readable);
	if (filter.labId) where.push(eq(table.laser.labId, filter.labId));
	const state = filter.state ?? 'waiting';
	if (state === 'all') where.push(sql`(${table.beamPath.reviewState} <> 'not_needed' OR ${table.beamPath.stale})`);
	else if (state === 'waiting') where.push(eq(table.beamPath.reviewState, 'awaiting_review'));
	else where.push(sql`${pathStateSql} = ${state}`);
	// The page first (filtered, sorted, limited on the review index), then the latest snapshot of
	// each path on it only: a lateral join on the path's index, never a pass over every waiting path.
	const waitingSince = sql`coalesce(${table.beamPath.awaitingSince}, ${table.beamPath.updatedAt})`;
	const onPage = db
		.select({ id: table.beamPath.id, since: sql<Date>`${waitingSince}`.as('since') })
		.from(table.beamPath)
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.where(and(...where))
		.orderBy(asc(waitingSince), asc(table.beamPath.id))
		.limit(QUEUE_PAGE_SIZE + 1) // one more than shown: whether a next page exists
		.offset(((filter.page ?? 1) - 1) * QUEUE_PAGE_SIZE)
		.as('on_page');
	const latest = db
		.select({
			worstRatio: table.assessment.worstRatio,
			requiredOd: table.assessment.requiredOd,
			verdict: table.assessment.verdict
		})
		.from(table.assessment)
		.where(eq(table.assessment.pathId, table.beamPath.id))
		.orderBy(desc(table.assessment.createdAt))
		.limit(1)
		.as('latest');
	return db
		.select({
			pathId: table.beamPath.id,
			pathName: table.beamPath.name,
			state: pathStateSql,
			awaitingSince: table.beamPath.awaitingSince,
			updatedAt: table.beamPath.updatedAt,
			laserId: table.laser.id,
			laserName: sql<string>`${table.laser.maker} || ' ' || ${table.laser.model}`,
			labCode: table.lab.code,
			laserSuspended: sql<boolean>`EXISTS (SELECT 1 FROM laser_suspension s WHERE s.laser_id = ${table.laser.id} AND s.lifted_at IS NULL)`,
			/** The wavelengths of the lines the path carries. */
			wavelengths: sql<string[]>`(SELECT coalesce(json_agg(l.wavelength::text ORDER BY pl.sequence), '[]'::json) FROM path_line pl JOIN emission_line l ON l.id = pl.line_id WHERE pl.path_id = ${table.beamPath.id})`,
			verdict: latest.verdict,
			worstRatio: latest.worstRatio,
			requiredOd: latest.requiredOd
		})
		.from(onPage)
		.innerJoin(table.beamPath, eq(table.beamPath.id, onPage.id))
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
		.leftJoinLateral(latest, sql`true`)
		.orderBy(asc(onPage.since), asc(onPage.id));
}

export type QueueRow = Awaited<ReturnType<typeof queue>>[number];

/** Counts for the overview and the review desk: live paths in each state, under the state's one name. */
export async function counts(scope: Scope): Promise<Record<PathState, number> & { total: number }> {
	const where: SQL[] = [eq(table.beamPath.retired, false)];
	const readable = inReadableLabs(scope, table.laser.labId);
	if (readable) where.push(readable);
	const rows = await db
		.select({ state: pathStateSql, n: sql<number>`count(*)::int` })
		.from(table.beamPath)
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.where(and(...where))
		.groupBy(pathStateSql);
	const out = { ...(Object.fromEntries(pathStates.map((s) => [s, 0])) as Record<PathState, number>), total: 0 };
	for (const r of rows) {
		out[r.state] = r.n;
		out.total += r.n;
	}
	return out;
}

/** Every decision on a path, newest first, with its controls and the researcher's replies. */
export async function history(pathId: string) {
	const decisions = await db
		.select({ d: table.reviewDecision, by: table.user.name })
		.from(table.reviewDecision)
		.innerJoin(table.user, eq(table.user.id, table.reviewDecision.decidedBy))
		.where(eq(table.reviewDecision.pathId, pathId))
		.orderBy(desc(table.reviewDecision.decidedAt));
	const ids = decisions.map((r) => r.d.id);
	const [controls, replies] = ids.length
		? await Promise.all([
				db.select().from(table.requiredControl).where(inArray(table.requiredControl.decisionId, ids)),
				db
					.select({ r: table.reviewReply, by: table.user.name })
					.from(table.reviewReply)
					.innerJoin(table.user, eq(table.user.id, table.reviewReply.authorId))
					.where(inArray(table.reviewReply.decisionId, ids))
					.orderBy(asc(table.reviewReply.createdAt))
			])
		: [[], []];
	return decisions.map(({ d, by }) => ({
		...d,
		decidedByName: by,
		controls: controls.filter((c) => c.decisionId === d.id),
		replies: replies.filter((r) => r.r.decisionId === d.id).map((r) => ({ ...r.r, authorName: r.by }))
	}));
}

export type Decision = Awaited<ReturnType<typeof history>>[number];

export const draftReason = 'This beam path is a draft: an accessible point lacks an input. It can be reviewed once every accessible point is complete.';

/** Nobody clears a path they registered or last changed, whatever their role. */
export function selfReviewReason(path: PathRow, officerId: string, latestBy: string | null): string | null {
	if (path.createdBy === officerId) return 'You registered this beam path: another officer must review it.';
	if (path.updatedBy === officerId || latestBy === officerId) return 'You made the latest change to this beam path: another officer must review it.';
	return null;
}

export async function decide(officer: Scope, pathId: string, form: DecisionForm): Promise<{ ok: true; decisionId: string } | Failure> {
	if (!can(officer, 'decideReviews')) return failure(403, 'Only a laser safety officer decides on reviews.');
	if (!isUuid(pathId)) return notFound('beam path');
	const controls = form.decision === 'cleared' ? form.controls : [];
	const fields: Record<string, string> = {};
	const wavelengths: ({ min: string; max: string | null } | null)[] = controls.map((c, i) => {
		if (c.kind !== 'eyewear') return null;
		const p = parseQuantity(c.wavelength, 'wavelength');
		if (!p.ok) fields[`controls.${i}.wavelength`] = p.reason;
		const q = c.wavelengthMax === '' ? null : parseQuantity(c.wavelengthMax, 'wavelength');
		if (q && !q.ok) fields[`controls.${i}.wavelengthMax`] = q.reason;
		return p.ok ? { min: p.value.toString(), max: q?.ok ? q.value.toString() : null } : null;
	});
	if (Object.keys(fields).length) return fieldsNeedAttention(fields);
	const outcome = await db.transaction(async (tx) => {
		const [path] = await tx.select().from(table.beamPath).where(eq(table.beamPath.id, pathId)).for('update');
		if (!path) return notFound('beam path');
		// A suspended laser takes no new clearance until an officer lifts the suspension.
		const [suspended] = form.decision === 'cleared' ? await suspensions.activeFor([path.laserId], tx) : [];
		if (suspended) return failure(409, suspensions.refusal(suspended));
		const [latest] = await tx.select().from(table.assessment).where(eq(table.assessment.pathId, pathId)).orderBy(desc(table.assessment.createdAt)).limit(1);
		if (!latest) return failure(409, 'This path has no saved assessment to review yet.');
		if (latest.id !== form.assessmentId)
			return failure(409, 'The assessment changed while you were reviewing it. Nothing was saved; read the new working and decide again.');
		if (path.stale) return failure(409, 'This assessment is stale and is being re-evaluated. Decide once the new result is in.');
		if (path.draft) return failure(409, draftReason);
		const [newest] = await tx.select({ id: table.reviewDecision.id }).from(table.reviewDecision).where(eq(table.reviewDecision.pathId, pathId)).orderBy(desc(table.reviewDecision.decidedAt)).limit(1);
		if ((newest?.id ?? '') !== form.afterDecisionId)
			return failure(409, 'Another officer decided on this path while you were reviewing it. Nothing was saved; reload to read their decision, then decide again if needed.');
		const self = selfReviewReason(path, officer.userId, latest.createdBy);
		if (self) return failure(403, self);
		if (form.decision === 'cleared') {
			// Eyewear that is required must protect: every line at the OD the assessment asks for, rounded up.
			if (!isCurrentResult(latest.result)) return failure(409, 'This assessment was made by an older engine and is being re-evaluated. Decide once the new result is in.');
			const short = controlShortfalls(eyewearNeeds(latest.result), eyewearControlsOf(controls, wavelengths));
			if (Object.keys(short).length) return fieldsNeedAttention(short);
		}
		const [decision] = await tx
			.insert(table.reviewDecision)
			.values({
				pathId,
				assessmentId: latest.id,
				decision: form.decision,
				comments: form.comments,
				reviewBy: form.reviewBy ? new Date(form.reviewBy + 'T00:00:00Z') : null,
				decidedBy: officer.userId
			})
			.returning();
		if (controls.length)
			await tx.insert(table.requiredControl).values(
				controls.map((c, i) => ({ decisionId: decision.id, kind: c.kind, minOd: c.kind === 'eyewear' ? c.minOd : null, wavelength: wavelengths[i]?.min ?? null, wavelengthMax: wavelengths[i]?.max ?? null, details: c.details }))
			);
		await tx
			.update(table.beamPath)
			.set({
				reviewState: form.decision,
				awaitingSince: null,
				...(form.decision === 'cleared' ? { clearedAssessmentId: latest.id, flagged: false } : {})
			})
			.where(eq(table.beamPath.id, pathId));
		const researchers = [path.createdBy, path.updatedBy].filter((x): x is string => !!x && x !== officer.userId);
		await notify(tx, {
			userIds: researchers,
			kind: `review.${form.decision}`,
			pathId,
			title: form.decision === 'cleared' ? `“${path.name}” cleared with controls` : `“${path.name}” returned with comments`,
			body: form.decision === 'cleared' ? clearedBody(controls, wavelengths, form.comments) : form.comments
		});
		await audit.record(tx, {
			actorId: officer.userId,
			action: `review.${form.decision}`,
			entity: 'beam_path',
			entityId: pathId,
			before: { reviewState: path.reviewState },
			after: { reviewState: form.decision, decisionId: decision.id, assessmentId: latest.id, controls }
		});
		return { ok: true, decisionId: decision.id } as const;
	});
	// The researcher's mail goes out now rather than at the next minute's sweep.
	if (outcome.ok) await nudge(queues.mailDeliver);
	return outcome;
}

/** The cleared notice (and its mail): every required control in words, then the comments. */
function clearedBody(controls: DecisionForm['controls'], wavelengths: ({ min: string; max: string | null } | null)[], comments: string): string {
	const list = controls.map((c, i) => `• ${describeControl({ kind: c.kind, minOd: c.kind === 'eyewear' ? c.minOd : null, wavelength: wavelengths[i]?.min ?? null, wavelengthMax: wavelengths[i]?.max ?? null, details: c.details })}`);
	const head = controls.length ? `Required control${controls.length === 1 ? '' : 's'}:\n${list.join('\n')}` : 'No control is required.';
	return comments ? `${head}\n\nComments: ${comments}` : head;
}

/** Where a path stands with the officer, for the path page and the review page: its state, every decision with its controls and replies, the eyewear check, and whether the reader may answer. */
export async function record(path: PathRow, editable: boolean) {
	const [decisions, check] = await Promise.all([history(path.id), eyewear.checksForPaths([path.id])]);
	return {
		state: pathStateOf(path),
		history: decisions,
		eyewearCheck: check.get(path.id) ?? null,
		canReply: editable && decisions[0]?.decision === 'returned'
	};
}

export type ReviewRecord = Awaited<ReturnType<typeof record>>;

/** The researcher answers a returned review (they then change the path and save it). */
export async function reply(scope: Scope, pathId: string, body: string): Promise<{ ok: true } | Failure> {
	if (!isUuid(pathId)) return notFound('beam path');
	const [row] = await db
		.select({ path: table.beamPath, labId: table.laser.labId })
		.from(table.beamPath)
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.where(eq(table.beamPath.id, pathId));
	if (!row) return notFound('beam path');
	if (!canRead(scope, row.labId)) return notYours('beam path');
	if (!can(scope, 'changeRegister')) return cannotChange('beam path');
	const [last] = await db.select().from(table.reviewDecision).where(eq(table.reviewDecision.pathId, pathId)).orderBy(desc(table.reviewDecision.decidedAt)).limit(1);
	if (!last || last.decision !== 'returned') return failure(409, 'There is no returned review to answer.');
	await db.transaction(async (tx) => {
		const [r] = await tx.insert(table.reviewReply).values({ decisionId: last.id, authorId: scope.userId, body }).returning();
		await notify(tx, { userIds: [last.decidedBy], kind: 'review.replied', pathId, title: `Reply on “${row.path.name}”`, body });
		await audit.record(tx, { actorId: scope.userId, action: 'review.reply', entity: 'beam_path', entityId: pathId, after: r });
	});
	return { ok: true };
}
