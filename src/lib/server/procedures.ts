// Procedures (operating, alignment, service, emergency) of a laser or a laser controlled area: the
// draft of the next version, its submission, the officer's approval (never their own draft) into
// an append-only approved version, sign-offs, the beam paths each covers, and the programme's
// sign-off interval. Every change is one transaction with its audit row; edits carry a version.
import { aliasedTable, and, asc, desc, eq, inArray, or, sql, type SQL } from 'drizzle-orm';
import { addYears, formatISO, parseISO } from 'date-fns';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { canEdit, canRead, type Scope, inReadableLabs } from '$lib/server/auth/scope';
import { changedMeanwhile, failure, fieldsNeedAttention, notFound, notYours, type Failure } from '$lib/server/http/failure';
import { isUuid } from '$lib/server/db/ids';
import { procedureHtml } from '$lib/server/richText';
import * as safetyMail from '$lib/server/safetyMail';
import { lineDiff, type DiffBlock } from '$lib/server/textDiff';
import type { StoredUpload } from '$lib/server/uploads';
import { DEFAULT_SIGNOFF_INTERVAL_MONTHS, signoffState, type SignoffState } from '$lib/authorisationState';
import { procedureState, type ProcedureState, type VersionState } from '$lib/procedureState';
import { parseTarget, type ApproveForm, type DraftForm, type NewProcedureForm } from '$lib/schemas/procedures';
import { can } from '$lib/abilities';

const p = table.procedure;
const v = table.procedureVersion;
const d = table.procedureDraft;
const owner = aliasedTable(table.user, 'owner');

const dayOf = (t: Date) => t.toISOString().slice(0, 10);
const laserLabel = (l: { maker: string | null; model: string | null }) => `${l.maker} ${l.model}`;

// ---------------------------------------------------------------------------------------------
// The programme's sign-off interval

export async function signoffInterval(tx: Tx | typeof db = db): Promise<{ months: number; version: number }> {
	const [row] = await tx.select().from(table.programmeSetting).where(eq(table.programmeSetting.id, 'programme'));
	return row ? { months: row.signoffIntervalMonths, version: row.version } : { months: DEFAULT_SIGNOFF_INTERVAL_MONTHS, version: 0 };
}

export async function setSignoffInterval(scope: Scope, months: number, version: number): Promise<{ ok: true } | Failure> {
	if (!can(scope, 'approveProcedures')) return failure(403, 'Only a laser safety officer sets the sign-off interval.');
	return db.transaction(async (tx) => {
		const s = table.programmeSetting;
		const before = await signoffInterval(tx);
		const rows =
			version === 0
				? await tx.insert(s).values({ id: 'programme', signoffIntervalMonths: months, updatedBy: scope.userId }).onConflictDoNothing().returning()
				: await tx
						.update(s)
						.set({ signoffIntervalMonths: months, version: version + 1, updatedBy: scope.userId, updatedAt: new Date() })
						.where(and(eq(s.id, 'programme'), eq(s.version, version)))
						.returning();
		if (!rows.length) return changedMeanwhile('setting');
		await audit.record(tx, { actorId: scope.userId, action: 'programme.signoff_interval', entity: 'programme_setting', entityId: 'programme', before: { months: before.months }, after: { months } });
		return { ok: true } as const;
	});
}

// ---------------------------------------------------------------------------------------------
// What a procedure can be written for

export type TargetOptions = {
	lasers: { id: string; label: string; labCode: string; areaId: string | null }[];
	areas: { id: string; label: string; labCode: string }[];
	paths: { id: string; name: string; laserId: string; areaId: string | null }[];
};

/** Lasers (not retired) and areas of the labs the person may change, and their beam paths. */
export async function targetOptions(scope: Scope): Promise<TargetOptions> {
	if (scope.editLabIds === 'none') return { lasers: [], areas: [], paths: [] };
	const labFilter = (col: typeof table.laser.labId | typeof table.area.labId): SQL =>
		scope.editLabIds === 'all' ? sql`true` : scope.editLabIds.length ? inArray(col, scope.editLabIds as string[]) : sql`false`;
	const [lasers, areas] = await Promise.all([
		db
			.select({ id: table.laser.id, maker: table.laser.maker, model: table.laser.model, labCode: table.lab.code, areaId: table.laser.areaId })
			.from(table.laser)
			.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
			.where(and(labFilter(table.laser.labId), sql`${table.laser.status} <> 'retired'`))
			.orderBy(asc(table.lab.code), asc(table.laser.maker), asc(table.laser.model)),
		db
			.select({ id: table.area.id, label: table.area.name, labCode: table.lab.code })
			.from(table.area)
			.innerJoin(table.lab, eq(table.lab.id, table.area.labId))
			.where(labFilter(table.area.labId))
			.orderBy(asc(table.lab.code), asc(table.area.name))
	]);
	const paths = lasers.length
		? await db
				.select({ id: table.beamPath.id, name: table.beamPath.name, laserId: table.beamPath.laserId })
				.from(table.beamPath)
				.where(and(inArray(table.beamPath.laserId, lasers.map((l) => l.id)), eq(table.beamPath.retired, false)))
				.orderBy(asc(table.beamPath.name))
		: [];
	const areaOf = new Map(lasers.map((l) => [l.id, l.areaId]));
	return {
		lasers: lasers.map((l) => ({ id: l.id, label: laserLabel(l), labCode: l.labCode, areaId: l.areaId })),
		areas,
		paths: paths.map((x) => ({ ...x, areaId: areaOf.get(x.laserId) ?? null }))
	};
}

type ResolvedTarget = { laserId: string | null; areaId: string | null; labId: string; label: string };

/** The laser or area a form names, if it exists (retired lasers are not a target). */
export async function resolveTarget(tx: Tx | typeof db, target: string): Promise<ResolvedTarget | null> {
	const { laserId, areaId } = parseTarget(target);
	if (laserId) {
		const [l] = await tx.select().from(table.laser).where(eq(table.laser.id, laserId));
		return l && l.status !== 'retired' ? { laserId, areaId: null, labId: l.labId, label: laserLabel(l) } : null;
	}
	const [a] = await tx.select().from(table.area).where(eq(table.area.id, areaId!));
	return a ? { laserId: null, areaId: a.id, labId: a.labId, label: a.name } : null;
}

/** The beam paths a procedure for this target may cover: the laser's, or those of the area's lasers. */
async function coverablePathIds(tx: Tx | typeof db, t: { laserId: string | null; areaId: string | null }): Promise<Set<string>> {
	const rows = await tx
		.select({ id: table.beamPath.id })
		.from(table.beamPath)
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.where(and(eq(table.beamPath.retired, false), t.laserId ? eq(table.laser.id, t.laserId) : eq(table.laser.areaId, t.areaId!)));
	return new Set(rows.map((r) => r.id));
}

/** The paths a procedure may cover, with names, for its form. */
export async function pathOptions(t: { laserId: string | null; areaId: string | null }) {
	return db
		.select({ id: table.beamPath.id, name: table.beamPath.name, laserMaker: table.laser.maker, laserModel: table.laser.model })
		.from(table.beamPath)
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.where(and(eq(table.beamPath.retired, false), t.laserId ? eq(table.laser.id, t.laserId) : eq(table.laser.areaId, t.areaId!)))
		.orderBy(asc(table.beamPath.name));
}

// ---------------------------------------------------------------------------------------------
// Lists

export type ProcedureRow = {
	id: string;
	title: string;
	kind: string;
	labCode: string;
	laserId: string | null;
	areaId: string | null;
	targetLabel: string;
	ownerName: string;
	state: ProcedureState;
	current: { number: number; approvedOn: string; reviewBy: string } | null;
	draftState: 'draft' | 'submitted' | null;
	reviewNeededReason: string;
};

export type ListFilter = { laserId?: string; areaId?: string; labId?: string; includeAreaLasers?: boolean };

/** Procedures the person may read, with their state today; one query. */
export async function list(scope: Scope, today: string, filter: ListFilter = {}): Promise<ProcedureRow[]> {
	const where: SQL[] = [];
	const readable = inReadableLabs(scope, p.labId);
	if (readable) where.push(readable);
	if (filter.labId) where.push(eq(p.labId, filter.labId));
	if (filter.laserId) where.push(eq(p.laserId, filter.laserId));
	if (filter.areaId)
		where.push(filter.includeAreaLasers ? or(eq(p.areaId, filter.areaId), sql`${p.laserId} IN (SELECT id FROM laser WHERE area_id = ${filter.areaId})`)! : eq(p.areaId, filter.areaId));
	const current = db
		.select({ number: v.number, approvedAt: v.approvedAt, reviewBy: v.reviewBy })
		.from(v)
		.where(eq(v.procedureId, p.id))
		.orderBy(desc(v.number))
		.limit(1)
		.as('current');
	const rows = await db
		.select({
			id: p.id,
			title: p.title,
			kind: p.kind,
			labCode: table.lab.code,
			laserId: p.laserId,
			areaId: p.areaId,
			maker: table.laser.maker,
			model: table.laser.model,
			areaName: table.area.name,
			ownerName: owner.name,
			reviewNeeded: p.reviewNeeded,
			reviewNeededReason: p.reviewNeededReason,
			number: current.number,
			approvedAt: current.approvedAt,
			reviewBy: current.reviewBy,
			draftState: d.state
		})
		.from(p)
		.innerJoin(table.lab, eq(table.lab.id, p.labId))
		.innerJoin(owner, eq(owner.id, p.ownerId))
		.leftJoin(table.laser, eq(table.laser.id, p.laserId))
		.leftJoin(table.area, eq(table.area.id, p.areaId))
		.leftJoin(d, eq(d.procedureId, p.id))
		.leftJoinLateral(current, sql`true`)
		.where(where.length ? and(...where) : undefined)
		.orderBy(asc(table.lab.code), asc(p.title))
		.limit(1000);
	return rows.map((r) => {
		const cur = r.number !== null ? { number: r.number, approvedOn: dayOf(r.approvedAt!), reviewBy: r.reviewBy! } : null;
		return {
			id: r.id,
			title: r.title,
			kind: r.kind,
			labCode: r.labCode,
			laserId: r.laserId,
			areaId: r.areaId,
			targetLabel: r.areaName ?? laserLabel(r),
			ownerName: r.ownerName,
			state: procedureState({ reviewNeeded: r.reviewNeeded, current: cur, draftState: r.draftState }, today),
			current: cur,
			draftState: r.draftState,
			reviewNeededReason: r.reviewNeeded ? r.reviewNeededReason : ''
		};
	});
}

/** The current (latest approved) version of each procedure named. */
export async function currentVersions(tx: Tx | typeof db, procedureIds: string[]) {
	if (procedureIds.length === 0) return new Map<string, { id: string; number: number; approvedOn: string }>();
	const rows = await tx
		.selectDistinctOn([v.procedureId], { id: v.id, procedureId: v.procedureId, number: v.number, approvedAt: v.approvedAt })
		.from(v)
		.where(inArray(v.procedureId, procedureIds))
		.orderBy(v.procedureId, desc(v.number));
	return new Map(rows.map((r) => [r.procedureId, { id: r.id, number: r.number, approvedOn: dayOf(r.approvedAt) }]));
}

/**
 * Each person's latest sign-off per procedure and version, for the people and procedures named:
 * key `${userId} ${procedureId}` → the versions they signed (number → latest day).
 */
export async function signoffsOf(tx: Tx | typeof db, userIds: string[], procedureIds: string[]) {
	const out = new Map<string, Map<number, string>>();
	if (userIds.length === 0 || procedureIds.length === 0) return out;
	const s = table.procedureSignoff;
	const rows = await tx
		.select({ userId: s.userId, procedureId: s.procedureId, number: v.number, signedAt: sql<Date>`max(${s.signedAt})`.mapWith(s.signedAt) })
		.from(s)
		.innerJoin(v, eq(v.id, s.versionId))
		.where(and(inArray(s.userId, userIds), inArray(s.procedureId, procedureIds)))
		.groupBy(s.userId, s.procedureId, v.number);
	for (const r of rows) {
		const key = `${r.userId} ${r.procedureId}`;
		const m = out.get(key) ?? new Map<number, string>();
		m.set(r.number, dayOf(r.signedAt));
		out.set(key, m);
	}
	return out;
}

// ---------------------------------------------------------------------------------------------
// One procedure

async function loadProcedure(tx: Tx | typeof db, procedureId: string) {
	const [row] = await tx
		.select({ procedure: p, labCode: table.lab.code, labName: table.lab.name, maker: table.laser.maker, model: table.laser.model, laserClass: table.laser.laserClass, areaName: table.area.name, ownerName: owner.name })
		.from(p)
		.innerJoin(table.lab, eq(table.lab.id, p.labId))
		.innerJoin(owner, eq(owner.id, p.ownerId))
		.leftJoin(table.laser, eq(table.laser.id, p.laserId))
		.leftJoin(table.area, eq(table.area.id, p.areaId))
		.where(eq(p.id, procedureId));
	return row ?? null;
}

/** A procedure the person may read, or a 404 that looks the same for another lab's. */
async function readable(scope: Scope, procedureId: string) {
	if (!isUuid(procedureId)) return null;
	const row = await loadProcedure(db, procedureId);
	return row && canRead(scope, row.procedure.labId) ? row : null;
}

export type VersionEntry = {
	id: string | null;
	number: number;
	state: VersionState;
	changeNote: string;
	draftedByName: string;
	approvedByName: string | null;
	approvedAt: Date | null;
	reviewBy: string | null;
	approvalComment: string;
	submittedAt: Date | null;
	document: { id: string; fileName: string; size: number } | null;
};

export type SignerRow = { userId: string; name: string; state: SignoffState; signedOn: string | null; validUntil: string | null; signedEarlier: number | null };

export async function find(scope: Scope, procedureId: string, today: string) {
	const row = await readable(scope, procedureId);
	if (!row) return notFound('procedure');
	const proc = row.procedure;
	const drafter = aliasedTable(table.user, 'drafter');
	const approver = aliasedTable(table.user, 'approver');
	const [versions, draftRows, covered, interval] = await Promise.all([
		db
			.select({ v, drafter: drafter.name, approver: approver.name })
			.from(v)
			.innerJoin(drafter, eq(drafter.id, v.draftedBy))
			.innerJoin(approver, eq(approver.id, v.approvedBy))
			.where(eq(v.procedureId, proc.id))
			.orderBy(desc(v.number)),
		db
			.select({ d, editor: drafter.name })
			.from(d)
			.innerJoin(drafter, eq(drafter.id, d.updatedBy))
			.where(eq(d.procedureId, proc.id)),
		db
			.select({ id: table.beamPath.id, name: table.beamPath.name, reviewState: table.beamPath.reviewState, stale: table.beamPath.stale, draft: table.beamPath.draft, clearedAssessmentId: table.beamPath.clearedAssessmentId, retired: table.beamPath.retired })
			.from(table.procedurePath)
			.innerJoin(table.beamPath, eq(table.beamPath.id, table.procedurePath.pathId))
			.where(eq(table.procedurePath.procedureId, proc.id))
			.orderBy(asc(table.beamPath.name)),
		signoffInterval()
	]);
	const draft = draftRows[0] ?? null;
	const docIds = [...versions.map((x) => x.v.documentId), draft?.d.documentId].filter((x): x is string => !!x);
	const docs = docIds.length
		? await db.select({ id: table.document.id, fileName: table.document.fileName, size: table.document.size, sha256: table.document.sha256 }).from(table.document).where(inArray(table.document.id, docIds))
		: [];
	const docOf = (id: string | null) => {
		const doc = docs.find((x) => x.id === id);
		return doc ? { id: doc.id, fileName: doc.fileName, size: doc.size, sha256: doc.sha256 } : null;
	};
	const current = versions[0]?.v ?? null;
	const entries: VersionEntry[] = [];
	if (draft)
		entries.push({
			id: null,
			number: (current?.number ?? 0) + 1,
			state: draft.d.state,
			changeNote: draft.d.changeNote,
			draftedByName: draft.editor,
			approvedByName: null,
			approvedAt: null,
			reviewBy: null,
			approvalComment: '',
			submittedAt: draft.d.submittedAt,
			document: docOf(draft.d.documentId)
		});
	versions.forEach((x, i) =>
		entries.push({
			id: x.v.id,
			number: x.v.number,
			state: i === 0 ? 'approved' : 'superseded',
			changeNote: x.v.changeNote,
			draftedByName: x.drafter,
			approvedByName: x.approver,
			approvedAt: x.v.approvedAt,
			reviewBy: x.v.reviewBy,
			approvalComment: x.v.approvalComment,
			submittedAt: x.v.submittedAt,
			document: docOf(x.v.documentId)
		})
	);

	// Who must sign: the people whose authorisations (granted, not withdrawn) name this procedure.
	const a = table.authorisation;
	const mustSign = await db
		.selectDistinct({ userId: a.userId, name: table.user.name })
		.from(table.authorisationCondition)
		.innerJoin(a, eq(a.id, table.authorisationCondition.authorisationId))
		.innerJoin(table.user, eq(table.user.id, a.userId))
		.where(and(eq(table.authorisationCondition.procedureId, proc.id), eq(a.decision, 'granted'), eq(table.user.disabled, false)));
	const signerIds = [...new Set([...mustSign.map((m) => m.userId), scope.userId])];
	const signed = await signoffsOf(db, signerIds, [proc.id]);
	const stateOf = (userId: string) => {
		const mine = signed.get(`${userId} ${proc.id}`) ?? new Map<number, string>();
		const cur = current ? { number: current.number, approvedOn: dayOf(current.approvedAt) } : null;
		const signedOn = cur ? (mine.get(cur.number) ?? null) : null;
		const earlier = [...mine.keys()].filter((n) => !cur || n < cur.number);
		const s = signoffState({ current: cur, signedCurrentOn: signedOn }, interval.months, today);
		return { state: s.state, signedOn, validUntil: s.validUntil, signedEarlier: earlier.length ? Math.max(...earlier) : null };
	};
	const signers: SignerRow[] = mustSign.map((m) => ({ userId: m.userId, name: m.name, ...stateOf(m.userId) })).sort((x, y) => x.name.localeCompare(y.name));
	const mayWrite = canEdit(scope, proc.labId);
	const author = draft ? [draft.d.createdBy, draft.d.updatedBy, draft.d.submittedBy] : [];
	return {
		ok: true as const,
		procedure: proc,
		labCode: row.labCode,
		labName: row.labName,
		targetLabel: row.areaName ?? laserLabel(row),
		laserClass: row.laserClass,
		ownerName: row.ownerName,
		state: procedureState({ reviewNeeded: proc.reviewNeeded, current: current ? { reviewBy: current.reviewBy } : null, draftState: draft?.d.state ?? null }, today),
		current: current ? { ...current, html: procedureHtml(current.body), document: docOf(current.documentId) } : null,
		draft: draft ? { ...draft.d, editorName: draft.editor, html: procedureHtml(draft.d.body), document: docOf(draft.d.documentId) } : null,
		versions: entries,
		bodies: new Map<string, string>([...versions.map((x) => [String(x.v.number), x.v.body] as [string, string]), ...(draft ? [['draft', draft.d.body] as [string, string]] : [])]),
		covered,
		signers,
		mine: stateOf(scope.userId),
		intervalMonths: interval.months,
		can: {
			edit: mayWrite,
			sign: !!current && canRead(scope, proc.labId) && can(scope, 'workWithLasers'),
			approve: can(scope, 'approveProcedures') && draft?.d.state === 'submitted' && !author.includes(scope.userId),
			selfAuthored: can(scope, 'approveProcedures') && author.includes(scope.userId),
			confirm: can(scope, 'approveProcedures') && proc.reviewNeeded && !!current
		}
	};
}

export type ProcedureDetail = Extract<Awaited<ReturnType<typeof find>>, { ok: true }>;

/** The line diff between two of a procedure's texts ('draft' or a version number). */
export function compare(detail: ProcedureDetail, from: string, to: string): { from: string; to: string; blocks: DiffBlock[]; added: number; removed: number } | null {
	const a = detail.bodies.get(from);
	const b = detail.bodies.get(to);
	if (a === undefined || b === undefined || from === to) return null;
	return { from, to, ...lineDiff(a, b) };
}

// ---------------------------------------------------------------------------------------------
// Changes

export async function create(scope: Scope, form: NewProcedureForm): Promise<{ ok: true; id: string } | Failure> {
	return db.transaction(async (tx) => {
		const target = await resolveTarget(tx, form.target);
		if (!target) return fieldsNeedAttention({ target: 'Choose a laser in use or an area.' });
		if (!canEdit(scope, target.labId)) return fieldsNeedAttention({ target: 'Choose a laser or an area of a lab you are a member of.' });
		const coverable = await coverablePathIds(tx, target);
		const pathIds = [...new Set(form.pathIds)];
		if (pathIds.some((id) => !coverable.has(id))) return fieldsNeedAttention({ pathIds: 'Choose beam paths of this laser (or of the lasers in this area).' });
		const [created] = await tx
			.insert(p)
			.values({ labId: target.labId, laserId: target.laserId, areaId: target.areaId, kind: form.kind, title: form.title, ownerId: scope.userId })
			.returning();
		await tx.insert(d).values({ procedureId: created.id, body: form.body, createdBy: scope.userId, updatedBy: scope.userId });
		if (pathIds.length) await tx.insert(table.procedurePath).values(pathIds.map((pathId) => ({ procedureId: created.id, pathId })));
		await audit.record(tx, { actorId: scope.userId, action: 'procedure.create', entity: 'procedure', entityId: created.id, after: { ...created, pathIds, bodyLength: form.body.length } });
		return { ok: true as const, id: created.id };
	});
}

/** Lock the procedure row (every change to a procedure takes it first) and check the person may change it. */
async function lockForChange(tx: Tx, scope: Scope, procedureId: string) {
	if (!isUuid(procedureId)) return notFound('procedure');
	const [row] = await tx.select().from(p).where(eq(p.id, procedureId)).for('update');
	if (!row || !canRead(scope, row.labId)) return notFound('procedure');
	if (!canEdit(scope, row.labId)) return notYours('procedure');
	return { ok: true as const, procedure: row };
}

/** Save the draft of the next version; with version 0, start one from the current approved text. */
export async function saveDraft(scope: Scope, procedureId: string, form: DraftForm): Promise<{ ok: true } | Failure> {
	return db.transaction(async (tx) => {
		const locked = await lockForChange(tx, scope, procedureId);
		if (!locked.ok) return locked;
		const [draft] = await tx.select().from(d).where(eq(d.procedureId, procedureId));
		if (form.version === 0) {
			if (draft) return failure(409, 'A draft of the next version exists already. Nothing was saved; reload to edit it.');
			const [current] = await tx.select().from(v).where(eq(v.procedureId, procedureId)).orderBy(desc(v.number)).limit(1);
			const [created] = await tx
				.insert(d)
				.values({ procedureId, body: form.body, changeNote: form.changeNote, documentId: current?.documentId ?? null, createdBy: scope.userId, updatedBy: scope.userId })
				.returning();
			await audit.record(tx, { actorId: scope.userId, action: 'procedure.draft', entity: 'procedure', entityId: procedureId, after: { draftId: created.id, changeNote: form.changeNote, bodyLength: form.body.length } });
			return { ok: true } as const;
		}
		if (!draft) return failure(409, 'This draft was approved or removed meanwhile. Nothing was saved; reload to see the current version.');
		// Changing a submitted draft takes it back to draft: it must be submitted again.
		const [saved] = await tx
			.update(d)
			.set({ body: form.body, changeNote: form.changeNote, state: 'draft', submittedAt: null, submittedBy: null, updatedBy: scope.userId, updatedAt: new Date(), version: form.version + 1 })
			.where(and(eq(d.id, draft.id), eq(d.version, form.version)))
			.returning();
		if (!saved) return changedMeanwhile('draft');
		await audit.record(tx, { actorId: scope.userId, action: 'procedure.draft', entity: 'procedure', entityId: procedureId, before: { state: draft.state, bodyLength: draft.body.length }, after: { state: 'draft', changeNote: form.changeNote, bodyLength: form.body.length } });
		return { ok: true } as const;
	});
}

/** Attach a PDF to the draft (it replaces an earlier one; the file itself stays on record). */
export async function attachPdf(scope: Scope, procedureId: string, file: StoredUpload, version: number): Promise<{ ok: true } | Failure> {
	if (file.mediaType !== 'application/pdf') return fieldsNeedAttention({ pdf: `“${file.fileName}” is not a PDF file.` });
	return db.transaction(async (tx) => {
		const locked = await lockForChange(tx, scope, procedureId);
		if (!locked.ok) return locked;
		const [doc] = await tx.insert(table.document).values({ ...file, entity: 'procedure', entityId: procedureId, uploadedBy: scope.userId }).returning({ id: table.document.id });
		const [saved] = await tx
			.update(d)
			.set({ documentId: doc.id, state: 'draft', submittedAt: null, submittedBy: null, updatedBy: scope.userId, updatedAt: new Date(), version: version + 1 })
			.where(and(eq(d.procedureId, procedureId), eq(d.version, version)))
			.returning();
		if (!saved) return changedMeanwhile('draft');
		await audit.record(tx, { actorId: scope.userId, action: 'procedure.attach', entity: 'procedure', entityId: procedureId, after: { documentId: doc.id, fileName: file.fileName, size: file.size, sha256: file.sha256 } });
		return { ok: true } as const;
	});
}

export async function detachPdf(scope: Scope, procedureId: string, version: number): Promise<{ ok: true } | Failure> {
	return db.transaction(async (tx) => {
		const locked = await lockForChange(tx, scope, procedureId);
		if (!locked.ok) return locked;
		const [saved] = await tx
			.update(d)
			.set({ documentId: null, state: 'draft', submittedAt: null, submittedBy: null, updatedBy: scope.userId, updatedAt: new Date(), version: version + 1 })
			.where(and(eq(d.procedureId, procedureId), eq(d.version, version)))
			.returning();
		if (!saved) return changedMeanwhile('draft');
		await audit.record(tx, { actorId: scope.userId, action: 'procedure.detach', entity: 'procedure', entityId: procedureId, after: { documentId: null } });
		return { ok: true } as const;
	});
}

export async function submit(scope: Scope, procedureId: string, version: number, submitter: { id: string; name: string }): Promise<{ ok: true } | Failure> {
	return db.transaction(async (tx) => {
		const locked = await lockForChange(tx, scope, procedureId);
		if (!locked.ok) return locked;
		const [draft] = await tx.select().from(d).where(eq(d.procedureId, procedureId));
		if (!draft || draft.version !== version) return changedMeanwhile('draft');
		if (draft.state === 'submitted') return failure(409, 'This draft is submitted already.');
		if (!draft.body.trim() && !draft.documentId) return failure(400, 'Write the procedure or attach a PDF before submitting it.', { body: 'Write the procedure here, or attach a PDF.' });
		const now = new Date();
		await tx.update(d).set({ state: 'submitted', submittedAt: now, submittedBy: scope.userId, returnedComment: '', version: version + 1 }).where(eq(d.id, draft.id));
		const [{ n }] = await tx.select({ n: sql<number>`coalesce(max(${v.number}), 0)::int` }).from(v).where(eq(v.procedureId, procedureId));
		await safetyMail.procedureSubmitted(tx, procedureId, n + 1, submitter, now);
		await audit.record(tx, { actorId: scope.userId, action: 'procedure.submit', entity: 'procedure', entityId: procedureId, after: { number: n + 1 } });
		return { ok: true } as const;
	});
}

/** The officer approves the submitted draft: it becomes the next approved version, for good. */
export async function approve(scope: Scope, procedureId: string, form: ApproveForm, today: string): Promise<{ ok: true; number: number } | Failure> {
	if (!can(scope, 'approveProcedures')) return failure(403, 'Only a laser safety officer approves procedures.');
	if (form.reviewBy <= today) return fieldsNeedAttention({ reviewBy: 'The review-by date must be after today.' });
	if (form.reviewBy > formatISO(addYears(parseISO(today), 5), { representation: 'date' })) return fieldsNeedAttention({ reviewBy: 'Review a procedure at least every five years.' });
	return db.transaction(async (tx) => {
		const locked = await lockForChange(tx, scope, procedureId);
		if (!locked.ok) return locked;
		const [draft] = await tx.select().from(d).where(eq(d.procedureId, procedureId));
		if (!draft || draft.version !== form.version) return failure(409, 'The draft changed while you were reading it. Nothing was approved; read the new text, then decide.');
		if (draft.state !== 'submitted') return failure(409, 'This draft has not been submitted for approval.');
		if ([draft.createdBy, draft.updatedBy, draft.submittedBy].includes(scope.userId)) return failure(403, 'You wrote or submitted this draft: another officer must approve it.');
		const [{ n }] = await tx.select({ n: sql<number>`coalesce(max(${v.number}), 0)::int` }).from(v).where(eq(v.procedureId, procedureId));
		const [doc] = draft.documentId ? await tx.select({ sha256: table.document.sha256 }).from(table.document).where(eq(table.document.id, draft.documentId)) : [];
		const [approved] = await tx
			.insert(v)
			.values({
				procedureId,
				number: n + 1,
				body: draft.body,
				documentId: draft.documentId,
				documentSha256: doc?.sha256 ?? null,
				changeNote: draft.changeNote,
				draftedBy: draft.updatedBy,
				submittedBy: draft.submittedBy,
				submittedAt: draft.submittedAt,
				approvedBy: scope.userId,
				reviewBy: form.reviewBy,
				approvalComment: form.comment
			})
			.returning();
		await tx.delete(d).where(eq(d.id, draft.id));
		// A new approval answers an open "to be reviewed".
		await tx.update(p).set({ reviewNeeded: false, reviewNeededReason: '', reviewNeededSince: null, version: locked.procedure.version + 1, updatedAt: new Date() }).where(eq(p.id, procedureId));
		await audit.record(tx, { actorId: scope.userId, action: 'procedure.approve', entity: 'procedure', entityId: procedureId, before: { reviewNeeded: locked.procedure.reviewNeeded }, after: { versionId: approved.id, number: approved.number, reviewBy: form.reviewBy, comment: form.comment } });
		return { ok: true as const, number: approved.number };
	});
}

/** The officer sends a submitted draft back with a comment. */
export async function returnDraft(scope: Scope, procedureId: string, comment: string, version: number): Promise<{ ok: true } | Failure> {
	if (!can(scope, 'approveProcedures')) return failure(403, 'Only a laser safety officer sends a draft back.');
	return db.transaction(async (tx) => {
		const locked = await lockForChange(tx, scope, procedureId);
		if (!locked.ok) return locked;
		const [saved] = await tx
			.update(d)
			.set({ state: 'draft', returnedComment: comment, submittedAt: null, submittedBy: null, version: version + 1 })
			.where(and(eq(d.procedureId, procedureId), eq(d.version, version), eq(d.state, 'submitted')))
			.returning();
		if (!saved) return failure(409, 'The draft changed or is no longer submitted. Nothing was saved; reload the page.');
		await audit.record(tx, { actorId: scope.userId, action: 'procedure.return', entity: 'procedure', entityId: procedureId, after: { comment } });
		return { ok: true } as const;
	});
}

/** "I have read and understood" the current approved version. */
export async function sign(scope: Scope, procedureId: string, versionId: string, today: string): Promise<{ ok: true; signedAt: Date } | Failure> {
	if (!can(scope, 'workWithLasers')) return failure(403, 'Only the people who work with lasers sign procedures.');
	if (!isUuid(procedureId)) return notFound('procedure');
	return db.transaction(async (tx) => {
		const [proc] = await tx.select().from(p).where(eq(p.id, procedureId)).for('share');
		if (!proc || !canRead(scope, proc.labId)) return notFound('procedure');
		const [current] = await tx.select().from(v).where(eq(v.procedureId, procedureId)).orderBy(desc(v.number)).limit(1);
		if (!current) return failure(409, 'This procedure has no approved version to sign yet.');
		if (current.id !== versionId) return failure(409, `Version ${current.number} was approved while you were reading. Nothing was signed; read the new version, then sign it.`);
		const [last] = await tx
			.select({ signedAt: table.procedureSignoff.signedAt })
			.from(table.procedureSignoff)
			.where(and(eq(table.procedureSignoff.versionId, current.id), eq(table.procedureSignoff.userId, scope.userId)))
			.orderBy(desc(table.procedureSignoff.signedAt))
			.limit(1);
		const { months } = await signoffInterval(tx);
		if (last) {
			const s = signoffState({ current: { number: current.number, approvedOn: dayOf(current.approvedAt) }, signedCurrentOn: dayOf(last.signedAt) }, months, today);
			if (s.state === 'signed') return failure(409, `You signed version ${current.number} on ${dayOf(last.signedAt)}; the sign-off holds until ${s.validUntil}.`);
		}
		const [row] = await tx.insert(table.procedureSignoff).values({ versionId: current.id, procedureId, userId: scope.userId }).returning();
		await audit.record(tx, { actorId: scope.userId, action: 'procedure.sign', entity: 'procedure', entityId: procedureId, after: { signoffId: row.id, versionId: current.id, number: current.number, signedAt: row.signedAt } });
		return { ok: true as const, signedAt: row.signedAt };
	});
}

/** Set the beam paths a procedure covers. */
export async function cover(scope: Scope, procedureId: string, pathIds: string[], version: number): Promise<{ ok: true } | Failure> {
	return db.transaction(async (tx) => {
		const locked = await lockForChange(tx, scope, procedureId);
		if (!locked.ok) return locked;
		if (locked.procedure.version !== version) return changedMeanwhile('procedure');
		const ids = [...new Set(pathIds)];
		const coverable = await coverablePathIds(tx, locked.procedure);
		if (ids.some((id) => !coverable.has(id))) return fieldsNeedAttention({ pathIds: 'Choose beam paths of this laser (or of the lasers in this area).' });
		const before = await tx.select({ pathId: table.procedurePath.pathId }).from(table.procedurePath).where(eq(table.procedurePath.procedureId, procedureId));
		await tx.delete(table.procedurePath).where(eq(table.procedurePath.procedureId, procedureId));
		if (ids.length) await tx.insert(table.procedurePath).values(ids.map((pathId) => ({ procedureId, pathId })));
		await tx.update(p).set({ version: version + 1, updatedAt: new Date() }).where(eq(p.id, procedureId));
		await audit.record(tx, { actorId: scope.userId, action: 'procedure.cover', entity: 'procedure', entityId: procedureId, before: { pathIds: before.map((b) => b.pathId) }, after: { pathIds: ids } });
		return { ok: true } as const;
	});
}

/** The officer confirms that the approved version still matches after a covered path changed. */
export async function confirmCurrent(scope: Scope, procedureId: string, note: string, version: number): Promise<{ ok: true } | Failure> {
	if (!can(scope, 'approveProcedures')) return failure(403, 'Only a laser safety officer confirms a procedure.');
	return db.transaction(async (tx) => {
		const locked = await lockForChange(tx, scope, procedureId);
		if (!locked.ok) return locked;
		const [saved] = await tx
			.update(p)
			.set({ reviewNeeded: false, reviewNeededReason: '', reviewNeededSince: null, version: version + 1, updatedAt: new Date() })
			.where(and(eq(p.id, procedureId), eq(p.version, version), eq(p.reviewNeeded, true)))
			.returning();
		if (!saved) return changedMeanwhile('procedure');
		await audit.record(tx, { actorId: scope.userId, action: 'procedure.confirm', entity: 'procedure', entityId: procedureId, before: { reviewNeeded: true, reason: locked.procedure.reviewNeededReason }, after: { reviewNeeded: false, note } });
		return { ok: true } as const;
	});
}

/**
 * Called where a beam path's review reopens (reviews.afterSnapshot), inside that transaction: every
 * procedure covering the path is marked to be reviewed, and its owner and the officers are told.
 * One already marked is left alone (they were told).
 */
export async function pathReviewReopened(tx: Tx, path: { id: string; name: string }): Promise<void> {
	const covering = await tx
		.select({ id: p.id })
		.from(table.procedurePath)
		.innerJoin(p, eq(p.id, table.procedurePath.procedureId))
		.where(and(eq(table.procedurePath.pathId, path.id), eq(p.reviewNeeded, false)));
	for (const { id } of covering) {
		const since = new Date();
		const reason = `The beam path “${path.name}” changed on ${dayOf(since)} and went back to review.`;
		const [marked] = await tx
			.update(p)
			.set({ reviewNeeded: true, reviewNeededReason: reason, reviewNeededSince: since, version: sql`${p.version} + 1`, updatedAt: since })
			.where(and(eq(p.id, id), eq(p.reviewNeeded, false)))
			.returning({ id: p.id });
		if (!marked) continue;
		await safetyMail.procedureToReview(tx, id, path.name, since);
		await audit.record(tx, { actorId: null, action: 'procedure.review_needed', entity: 'procedure', entityId: id, after: { reviewNeeded: true, pathId: path.id, reason } });
	}
}

/** A procedure's PDF, if the person may read the procedure. */
export async function documentFor(scope: Scope, documentId: string) {
	if (!isUuid(documentId)) return null;
	const [doc] = await db.select().from(table.document).where(eq(table.document.id, documentId));
	if (!doc || doc.entity !== 'procedure') return null;
	return (await readable(scope, doc.entityId)) ? doc : null;
}

/** Procedures whose approval is older than its review-by date or close to it, for the reminders. */
export async function reviewDue(untilDay: string) {
	const current = db
		.selectDistinctOn([v.procedureId], { procedureId: v.procedureId, number: v.number, reviewBy: v.reviewBy })
		.from(v)
		.orderBy(v.procedureId, desc(v.number))
		.as('current');
	return db
		.select({ procedureId: current.procedureId, number: current.number, reviewBy: current.reviewBy, ownerId: p.ownerId })
		.from(current)
		.innerJoin(p, eq(p.id, current.procedureId))
		.where(sql`${current.reviewBy} <= ${untilDay}`);
}
