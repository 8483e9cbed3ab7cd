// The hazard evaluation report of a beam path: one per assessment snapshot, so a past clearance
// prints as it was. Everything comes from the stored snapshot (its inputs, its result, the limit
// versions it used) and the review decision taken on it; nothing is recomputed from today's
// library. The plot and the beam outline are drawn from the snapshot's own inputs.
import { and, asc, desc, eq } from 'drizzle-orm';
import { isCurrentResult, type AssessmentResult, type CitedLimit } from '$lib/assessmentResult';
import type { Scope } from '$lib/server/auth/scope';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { notFound, type Failure } from '$lib/server/http/failure';
import { isUuid } from '$lib/server/db/ids';
import * as paths from '$lib/server/paths';
import { beamEnvelope, exposureProfile } from '$lib/server/alongPath';
import type { SnapshotInputs } from '$lib/server/assessments';
import { snapshotChecksum } from '$lib/server/snapshotChecksum';
import { describeControl } from '$lib/schemas/reviews';
import type { BeamSample } from '$lib/hazardZone';
import type { PlotData, SchematicElement } from '$lib/reportDrawings';

export type ReportLimit = { id: string; version: string; label: string; citation: string; deciding: boolean };
export type ReportDecision = { decision: 'cleared' | 'returned'; decidedAt: string; decidedByName: string; comments: string; reviewBy: string | null; controls: string[] };

export type Report = {
	snapshot: { id: string; createdAt: string; engineVersion: string; cause: string; stale: boolean; staleReason: string | null; createdByName: string | null; pathVersion: number; isLatest: boolean };
	checksum: string;
	path: { id: string; name: string; purpose: string; lineChoiceReason: string };
	laser: { id: string; name: string; serial: string; laserClass: string; labCode: string; labName: string };
	/** A result of this engine generation; null for an older engine's snapshot (see `older`). */
	result: AssessmentResult | null;
	older: { engineVersion: string; verdict: string; reason: string; worstRatio: string | number | null } | null;
	elements: SchematicElement[];
	limits: ReportLimit[];
	decision: ReportDecision | null;
	/** A decision taken on a later snapshot supersedes this one's: said on the report. */
	laterDecision: boolean;
	plot: PlotData | null;
	beam: BeamSample[] | null;
	printedAt: string;
};

/** The snapshots of a path, newest first, for links to their reports. */
export async function snapshotsOf(pathId: string, limit = 20) {
	return db
		.select({ id: table.assessment.id, createdAt: table.assessment.createdAt, verdict: table.assessment.verdict })
		.from(table.assessment)
		.where(eq(table.assessment.pathId, pathId))
		.orderBy(desc(table.assessment.createdAt))
		.limit(limit);
}

/** Every limit the snapshot was given, with the deciding ones marked (versions as stored). */
export function limitsOf(inputs: SnapshotInputs | null, result: AssessmentResult | null): ReportLimit[] {
	const deciding = new Map<string, CitedLimit>();
	for (const p of result?.points ?? [])
		for (const l of p.lines) for (const c of l.checks) for (const x of c.comparisons) if (x.deciding) deciding.set(`${x.limit.id}@${x.limit.version}`, x.limit);
	const used = new Set((result?.limitsUsed ?? []).map((l) => `${l.id}@${l.version}`));
	const fromInputs = (inputs?.limits ?? [])
		.filter((l) => used.has(`${l.id}@${l.version}`) || deciding.has(`${l.id}@${l.version}`))
		.map((l) => ({ id: l.id, version: String(l.version), label: l.label, citation: l.citation, deciding: deciding.has(`${l.id}@${l.version}`) }));
	// A deciding limit missing from the stored inputs still appears, from the result itself.
	for (const [key, l] of deciding) if (!fromInputs.some((x) => `${x.id}@${x.version}` === key)) fromInputs.push({ id: l.id, version: l.version, label: l.label, citation: l.citation, deciding: true });
	return fromInputs.sort((a, b) => Number(b.deciding) - Number(a.deciding) || a.label.localeCompare(b.label));
}

export async function find(scope: Scope, pathId: string, snapshotId: string): Promise<{ ok: true; report: Report } | Failure> {
	if (!isUuid(snapshotId)) return notFound('assessment snapshot');
	const found = await paths.find(scope, pathId);
	if (!found.ok) return found;
	const { detail } = found;
	const [row] = await db
		.select({ a: table.assessment, byName: table.user.name })
		.from(table.assessment)
		.leftJoin(table.user, eq(table.user.id, table.assessment.createdBy))
		.where(and(eq(table.assessment.id, snapshotId), eq(table.assessment.pathId, pathId)));
	if (!row) return notFound('assessment snapshot');
	const a = row.a;
	const decisions = await db
		.select({ d: table.reviewDecision, by: table.user.name })
		.from(table.reviewDecision)
		.innerJoin(table.user, eq(table.user.id, table.reviewDecision.decidedBy))
		.where(eq(table.reviewDecision.pathId, pathId))
		.orderBy(asc(table.reviewDecision.decidedAt));
	const onThis = decisions.filter((d) => d.d.assessmentId === a.id).at(-1) ?? null;
	const controls = onThis ? await db.select().from(table.requiredControl).where(eq(table.requiredControl.decisionId, onThis.d.id)) : [];
	const [newer] = await db.select({ id: table.assessment.id }).from(table.assessment).where(eq(table.assessment.pathId, pathId)).orderBy(desc(table.assessment.createdAt)).limit(1);

	const result = isCurrentResult(a.result) ? a.result : null;
	const inputs = isInputs(a.inputs) ? a.inputs : null;
	const old = result ? null : (a.result as { engineVersion?: string; verdict?: string; reason?: string; worstRatio?: string | number | null });
	let plot: PlotData | null = null;
	let beam: BeamSample[] | null = null;
	if (result && inputs) {
		try {
			plot = exposureProfile(inputs.path, inputs.limits, result);
			beam = beamEnvelope(inputs.path, inputs.limits, result.pathLength, result.hazardDistances.map((d) => d.origin));
		} catch {
			// Inputs an older rule set accepted: the report still prints, without the sampled pictures.
			plot = null;
			beam = null;
		}
	}
	const report: Report = {
		snapshot: {
			id: a.id,
			createdAt: a.createdAt.toISOString(),
			engineVersion: a.engineVersion,
			cause: a.cause,
			stale: a.stale,
			staleReason: a.staleReason,
			createdByName: row.byName,
			pathVersion: a.pathVersion,
			isLatest: newer?.id === a.id
		},
		checksum: snapshotChecksum(a),
		path: { id: detail.path.id, name: detail.path.name, purpose: detail.path.purpose, lineChoiceReason: detail.path.lineChoiceReason },
		laser: { id: detail.laser.id, name: `${detail.laser.maker} ${detail.laser.model}`, serial: detail.laser.serial, laserClass: detail.laser.laserClass, labCode: detail.lab.code, labName: detail.lab.name },
		result,
		older: old ? { engineVersion: String(old.engineVersion ?? a.engineVersion), verdict: String(old.verdict ?? a.verdict), reason: String(old.reason ?? ''), worstRatio: old.worstRatio ?? a.worstRatio } : null,
		elements: (inputs?.path.elements ?? []).map((e) => ({ kind: e.kind, label: e.label, length: e.length })),
		limits: limitsOf(inputs, result),
		decision: onThis
			? {
					decision: onThis.d.decision,
					decidedAt: onThis.d.decidedAt.toISOString(),
					decidedByName: onThis.by,
					comments: onThis.d.comments,
					reviewBy: onThis.d.reviewBy ? onThis.d.reviewBy.toISOString().slice(0, 10) : null,
					controls: controls.map((c) => describeControl(c))
				}
			: null,
		laterDecision: onThis !== null && decisions.at(-1)!.d.id !== onThis.d.id,
		plot: plot ? { checkLabel: plot.checkLabel, unit: plot.unit, exposureDuration: plot.exposureDuration, samples: plot.samples } : null,
		beam,
		printedAt: new Date().toISOString()
	};
	return { ok: true, report };
}

function isInputs(v: unknown): v is SnapshotInputs {
	return typeof v === 'object' && v !== null && typeof (v as SnapshotInputs).path === 'object' && Array.isArray((v as SnapshotInputs).limits);
}

/** For the path page: the beam outline of the latest snapshot (for the zone drawing) and the snapshots with a report. */
export async function pathPictures(pathId: string): Promise<{ beam: BeamSample[] | null; snapshots: { id: string; createdAt: string; verdict: string }[] }> {
	const list = await snapshotsOf(pathId);
	let beam: BeamSample[] | null = null;
	if (list.length) {
		const [latest] = await db.select({ inputs: table.assessment.inputs, result: table.assessment.result }).from(table.assessment).where(eq(table.assessment.id, list[0].id));
		if (latest && isCurrentResult(latest.result) && isInputs(latest.inputs)) {
			try {
				beam = beamEnvelope(latest.inputs.path, latest.inputs.limits, latest.result.pathLength, latest.result.hazardDistances.map((d) => d.origin));
			} catch {
				beam = null;
			}
		}
	}
	return { beam, snapshots: list.map((s) => ({ id: s.id, createdAt: s.createdAt.toISOString(), verdict: s.verdict })) };
}
