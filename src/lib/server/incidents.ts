// Incidents and near misses: the reporter's report (a draft until sent), the officer's
// investigation, linked records, corrective actions, closing, and what each person may see.
//
// Who sees what (every answer below comes through `shape`, never a raw row):
//   officer    every sent report (and their own drafts), with every field, reporter included
//   manager    every sent report; the reporter's name unless they asked to stay anonymous
//   reporter   their own reports, drafts included, without the officers' names
//   researcher the sent near misses of their own labs, with every name removed
//   anyone else: nothing (404, exactly like an unknown id)
// The medical follow-up is in medical.ts and reaches officers only. Every view that carries
// personal fields (who reported, people involved) leaves an audit row.
import { and, asc, desc, eq, inArray, isNull, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { db, type Tx } from '$lib/server/db';
import { writeCsv } from '$lib/server/csv';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { canRead, type Scope, inReadableLabs } from '$lib/server/auth/scope';
import { changedMeanwhile, failure, fieldsNeedAttention, notFound, type Failure } from '$lib/server/http/failure';
import { isUuid } from '$lib/server/db/ids';
import { nudge, queues } from '$lib/server/jobs/queues';
import { readMailConfig } from '$lib/server/mail/config';
import * as outbox from '$lib/server/mail/outbox';
import * as templates from '$lib/server/mail/templates';
import * as suspensions from '$lib/server/suspensions';
import type { StoredUpload } from '$lib/server/uploads';
import { actionState, kindWords, titleOf, type ActionState, type ContributingFactor, type IncidentKind, type IncidentState, type MedicalAttention, type Severity } from '$lib/incidentWords';
import type { ActionForm, CloseActionForm, CloseIncidentForm, InvestigationForm, ReportForm } from '$lib/schemas/incidents';
import { can } from '$lib/abilities';

type Row = table.Incident;
export type ViewLevel = 'full' | 'manager' | 'own' | 'redacted';

/** How much of an incident this person may see, or null when nothing. */
export function levelFor(scope: Scope, row: Pick<Row, 'state' | 'reportedBy' | 'labId' | 'kind'>): ViewLevel | null {
	const own = row.reportedBy === scope.userId;
	if (row.state === 'draft') return own ? (scope.role === 'officer' ? 'full' : 'own') : null;
	if (scope.role === 'officer') return 'full';
	if (scope.role === 'manager') return 'manager';
	if (own) return 'own';
	if (scope.role === 'researcher' && row.kind === 'near_miss' && row.labId && canRead(scope, row.labId)) return 'redacted';
	return null;
}

/** The rows a person may see at all, as a condition (the same rule as levelFor). */
function visible(scope: Scope): SQL {
	const i = table.incident;
	const own = eq(i.reportedBy, scope.userId);
	if (scope.role === 'officer' || scope.role === 'manager') return or(own, sql`${i.state} <> 'draft'`)!;
	if (scope.role === 'researcher' && scope.labIds !== 'all' && scope.labIds.length)
		return or(own, and(sql`${i.state} <> 'draft'`, eq(i.kind, 'near_miss'), inArray(i.labId, scope.labIds)))!;
	return own;
}

// ---------------------------------------------------------------------------------------------
// Where it happened: the choices of the report form

export type Places = {
	areas: { id: string; name: string; labId: string; labCode: string }[];
	lasers: { id: string; name: string; labId: string; areaId: string | null }[];
	paths: { id: string; name: string; laserId: string }[];
};

/**
 * Areas of every lab (anyone may witness something anywhere); lasers and paths of the labs the
 * person reads (the register of other labs stays theirs).
 */
export async function places(scope: Scope): Promise<Places> {
	const labFilter = inReadableLabs(scope, table.laser.labId);
	const [areas, lasers, paths] = await Promise.all([
		db
			.select({ id: table.area.id, name: table.area.name, labId: table.area.labId, labCode: table.lab.code })
			.from(table.area)
			.innerJoin(table.lab, eq(table.lab.id, table.area.labId))
			.orderBy(asc(table.area.name)),
		db
			.select({ id: table.laser.id, maker: table.laser.maker, model: table.laser.model, labId: table.laser.labId, areaId: table.laser.areaId })
			.from(table.laser)
			.where(and(sql`${table.laser.status} <> 'retired'`, labFilter))
			.orderBy(asc(table.laser.maker), asc(table.laser.model)),
		db
			.select({ id: table.beamPath.id, name: table.beamPath.name, laserId: table.beamPath.laserId })
			.from(table.beamPath)
			.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
			.where(and(eq(table.beamPath.retired, false), labFilter))
			.orderBy(asc(table.beamPath.name))
	]);
	return { areas, lasers: lasers.map(({ maker, model, ...l }) => ({ ...l, name: `${maker} ${model}` })), paths };
}

/** Where a report says it happened, checked against the register; the lab follows from it. */
async function resolvePlace(tx: Tx, scope: Scope, f: ReportForm): Promise<{ ok: true; labId: string | null; areaId: string | null; laserId: string | null; pathId: string | null } | Failure> {
	const fields: Record<string, string> = {};
	let areaId = f.areaId || null;
	let laserId = f.laserId || null;
	const pathId = f.pathId || null;
	let labId: string | null = null;
	if (pathId) {
		const [p] = await tx.select({ laserId: table.beamPath.laserId }).from(table.beamPath).where(eq(table.beamPath.id, pathId));
		if (!p) fields.pathId = 'Unknown beam path.';
		else if (laserId && p.laserId !== laserId) fields.pathId = 'This beam path belongs to another laser.';
		else laserId = p.laserId;
	}
	if (laserId) {
		const [l] = await tx.select({ labId: table.laser.labId, areaId: table.laser.areaId }).from(table.laser).where(eq(table.laser.id, laserId));
		if (!l || !canRead(scope, l.labId)) fields.laserId = 'Unknown laser.';
		else {
			labId = l.labId;
			areaId ??= l.areaId;
		}
	}
	if (areaId) {
		const [a] = await tx.select({ labId: table.area.labId }).from(table.area).where(eq(table.area.id, areaId));
		if (!a) fields.areaId = 'Unknown area.';
		else if (labId && a.labId !== labId) fields.areaId = 'This laser belongs to a lab of another area: choose the laser’s area, or leave the area empty.';
		else labId = a.labId;
	}
	if (Object.keys(fields).length) return fieldsNeedAttention(fields);
	return { ok: true, labId, areaId, laserId, pathId };
}

// ---------------------------------------------------------------------------------------------
// Reporting

/**
 * Save a report: a new one (id null) or the reporter's own draft. `intent: 'submit'` sends it:
 * from then on it is the officers' to investigate. A suspected eye exposure mails every officer at
 * once, in the same transaction (the ledger makes it once per officer, whatever happens next).
 */
export async function saveReport(scope: Scope, incidentId: string | null, f: ReportForm, files: StoredUpload[] = []): Promise<{ ok: true; id: string; submitted: boolean } | Failure> {
	if (incidentId !== null && !isUuid(incidentId)) return notFound('report');
	const outcome = await db.transaction(async (tx) => {
		let before: Row | undefined;
		if (incidentId) {
			[before] = await tx.select().from(table.incident).where(eq(table.incident.id, incidentId)).for('update');
			if (!before || before.reportedBy !== scope.userId) return notFound('report');
			if (before.state !== 'draft') return failure(409, 'This report was sent already; the laser safety officer has it now.');
			if (before.version !== f.version) return changedMeanwhile('report');
		}
		const place = await resolvePlace(tx, scope, f);
		if (!place.ok) return place;
		const submit = f.intent === 'submit';
		if (submit && !place.labId) return fieldsNeedAttention({ areaId: 'Choose the area or the laser.' });
		const values = {
			kind: f.kind || null,
			occurredAt: f.occurredAt || null,
			labId: place.labId,
			areaId: place.areaId,
			laserId: place.laserId,
			pathId: place.pathId,
			locationNotes: f.locationNotes,
			description: f.description,
			peopleInvolved: f.peopleInvolved,
			medicalAttention: f.medicalAttention,
			anonymous: f.anonymous,
			state: (submit ? 'reported' : 'draft') as IncidentState,
			submittedAt: submit ? new Date() : null,
			updatedAt: new Date()
		};
		let row: Row;
		if (before) {
			[row] = await tx
				.update(table.incident)
				.set({ ...values, version: before.version + 1 })
				.where(and(eq(table.incident.id, before.id), eq(table.incident.version, before.version)))
				.returning();
			if (!row) return changedMeanwhile('report');
		} else [row] = await tx.insert(table.incident).values({ ...values, reportedBy: scope.userId }).returning();
		const docs = files.length
			? await tx
					.insert(table.document)
					.values(files.map((file) => ({ ...file, entity: 'incident', entityId: row.id, uploadedBy: scope.userId })))
					.returning({ id: table.document.id })
			: [];
		await audit.record(tx, {
			actorId: scope.userId,
			action: submit ? 'incident.submit' : 'incident.draft',
			entity: 'incident',
			entityId: row.id,
			before: before ? { state: before.state, version: before.version } : null,
			after: { state: row.state, kind: row.kind, labId: row.labId, anonymous: row.anonymous, photos: docs.map((d) => d.id) }
		});
		if (submit && row.kind === 'eye_exposure') await enqueueEyeExposureMails(tx, row);
		return { ok: true as const, id: row.id, submitted: submit };
	});
	if (outcome.ok && outcome.submitted) await nudge(queues.mailDeliver);
	return outcome;
}

/** The officers' immediate mail: no names in it (the ledger and mailboxes are read by others too). */
async function enqueueEyeExposureMails(tx: Tx, row: Row) {
	const officers = await tx
		.select({ id: table.user.id, email: table.user.email })
		.from(table.user)
		.where(and(eq(table.user.role, 'officer'), eq(table.user.disabled, false)));
	if (officers.length === 0) return;
	const [where] = await tx
		.select({ areaName: table.area.name, labName: table.lab.name })
		.from(table.lab)
		.leftJoin(table.area, row.areaId ? eq(table.area.id, row.areaId) : sql`false`)
		.where(eq(table.lab.id, row.labId!));
	const [laser] = row.laserId ? await tx.select({ maker: table.laser.maker, model: table.laser.model }).from(table.laser).where(eq(table.laser.id, row.laserId)) : [];
	const { appUrl } = readMailConfig();
	const reason = 'You are a laser safety officer, and someone reported a suspected eye exposure. This mail goes out at once, whatever your digest setting.';
	const body = templates.eyeExposureReported({
		appUrl,
		incidentId: row.id,
		number: row.number,
		occurredAt: row.occurredAt!,
		where: [where?.areaName, where?.labName].filter(Boolean).join(', ') || 'not recorded',
		laser: laser ? `${laser.maker} ${laser.model}` : 'not recorded',
		medicalAttention: row.medicalAttention,
		reason
	});
	await outbox.enqueue(
		tx,
		officers.map((o) => ({ kind: 'incident.eye_exposure' as const, recordId: row.id, dueKey: 'report', step: 'once', recipientId: o.id, recipientEmail: o.email, subject: body.subject, text: body.text, html: body.html, reason }))
	);
}

/** Photos of a report: its reporter, or an officer. */
export async function attachPhotos(scope: Scope, incidentId: string, files: StoredUpload[]): Promise<{ ok: true; count: number } | Failure> {
	if (!isUuid(incidentId)) return notFound('report');
	const [row] = await db.select().from(table.incident).where(eq(table.incident.id, incidentId));
	if (!row || !levelFor(scope, row)) return notFound('report');
	if (row.reportedBy !== scope.userId && !can(scope, 'investigateIncidents')) return failure(403, 'Only the reporter or a laser safety officer adds photos to a report.');
	if (files.length === 0) return fieldsNeedAttention({ photos: 'Choose a file to upload.' });
	await db.transaction(async (tx) => {
		const docs = await tx
			.insert(table.document)
			.values(files.map((f) => ({ ...f, entity: 'incident', entityId: incidentId, uploadedBy: scope.userId })))
			.returning({ id: table.document.id, fileName: table.document.fileName });
		await audit.record(tx, { actorId: scope.userId, action: 'incident.attach', entity: 'incident', entityId: incidentId, after: docs });
	});
	return { ok: true, count: files.length };
}

// ---------------------------------------------------------------------------------------------
// Reading: lists and one incident, shaped for the person

export type IncidentListItem = {
	id: string;
	number: number;
	title: string;
	state: IncidentState;
	kind: IncidentKind | null;
	severity: Severity | null;
	occurredAt: string | null;
	labCode: string | null;
	areaName: string | null;
	laserName: string | null;
	openActions: number;
	overdueActions: number;
	totalActions: number;
	factors: ContributingFactor[];
	own: boolean;
};

export type ListFilter = { state?: IncidentState | 'open'; kind?: IncidentKind };

/** The incidents a person may see, newest first; no personal field in any row. */
export async function list(scope: Scope, today: string, filter: ListFilter = {}, limit = 500): Promise<IncidentListItem[]> {
	const i = table.incident;
	const where: SQL[] = [visible(scope)];
	if (filter.state === 'open') where.push(sql`${i.state} IN ('reported', 'investigating')`);
	else if (filter.state) where.push(eq(i.state, filter.state));
	if (filter.kind) where.push(eq(i.kind, filter.kind));
	const actions = db
		.select({
			incidentId: table.correctiveAction.incidentId,
			total: sql<number>`count(*)::int`.as('total'),
			open: sql<number>`count(*) FILTER (WHERE ${table.correctiveAction.closedAt} IS NULL)::int`.as('open'),
			overdue: sql<number>`count(*) FILTER (WHERE ${table.correctiveAction.closedAt} IS NULL AND ${table.correctiveAction.dueOn} < ${today})::int`.as('overdue')
		})
		.from(table.correctiveAction)
		.groupBy(table.correctiveAction.incidentId)
		.as('actions');
	const rows = await db
		.select({
			id: i.id,
			number: i.number,
			description: i.description,
			state: i.state,
			kind: i.kind,
			severity: i.severity,
			occurredAt: i.occurredAt,
			labCode: table.lab.code,
			areaName: table.area.name,
			maker: table.laser.maker,
			model: table.laser.model,
			factors: i.factors,
			reportedBy: i.reportedBy,
			total: sql<number>`coalesce(${actions.total}, 0)`,
			open: sql<number>`coalesce(${actions.open}, 0)`,
			overdue: sql<number>`coalesce(${actions.overdue}, 0)`
		})
		.from(i)
		.leftJoin(table.lab, eq(table.lab.id, i.labId))
		.leftJoin(table.area, eq(table.area.id, i.areaId))
		.leftJoin(table.laser, eq(table.laser.id, i.laserId))
		.leftJoin(actions, eq(actions.incidentId, i.id))
		.where(and(...where))
		.orderBy(desc(sql`coalesce(${i.occurredAt}, ${i.createdAt}::timestamp)`), desc(i.number))
		.limit(limit);
	return rows.map((r) => ({
		id: r.id,
		number: r.number,
		title: titleOf(r.description),
		state: r.state,
		kind: r.kind,
		severity: r.severity,
		occurredAt: r.occurredAt,
		labCode: r.labCode,
		areaName: r.areaName,
		laserName: r.maker ? `${r.maker} ${r.model}` : null,
		openActions: r.open,
		overdueActions: r.overdue,
		totalActions: r.total,
		factors: r.factors,
		own: r.reportedBy === scope.userId
	}));
}

const reporterUser = alias(table.user, 'reporter_user');
const investigatorUser = alias(table.user, 'investigator_user');
const closerUser = alias(table.user, 'closer_user');

export type ActionView = {
	id: string;
	description: string;
	/** Null where names are removed. */
	ownerName: string | null;
	ownerIsYou: boolean;
	dueOn: string;
	state: ActionState;
	evidence: string;
	closedAt: string | null;
	version: number;
	photos: { id: string; mediaType: string; label: string }[];
};

export type IncidentView = {
	level: ViewLevel;
	id: string;
	number: number;
	title: string;
	state: IncidentState;
	kind: IncidentKind | null;
	occurredAt: string | null;
	lab: { id: string; code: string; name: string } | null;
	area: { id: string; name: string } | null;
	laser: { id: string; name: string } | null;
	path: { id: string; name: string } | null;
	locationNotes: string;
	description: string;
	medicalAttention: MedicalAttention;
	submittedAt: string | null;
	/** Personal fields: null where this person may not see them. */
	reporter: { name: string; anonymous: boolean } | null;
	/** True when the reporter asked to stay anonymous and this person is not an officer. */
	reporterWithheld: boolean;
	peopleInvolved: string | null;
	severity: Severity | null;
	causes: string;
	factors: ContributingFactor[];
	investigatedByName: string | null;
	investigatedAt: string | null;
	closedAt: string | null;
	closedByName: string | null;
	closingNote: string;
	links: { paths: { id: string; name: string }[]; eyewear: { id: string; label: string }[]; procedures: string[] };
	actions: ActionView[];
	photos: { id: string; mediaType: string; label: string }[];
	suspensions: Awaited<ReturnType<typeof suspensions.history>>;
	version: number;
	/** What this person can do here. */
	can: { edit: boolean; investigate: boolean; addPhotos: boolean };
};

/**
 * One incident as this person may see it, or a 404 when they may not. A view that carries
 * personal fields is written to the audit log (`viewer` says through which door: page or API).
 */
export async function find(scope: Scope, incidentId: string, today: string, viewer: 'page' | 'api' = 'page'): Promise<{ ok: true; incident: IncidentView } | Failure> {
	if (!isUuid(incidentId)) return notFound('incident');
	const i = table.incident;
	const [r] = await db
		.select({
			i,
			lab: { id: table.lab.id, code: table.lab.code, name: table.lab.name },
			areaName: table.area.name,
			maker: table.laser.maker,
			model: table.laser.model,
			pathName: table.beamPath.name,
			reporterName: reporterUser.name,
			investigatorName: investigatorUser.name,
			closerName: closerUser.name
		})
		.from(i)
		.leftJoin(table.lab, eq(table.lab.id, i.labId))
		.leftJoin(table.area, eq(table.area.id, i.areaId))
		.leftJoin(table.laser, eq(table.laser.id, i.laserId))
		.leftJoin(table.beamPath, eq(table.beamPath.id, i.pathId))
		.innerJoin(reporterUser, eq(reporterUser.id, i.reportedBy))
		.leftJoin(investigatorUser, eq(investigatorUser.id, i.investigatedBy))
		.leftJoin(closerUser, eq(closerUser.id, i.closedBy))
		.where(eq(i.id, incidentId));
	if (!r) return notFound('incident');
	const level = levelFor(scope, r.i);
	if (!level) return notFound('incident');
	const names = level === 'full' || level === 'manager';
	const owner = alias(table.user, 'owner_user');
	const [links, actionRows, docs, susp] = await Promise.all([
		db
			.select({ link: table.incidentLink, pathName: table.beamPath.name, eyewearLabel: table.eyewear.label })
			.from(table.incidentLink)
			.leftJoin(table.beamPath, eq(table.beamPath.id, table.incidentLink.pathId))
			.leftJoin(table.eyewear, eq(table.eyewear.id, table.incidentLink.eyewearId))
			.where(eq(table.incidentLink.incidentId, incidentId)),
		db
			.select({ a: table.correctiveAction, ownerName: owner.name })
			.from(table.correctiveAction)
			.innerJoin(owner, eq(owner.id, table.correctiveAction.ownerId))
			.where(eq(table.correctiveAction.incidentId, incidentId))
			.orderBy(asc(table.correctiveAction.dueOn), asc(table.correctiveAction.createdAt)),
		db
			.select({ id: table.document.id, entity: table.document.entity, entityId: table.document.entityId, mediaType: table.document.mediaType, fileName: table.document.fileName })
			.from(table.document)
			.where(
				or(
					and(eq(table.document.entity, 'incident'), eq(table.document.entityId, incidentId)),
					and(eq(table.document.entity, 'corrective_action'), sql`${table.document.entityId} IN (SELECT id::text FROM corrective_action WHERE incident_id = ${incidentId})`)
				)
			)
			.orderBy(asc(table.document.createdAt)),
		r.i.laserId ? suspensions.history([r.i.laserId]) : Promise.resolve([])
	]);
	// File names are the uploader's words and may name people: only officers see them.
	const photoOf = (d: (typeof docs)[number], n: number) => ({ id: d.id, mediaType: d.mediaType, label: level === 'full' ? d.fileName : `Photo ${n}` });
	const incidentDocs = docs.filter((d) => d.entity === 'incident');
	const shaped: IncidentView = {
		level,
		id: r.i.id,
		number: r.i.number,
		title: titleOf(r.i.description),
		state: r.i.state,
		kind: r.i.kind,
		occurredAt: r.i.occurredAt,
		lab: r.lab?.id ? r.lab : null,
		area: r.i.areaId && r.areaName ? { id: r.i.areaId, name: r.areaName } : null,
		laser: r.i.laserId && r.maker ? { id: r.i.laserId, name: `${r.maker} ${r.model}` } : null,
		path: r.i.pathId && r.pathName ? { id: r.i.pathId, name: r.pathName } : null,
		locationNotes: r.i.locationNotes,
		description: r.i.description,
		medicalAttention: r.i.medicalAttention,
		submittedAt: r.i.submittedAt?.toISOString() ?? null,
		reporter:
			level === 'full' || level === 'own' || (level === 'manager' && !r.i.anonymous) ? { name: r.reporterName, anonymous: r.i.anonymous } : null,
		reporterWithheld: r.i.anonymous && level !== 'full' && level !== 'own',
		peopleInvolved: level === 'redacted' ? null : r.i.peopleInvolved,
		severity: r.i.severity,
		causes: r.i.causes,
		factors: r.i.factors,
		investigatedByName: names ? r.investigatorName : null,
		investigatedAt: r.i.investigatedAt?.toISOString() ?? null,
		closedAt: r.i.closedAt?.toISOString() ?? null,
		closedByName: names ? r.closerName : null,
		closingNote: r.i.closingNote,
		links: {
			paths: links
				.filter((l) => l.link.kind === 'path' && l.pathName)
				.map((l) => ({ id: l.link.pathId!, name: l.pathName! }))
				.sort((a, b) => a.name.localeCompare(b.name)),
			eyewear: links
				.filter((l) => l.link.kind === 'eyewear' && l.eyewearLabel)
				.map((l) => ({ id: l.link.eyewearId!, label: l.eyewearLabel! }))
				.sort((a, b) => a.label.localeCompare(b.label)),
			procedures: links
				.filter((l) => l.link.kind === 'procedure')
				.map((l) => l.link.reference!)
				.sort((a, b) => a.localeCompare(b))
		},
		actions: actionRows.map(({ a, ownerName }) => ({
			id: a.id,
			description: a.description,
			ownerName: names ? ownerName : null,
			ownerIsYou: a.ownerId === scope.userId,
			dueOn: a.dueOn,
			state: actionState(a.dueOn, a.closedAt, today),
			evidence: a.evidence,
			closedAt: a.closedAt?.toISOString() ?? null,
			version: a.version,
			photos: docs.filter((d) => d.entity === 'corrective_action' && d.entityId === a.id).map((d, n) => photoOf(d, n + 1))
		})),
		photos: incidentDocs.map((d, n) => photoOf(d, n + 1)),
		suspensions: names ? susp : susp.map((s) => ({ ...s, suspendedByName: '', liftedByName: null })),
		version: r.i.version,
		can: {
			edit: r.i.state === 'draft' && r.i.reportedBy === scope.userId,
			investigate: can(scope, 'investigateIncidents') && r.i.state !== 'draft',
			addPhotos: can(scope, 'investigateIncidents') && r.i.state !== 'closed'
		}
	};
	if (shaped.reporter || shaped.peopleInvolved !== null)
		await db.transaction((tx) =>
			audit.record(tx, { actorId: scope.userId, action: 'incident.view_personal', entity: 'incident', entityId: incidentId, after: { level, via: viewer } })
		);
	return { ok: true, incident: shaped };
}

/** How much of this incident the person may see (null: nothing, or no such incident). */
export async function levelOf(scope: Scope, incidentId: string): Promise<ViewLevel | null> {
	if (!isUuid(incidentId)) return null;
	const [row] = await db.select().from(table.incident).where(eq(table.incident.id, incidentId));
	return row ? levelFor(scope, row) : null;
}

/** The raw row of a draft, for the reporter's edit form (nobody else). */
export async function draftOf(scope: Scope, incidentId: string): Promise<Row | null> {
	if (!isUuid(incidentId)) return null;
	const [row] = await db.select().from(table.incident).where(eq(table.incident.id, incidentId));
	return row && row.reportedBy === scope.userId && row.state === 'draft' ? row : null;
}

// ---------------------------------------------------------------------------------------------
// Investigating, following up, closing (officers)

async function lockSent(tx: Tx, incidentId: string) {
	const [row] = await tx.select().from(table.incident).where(eq(table.incident.id, incidentId)).for('update');
	return row && row.state !== 'draft' ? row : null;
}

export async function investigate(scope: Scope, incidentId: string, f: InvestigationForm): Promise<{ ok: true } | Failure> {
	if (!can(scope, 'investigateIncidents')) return failure(403, 'Only a laser safety officer investigates incidents.');
	if (!isUuid(incidentId)) return notFound('incident');
	return db.transaction(async (tx) => {
		const before = await lockSent(tx, incidentId);
		if (!before) return notFound('incident');
		if (before.state === 'closed') return failure(409, 'This incident is closed.');
		if (before.version !== f.version) return changedMeanwhile('incident');
		const fields: Record<string, string> = {};
		const pathIds = [...new Set(f.pathIds)];
		const eyewearIds = [...new Set(f.eyewearIds)];
		if (pathIds.length && (await tx.select({ id: table.beamPath.id }).from(table.beamPath).where(inArray(table.beamPath.id, pathIds))).length !== pathIds.length)
			fields.pathIds = 'Unknown beam path.';
		if (eyewearIds.length && (await tx.select({ id: table.eyewear.id }).from(table.eyewear).where(inArray(table.eyewear.id, eyewearIds))).length !== eyewearIds.length)
			fields.eyewearIds = 'Unknown eyewear.';
		if (Object.keys(fields).length) return fieldsNeedAttention(fields);
		const procedures = [...new Set(f.procedures.split('\n').map((l) => l.trim()).filter(Boolean))];
		const [after] = await tx
			.update(table.incident)
			.set({
				severity: f.severity,
				causes: f.causes,
				factors: [...new Set(f.factors)],
				state: 'investigating',
				investigatedBy: scope.userId,
				investigatedAt: new Date(),
				version: before.version + 1,
				updatedAt: new Date()
			})
			.where(and(eq(table.incident.id, incidentId), eq(table.incident.version, f.version)))
			.returning();
		if (!after) return changedMeanwhile('incident');
		await tx.delete(table.incidentLink).where(eq(table.incidentLink.incidentId, incidentId));
		const links = [
			...pathIds.map((pathId) => ({ incidentId, kind: 'path' as const, pathId })),
			...eyewearIds.map((eyewearId) => ({ incidentId, kind: 'eyewear' as const, eyewearId })),
			...procedures.map((reference) => ({ incidentId, kind: 'procedure' as const, reference }))
		];
		if (links.length) await tx.insert(table.incidentLink).values(links);
		await audit.record(tx, {
			actorId: scope.userId,
			action: 'incident.investigate',
			entity: 'incident',
			entityId: incidentId,
			before: { state: before.state, severity: before.severity, causes: before.causes, factors: before.factors },
			after: { state: after.state, severity: after.severity, causes: after.causes, factors: after.factors, pathIds, eyewearIds, procedures }
		});
		return { ok: true as const };
	});
}

export async function addAction(scope: Scope, incidentId: string, f: ActionForm): Promise<{ ok: true; id: string } | Failure> {
	if (!can(scope, 'investigateIncidents')) return failure(403, 'Only a laser safety officer sets corrective actions.');
	if (!isUuid(incidentId)) return notFound('incident');
	return db.transaction(async (tx) => {
		// Locked so the incident cannot close while an action is being added to it.
		const row = await lockSent(tx, incidentId);
		if (!row) return notFound('incident');
		if (row.state === 'closed') return failure(409, 'This incident is closed; reopen it by reporting a new one.');
		const [owner] = await tx.select({ id: table.user.id }).from(table.user).where(and(eq(table.user.id, f.ownerId), eq(table.user.disabled, false)));
		if (!owner) return fieldsNeedAttention({ ownerId: 'Choose an active person.' });
		const [a] = await tx.insert(table.correctiveAction).values({ incidentId, description: f.description, ownerId: f.ownerId, dueOn: f.dueOn, createdBy: scope.userId }).returning();
		await tx.update(table.incident).set({ updatedAt: new Date() }).where(eq(table.incident.id, incidentId));
		await audit.record(tx, { actorId: scope.userId, action: 'incident.action_add', entity: 'corrective_action', entityId: a.id, after: { incidentId, description: a.description, ownerId: a.ownerId, dueOn: a.dueOn } });
		return { ok: true as const, id: a.id };
	});
}

/** Close an action with its evidence: its owner or an officer. */
export async function closeAction(scope: Scope, f: CloseActionForm, files: StoredUpload[] = []): Promise<{ ok: true; incidentId: string } | Failure> {
	return db.transaction(async (tx) => {
		const [a] = await tx.select().from(table.correctiveAction).where(eq(table.correctiveAction.id, f.actionId)).for('update');
		if (!a || (a.ownerId !== scope.userId && !can(scope, 'investigateIncidents'))) return notFound('corrective action');
		if (a.closedAt) return failure(409, 'This action is already closed.');
		if (a.version !== f.version) return changedMeanwhile('corrective action');
		const [after] = await tx
			.update(table.correctiveAction)
			.set({ evidence: f.evidence, closedAt: new Date(), closedBy: scope.userId, version: a.version + 1 })
			.where(and(eq(table.correctiveAction.id, a.id), eq(table.correctiveAction.version, f.version)))
			.returning();
		if (!after) return changedMeanwhile('corrective action');
		const docs = files.length
			? await tx
					.insert(table.document)
					.values(files.map((file) => ({ ...file, entity: 'corrective_action', entityId: a.id, uploadedBy: scope.userId })))
					.returning({ id: table.document.id })
			: [];
		await audit.record(tx, { actorId: scope.userId, action: 'incident.action_close', entity: 'corrective_action', entityId: a.id, before: { closedAt: null }, after: { evidence: f.evidence, photos: docs.map((d) => d.id) } });
		return { ok: true as const, incidentId: a.incidentId };
	});
}

/** Close the incident: investigated, and every action closed (checked under the incident's lock). */
export async function close(scope: Scope, incidentId: string, f: CloseIncidentForm): Promise<{ ok: true } | Failure> {
	if (!can(scope, 'investigateIncidents')) return failure(403, 'Only a laser safety officer closes incidents.');
	if (!isUuid(incidentId)) return notFound('incident');
	return db.transaction(async (tx) => {
		const before = await lockSent(tx, incidentId);
		if (!before) return notFound('incident');
		if (before.state === 'closed') return failure(409, 'This incident is closed already.');
		if (before.version !== f.version) return changedMeanwhile('incident');
		if (!before.severity) return failure(409, 'Record the investigation (severity, causes, contributing factors) before closing the incident.');
		const [{ open }] = await tx
			.select({ open: sql<number>`count(*)::int` })
			.from(table.correctiveAction)
			.where(and(eq(table.correctiveAction.incidentId, incidentId), isNull(table.correctiveAction.closedAt)));
		if (open > 0) return failure(409, `${open} corrective action${open === 1 ? ' is' : 's are'} still open: the incident closes once every action is closed.`);
		const [after] = await tx
			.update(table.incident)
			.set({ state: 'closed', closedAt: new Date(), closedBy: scope.userId, closingNote: f.closingNote, version: before.version + 1, updatedAt: new Date() })
			.where(and(eq(table.incident.id, incidentId), eq(table.incident.version, f.version)))
			.returning();
		if (!after) return changedMeanwhile('incident');
		await audit.record(tx, { actorId: scope.userId, action: 'incident.close', entity: 'incident', entityId: incidentId, before: { state: before.state }, after: { state: 'closed', closingNote: f.closingNote } });
		return { ok: true as const };
	});
}

/** A suspension started from an incident: the laser must be the incident's, or one of its lab. */
export async function suspendFrom(scope: Scope, incidentId: string, form: { laserId: string; reason: string }) {
	if (!can(scope, 'investigateIncidents')) return failure(403, 'Only a laser safety officer suspends a laser.');
	if (!isUuid(incidentId)) return notFound('incident');
	const [row] = await db.select().from(table.incident).where(eq(table.incident.id, incidentId));
	if (!row || row.state === 'draft') return notFound('incident');
	const [l] = await db.select({ labId: table.laser.labId }).from(table.laser).where(eq(table.laser.id, form.laserId));
	if (!l || l.labId !== row.labId) return fieldsNeedAttention({ laserId: 'Choose a laser of the lab where the incident happened.' });
	return suspensions.suspend(scope, form, incidentId);
}

/** What the officer's forms offer: people to own actions, the lab's lasers, paths and eyewear. */
export async function investigationChoices(labId: string | null) {
	const [people, lasers, paths, goggles] = await Promise.all([
		db.select({ id: table.user.id, name: table.user.name }).from(table.user).where(eq(table.user.disabled, false)).orderBy(asc(table.user.name)),
		labId
			? db.select({ id: table.laser.id, maker: table.laser.maker, model: table.laser.model }).from(table.laser).where(and(eq(table.laser.labId, labId), sql`${table.laser.status} <> 'retired'`))
			: Promise.resolve([]),
		labId
			? db
					.select({ id: table.beamPath.id, name: table.beamPath.name })
					.from(table.beamPath)
					.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
					.where(and(eq(table.laser.labId, labId), eq(table.beamPath.retired, false)))
					.orderBy(asc(table.beamPath.name))
			: Promise.resolve([]),
		labId ? db.select({ id: table.eyewear.id, label: table.eyewear.label }).from(table.eyewear).where(and(eq(table.eyewear.labId, labId), eq(table.eyewear.retired, false))).orderBy(asc(table.eyewear.label)) : Promise.resolve([])
	]);
	return { people, lasers: lasers.map((l) => ({ id: l.id, name: `${l.maker} ${l.model}` })), paths, eyewear: goggles };
}

// ---------------------------------------------------------------------------------------------
// Actions a person owns, wherever they are

export async function myActions(scope: Scope, today: string) {
	const rows = await db
		.select({ a: table.correctiveAction, number: table.incident.number, kind: table.incident.kind })
		.from(table.correctiveAction)
		.innerJoin(table.incident, eq(table.incident.id, table.correctiveAction.incidentId))
		.where(and(eq(table.correctiveAction.ownerId, scope.userId), isNull(table.correctiveAction.closedAt)))
		.orderBy(asc(table.correctiveAction.dueOn));
	return rows.map(({ a, number, kind }) => ({
		id: a.id,
		incidentId: a.incidentId,
		incidentNumber: number,
		kind,
		description: a.description,
		dueOn: a.dueOn,
		state: actionState(a.dueOn, a.closedAt, today),
		version: a.version
	}));
}

// ---------------------------------------------------------------------------------------------
// Documents of incidents and actions

/** A photo of a report or of an action's evidence, if the person may see it (file name hidden otherwise). */
export async function documentFor(scope: Scope, documentId: string) {
	if (!isUuid(documentId)) return null;
	const [doc] = await db.select().from(table.document).where(eq(table.document.id, documentId));
	if (!doc || (doc.entity !== 'incident' && doc.entity !== 'corrective_action')) return null;
	let incidentId = doc.entityId;
	let ownsAction = false;
	if (doc.entity === 'corrective_action') {
		const [a] = await db.select({ incidentId: table.correctiveAction.incidentId, ownerId: table.correctiveAction.ownerId }).from(table.correctiveAction).where(eq(table.correctiveAction.id, doc.entityId));
		if (!a) return null;
		incidentId = a.incidentId;
		ownsAction = a.ownerId === scope.userId;
	}
	const [row] = await db.select().from(table.incident).where(eq(table.incident.id, incidentId));
	const level = row ? levelFor(scope, row) : null;
	if (!level && !ownsAction) return null;
	const ext = doc.mediaType === 'application/pdf' ? 'pdf' : doc.mediaType.split('/')[1];
	return level === 'full' || doc.uploadedBy === scope.userId ? doc : { ...doc, fileName: `incident-${row?.number ?? ''}-photo.${ext}` };
}

// ---------------------------------------------------------------------------------------------
// Learning: the officer's and the manager's figures, and the export

export type Learning = {
	months: { month: string; nearMisses: number; incidents: number }[];
	byKind: { key: IncidentKind; count: number }[];
	byArea: { name: string; count: number }[];
	byFactor: { key: ContributingFactor; count: number }[];
	openActions: { id: string; incidentId: string; incidentNumber: number; description: string; dueOn: string; state: ActionState; ownerName: string }[];
	total: number;
};

/** Sent reports over the last twelve months (by the month they happened), and every open action. */
export async function learning(scope: Scope, today: string): Promise<Learning> {
	if (!can(scope, 'readIncidentFigures')) return { months: [], byKind: [], byArea: [], byFactor: [], openActions: [], total: 0 };
	const start = `${shiftMonth(today.slice(0, 7), -11)}-01`;
	const i = table.incident;
	const rows = await db
		.select({ occurredAt: i.occurredAt, kind: i.kind, factors: i.factors, areaName: table.area.name, labCode: table.lab.code })
		.from(i)
		.leftJoin(table.area, eq(table.area.id, i.areaId))
		.leftJoin(table.lab, eq(table.lab.id, i.labId))
		.where(and(sql`${i.state} <> 'draft'`, sql`${i.occurredAt} >= ${start}`));
	const months = Array.from({ length: 12 }, (_, n) => ({ month: shiftMonth(start.slice(0, 7), n), nearMisses: 0, incidents: 0 }));
	const tally = <K extends string>(keys: K[]) => {
		const m = new Map<K, number>();
		for (const k of keys) m.set(k, (m.get(k) ?? 0) + 1);
		return [...m].sort((a, b) => b[1] - a[1]);
	};
	for (const r of rows) {
		const slot = months.find((m) => m.month === r.occurredAt!.slice(0, 7));
		if (slot) r.kind === 'near_miss' ? slot.nearMisses++ : slot.incidents++;
	}
	const owner = alias(table.user, 'owner_user');
	const open = await db
		.select({ a: table.correctiveAction, number: i.number, ownerName: owner.name })
		.from(table.correctiveAction)
		.innerJoin(i, eq(i.id, table.correctiveAction.incidentId))
		.innerJoin(owner, eq(owner.id, table.correctiveAction.ownerId))
		.where(isNull(table.correctiveAction.closedAt))
		.orderBy(asc(table.correctiveAction.dueOn));
	return {
		months,
		byKind: tally(rows.map((r) => r.kind!)).map(([key, count]) => ({ key, count })),
		byArea: tally(rows.map((r) => (r.areaName ? r.areaName : `${r.labCode ?? '?'} (no area given)`))).map(([name, count]) => ({ name, count })),
		byFactor: tally(rows.flatMap((r) => r.factors)).map(([key, count]) => ({ key, count })),
		openActions: open.map(({ a, number, ownerName }) => ({ id: a.id, incidentId: a.incidentId, incidentNumber: number, description: a.description, dueOn: a.dueOn, state: actionState(a.dueOn, null, today), ownerName })),
		total: rows.length
	};
}

/** 'YYYY-MM' moved by n months. */
export function shiftMonth(month: string, n: number): string {
	const [y, m] = month.split('-').map(Number);
	const d = new Date(Date.UTC(y, m - 1 + n, 1));
	return d.toISOString().slice(0, 7);
}

/** CSV of the register of incidents: no personal field ever (no reporter, no people involved). */
export function toCsv(rows: IncidentListItem[]): string {
	const head = ['number', 'occurred at', 'kind', 'severity', 'state', 'lab', 'area', 'laser', 'summary', 'contributing factors', 'actions', 'open actions', 'overdue actions'];
	const lines = rows.map((r) => [
		r.number,
		r.occurredAt?.slice(0, 16).replace('T', ' ') ?? null,
		r.kind ? kindWords[r.kind].word : null,
		r.severity,
		r.state,
		r.labCode,
		r.areaName,
		r.laserName,
		r.title,
		r.factors.join('; '),
		r.totalActions,
		r.openActions,
		r.overdueActions
	]);
	return writeCsv(head, lines);
}
