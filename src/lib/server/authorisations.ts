// Authorisations to operate a laser or to work in a laser controlled area. Researchers ask; an
// officer grants with conditions (training current, procedures signed, an end date) or refuses with
// a reason, and may withdraw a grant. Whether one holds today is derived on every read by the pure
// authorisationState() from the rows loaded here in a few batch queries: it lapses by itself.
import { aliasedTable, and, asc, desc, eq, inArray, isNull, or, sql, type SQL } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import { canEdit, type Scope } from '$lib/server/auth/scope';
import { changedMeanwhile, failure, fieldsNeedAttention, notFound, type Failure } from '$lib/server/http/failure';
import { isUuid } from '$lib/server/db/ids';
import { readMailConfig } from '$lib/server/mail/config';
import * as outbox from '$lib/server/mail/outbox';
import { daysBetween } from '$lib/server/mail/schedule';
import * as procedures from '$lib/server/procedures';
import * as safetyMail from '$lib/server/safetyMail';
import { authorisationState, isInForce, LAPSE_NOTICE_DAYS, type AuthorisationOutcome, type Decision, type ProcedureFact, type TrainingFact } from '$lib/authorisationState';
import type { DecideForm, GrantForm, RequestForm } from '$lib/schemas/authorisations';
import { can } from '$lib/abilities';

const a = table.authorisation;
const person = aliasedTable(table.user, 'person');
const dayOf = (t: Date) => t.toISOString().slice(0, 10);

export type AuthorisationRow = {
	id: string;
	userId: string;
	personName: string;
	labId: string;
	labCode: string;
	labName: string;
	laserId: string | null;
	areaId: string | null;
	/** The area a laser stands in (for a laser's authorisation). */
	laserAreaId: string | null;
	targetLabel: string;
	decision: Decision;
	requestNote: string;
	requestedAt: Date;
	decidedByName: string | null;
	decidedAt: Date | null;
	decisionReason: string;
	expiresOn: string | null;
	version: number;
	/** The conditions' facts as read today (for the reminders). */
	trainings: TrainingFact[];
	procedures: ProcedureFact[];
	outcome: AuthorisationOutcome;
};

export type Filter = { userId?: string; laserId?: string; areaId?: string; decisions?: Decision[]; labId?: string; ids?: string[] };

function scopeCondition(scope: Scope): SQL | undefined {
	if (scope.labIds === 'all') return undefined;
	// A researcher sees their own labs' authorisations, and their own wherever they are.
	return scope.labIds.length ? or(inArray(a.labId, scope.labIds), eq(a.userId, scope.userId)) : eq(a.userId, scope.userId);
}

/** Authorisations as filtered, each with its state on `today`; a handful of queries whatever the count. */
export async function list(scope: Scope | null, today: string, filter: Filter = {}): Promise<AuthorisationRow[]> {
	const tx = db;
	const where: (SQL | undefined)[] = [scope ? scopeCondition(scope) : undefined];
	if (filter.ids) where.push(filter.ids.length ? inArray(a.id, filter.ids) : sql`false`);
	if (filter.userId) where.push(eq(a.userId, filter.userId));
	if (filter.labId) where.push(eq(a.labId, filter.labId));
	if (filter.laserId) where.push(eq(a.laserId, filter.laserId));
	// An area's people: authorised for the area, or for a laser standing in it.
	if (filter.areaId) where.push(or(eq(a.areaId, filter.areaId), eq(table.laser.areaId, filter.areaId)));
	if (filter.decisions) where.push(inArray(a.decision, filter.decisions));
	const rows = await tx
		.select({
			row: a,
			personName: person.name,
			personDisabled: person.disabled,
			labCode: table.lab.code,
			labName: table.lab.name,
			maker: table.laser.maker,
			model: table.laser.model,
			laserAreaId: table.laser.areaId,
			areaName: table.area.name,
			// (a second alias of the user table in one select confuses drizzle's types: a subquery instead)
			decidedByName: sql<string | null>`(SELECT name FROM "user" WHERE id = ${a.decidedBy})`
		})
		.from(a)
		.innerJoin(person, eq(person.id, a.userId))
		.innerJoin(table.lab, eq(table.lab.id, a.labId))
		.leftJoin(table.laser, eq(table.laser.id, a.laserId))
		.leftJoin(table.area, eq(table.area.id, a.areaId))
		.where(and(...where))
		.orderBy(asc(person.name), asc(table.lab.code), desc(a.requestedAt))
		.limit(5000);
	if (rows.length === 0) return [];

	const ids = rows.map((r) => r.row.id);
	const conditions = await tx.select().from(table.authorisationCondition).where(inArray(table.authorisationCondition.authorisationId, ids));
	const userIds = [...new Set(rows.map((r) => r.row.userId))];
	const procedureIds = [...new Set(conditions.map((c) => c.procedureId).filter((x): x is string => !!x))];
	const [records, titles, current, signed, interval] = await Promise.all([
		tx
			.select({ userId: table.trainingRecord.userId, topic: table.trainingRecord.topic, completedOn: table.trainingRecord.completedOn, expiresOn: table.trainingRecord.expiresOn })
			.from(table.trainingRecord)
			.where(and(inArray(table.trainingRecord.userId, userIds), isNull(table.trainingRecord.withdrawnAt)))
			.orderBy(asc(table.trainingRecord.completedOn), asc(table.trainingRecord.createdAt)),
		procedureIds.length ? tx.select({ id: table.procedure.id, title: table.procedure.title }).from(table.procedure).where(inArray(table.procedure.id, procedureIds)) : Promise.resolve([]),
		procedures.currentVersions(tx, procedureIds),
		procedures.signoffsOf(tx, userIds, procedureIds),
		procedures.signoffInterval(tx)
	]);
	// The latest completion per person and topic (ordered ascending: the last one wins).
	const latest = new Map<string, TrainingFact['latest']>();
	for (const r of records) latest.set(`${r.userId} ${r.topic.toLowerCase()}`, { completedOn: r.completedOn, expiresOn: r.expiresOn });
	const titleOf = new Map(titles.map((t) => [t.id, t.title]));

	return rows.map((r) => {
		const own = conditions.filter((c) => c.authorisationId === r.row.id).sort((x, y) => x.createdAt.getTime() - y.createdAt.getTime());
		const trainings: TrainingFact[] = own.filter((c) => c.trainingTopic).map((c) => ({ topic: c.trainingTopic!, latest: latest.get(`${r.row.userId} ${c.trainingTopic!.toLowerCase()}`) ?? null }));
		const procs: ProcedureFact[] = own
			.filter((c) => c.procedureId)
			.map((c) => {
				const cur = current.get(c.procedureId!) ?? null;
				const mine = signed.get(`${r.row.userId} ${c.procedureId}`) ?? new Map<number, string>();
				const earlier = [...mine.keys()].filter((n) => !cur || n < cur.number);
				return {
					procedureId: c.procedureId!,
					title: titleOf.get(c.procedureId!) ?? 'procedure',
					current: cur ? { number: cur.number, approvedOn: cur.approvedOn } : null,
					signedCurrentOn: cur ? (mine.get(cur.number) ?? null) : null,
					signedEarlier: earlier.length ? Math.max(...earlier) : null
				};
			});
		const outcome = authorisationState(
			{ decision: r.row.decision, grantedOn: r.row.decision === 'granted' && r.row.decidedAt ? dayOf(r.row.decidedAt) : null, expiresOn: r.row.expiresOn, accountDisabled: r.personDisabled, trainings, procedures: procs },
			interval.months,
			today
		);
		return {
			id: r.row.id,
			userId: r.row.userId,
			personName: r.personName,
			labId: r.row.labId,
			labCode: r.labCode,
			labName: r.labName,
			laserId: r.row.laserId,
			areaId: r.row.areaId,
			laserAreaId: r.laserAreaId,
			targetLabel: r.areaName ?? `${r.maker} ${r.model}`,
			decision: r.row.decision,
			requestNote: r.row.requestNote,
			requestedAt: r.row.requestedAt,
			decidedByName: r.decidedByName,
			decidedAt: r.row.decidedAt,
			decisionReason: r.row.decisionReason,
			expiresOn: r.row.expiresOn,
			version: r.row.version,
			trainings,
			procedures: procs,
			outcome
		};
	});
}

export async function find(scope: Scope, authorisationId: string, today: string) {
	if (!isUuid(authorisationId)) return notFound('authorisation');
	const [row] = await list(scope, today, { ids: [authorisationId] });
	if (!row) return notFound('authorisation');
	const lapses = await db
		.select()
		.from(table.authorisationLapse)
		.where(eq(table.authorisationLapse.authorisationId, authorisationId))
		.orderBy(desc(table.authorisationLapse.since));
	return { ok: true as const, authorisation: row, lapses };
}

// ---------------------------------------------------------------------------------------------
// What conditions can be set

export type ConditionOptions = { topics: string[]; procedures: { id: string; title: string; kind: string; approved: boolean; on: string }[] };

/**
 * The training topics on record (one spelling each) and the procedures that apply to a target: a
 * laser's own and its area's; an area's own and those of the lasers standing in it.
 */
export async function conditionOptions(target: { laserId: string | null; areaId: string | null } | null): Promise<ConditionOptions> {
	const topics = await db
		.selectDistinctOn([sql`lower(${table.trainingRecord.topic})`], { topic: table.trainingRecord.topic })
		.from(table.trainingRecord)
		.where(isNull(table.trainingRecord.withdrawnAt))
		.orderBy(sql`lower(${table.trainingRecord.topic})`, desc(table.trainingRecord.completedOn));
	return { topics: topics.map((t) => t.topic), procedures: target ? await proceduresFor(db, target) : [] };
}

async function proceduresFor(tx: Tx | typeof db, target: { laserId: string | null; areaId: string | null }) {
	const p = table.procedure;
	let where: SQL;
	if (target.laserId) {
		const [l] = await tx.select({ areaId: table.laser.areaId }).from(table.laser).where(eq(table.laser.id, target.laserId));
		where = l?.areaId ? or(eq(p.laserId, target.laserId), eq(p.areaId, l.areaId))! : eq(p.laserId, target.laserId);
	} else where = or(eq(p.areaId, target.areaId!), sql`${p.laserId} IN (SELECT id FROM laser WHERE area_id = ${target.areaId})`)!;
	const rows = await tx
		.select({ id: p.id, title: p.title, kind: p.kind, maker: table.laser.maker, model: table.laser.model, areaName: table.area.name })
		.from(p)
		.leftJoin(table.laser, eq(table.laser.id, p.laserId))
		.leftJoin(table.area, eq(table.area.id, p.areaId))
		.where(where)
		.orderBy(asc(p.title));
	const current = await procedures.currentVersions(tx, rows.map((r) => r.id));
	return rows.map((r) => ({ id: r.id, title: r.title, kind: r.kind, approved: current.has(r.id), on: r.areaName ?? `${r.maker} ${r.model}` }));
}

/** Every target's procedures, for the forms that choose conditions in the browser. */
export async function procedureChoices(): Promise<{ id: string; title: string; laserId: string | null; areaId: string | null; approved: boolean }[]> {
	const p = table.procedure;
	const rows = await db.select({ id: p.id, title: p.title, laserId: p.laserId, areaId: p.areaId }).from(p).orderBy(asc(p.title));
	const current = await procedures.currentVersions(db, rows.map((r) => r.id));
	return rows.map((r) => ({ ...r, approved: current.has(r.id) }));
}

// ---------------------------------------------------------------------------------------------
// Changes

type Target = NonNullable<Awaited<ReturnType<typeof procedures.resolveTarget>>>;

/** One open request or grant per person and laser or area. */
async function openOne(tx: Tx, userId: string, t: Target, exceptId?: string) {
	const [row] = await tx
		.select({ id: a.id, decision: a.decision })
		.from(a)
		.where(and(eq(a.userId, userId), inArray(a.decision, ['requested', 'granted']), t.laserId ? eq(a.laserId, t.laserId) : eq(a.areaId, t.areaId!), exceptId ? sql`${a.id} <> ${exceptId}` : undefined));
	return row ?? null;
}

/** A researcher (or an officer, for themselves) asks to be authorised. */
export async function request(scope: Scope, form: RequestForm): Promise<{ ok: true; id: string } | Failure> {
	if (!can(scope, 'workWithLasers')) return failure(403, 'Only the people who work with lasers ask for an authorisation.');
	return db.transaction(async (tx) => {
		const target = await procedures.resolveTarget(tx, form.target);
		if (!target) return fieldsNeedAttention({ target: 'Choose a laser in use or an area.' });
		if (!canEdit(scope, target.labId)) return fieldsNeedAttention({ target: 'Choose a laser or an area of a lab you are a member of.' });
		const open = await openOne(tx, scope.userId, target);
		if (open) return fieldsNeedAttention({ target: open.decision === 'granted' ? 'You are authorised for this already.' : 'You asked for this already; the request waits for the officer.' });
		const [row] = await tx
			.insert(a)
			.values({ userId: scope.userId, labId: target.labId, laserId: target.laserId, areaId: target.areaId, decision: 'requested', requestNote: form.note, requestedBy: scope.userId })
			.returning();
		const [me] = await tx.select({ name: table.user.name }).from(table.user).where(eq(table.user.id, scope.userId));
		const [lab] = await tx.select({ name: table.lab.name }).from(table.lab).where(eq(table.lab.id, target.labId));
		const officers = (await safetyMail.recipients(tx, [], true)).filter((o) => o.id !== scope.userId);
		await outbox.enqueue(tx, safetyMail.authorisationWaitingMails(officers, { id: row.id, personName: me.name, targetLabel: target.label, labName: lab.name, requestedAt: row.requestedAt, note: form.note }, 0, readMailConfig().appUrl));
		await audit.record(tx, { actorId: scope.userId, action: 'authorisation.request', entity: 'authorisation', entityId: row.id, after: row });
		return { ok: true as const, id: row.id };
	});
}

type Conditions = Pick<GrantForm, 'trainingTopics' | 'procedureIds' | 'expiresOn'>;

/** Check the conditions against the target; the cleaned lists, or the fields to fix. */
async function checkConditions(tx: Tx, target: Target, c: Conditions, today: string): Promise<{ ok: true; topics: string[]; procedureIds: string[] } | Failure> {
	if (c.expiresOn && c.expiresOn < today) return fieldsNeedAttention({ expiresOn: 'The end date cannot be in the past.' });
	const topics = [...new Map(c.trainingTopics.map((t) => [t.trim().toLowerCase(), t.trim()])).values()].filter(Boolean);
	const procedureIds = [...new Set(c.procedureIds)];
	const allowed = new Set((await proceduresFor(tx, target)).map((p) => p.id));
	if (procedureIds.some((id) => !allowed.has(id))) return fieldsNeedAttention({ procedureIds: 'Choose procedures of this laser or area.' });
	return { ok: true, topics, procedureIds };
}

async function writeConditions(tx: Tx, authorisationId: string, topics: string[], procedureIds: string[]) {
	const rows = [...topics.map((trainingTopic) => ({ authorisationId, trainingTopic })), ...procedureIds.map((procedureId) => ({ authorisationId, procedureId }))];
	if (rows.length) await tx.insert(table.authorisationCondition).values(rows);
}

/** May this person hold an authorisation here? A researcher of the lab, or an officer. */
async function eligible(tx: Tx, userId: string, labId: string): Promise<string | null> {
	const [u] = await tx.select({ role: table.user.role, disabled: table.user.disabled, name: table.user.name }).from(table.user).where(eq(table.user.id, userId));
	if (!u || u.disabled) return 'Choose an active person.';
	if (u.role === 'officer') return null;
	if (u.role !== 'researcher') return `${u.name} is a ${u.role}: only researchers and officers operate lasers.`;
	const [member] = await tx.select({ labId: table.labMember.labId }).from(table.labMember).where(and(eq(table.labMember.userId, userId), eq(table.labMember.labId, labId)));
	return member ? null : `${u.name} is not a member of this lab: an administrator adds them first.`;
}

/** An officer grants directly, with the conditions. */
export async function grant(scope: Scope, form: GrantForm, today: string): Promise<{ ok: true; id: string } | Failure> {
	if (!can(scope, 'approveProcedures')) return failure(403, 'Only a laser safety officer grants authorisations.');
	if (form.userId === scope.userId) return fieldsNeedAttention({ userId: 'Another officer grants your own authorisation.' });
	return db.transaction(async (tx) => {
		const target = await procedures.resolveTarget(tx, form.target);
		if (!target) return fieldsNeedAttention({ target: 'Choose a laser in use or an area.' });
		const who = await eligible(tx, form.userId, target.labId);
		if (who) return fieldsNeedAttention({ userId: who });
		const checked = await checkConditions(tx, target, form, today);
		if (!checked.ok) return checked;
		const open = await openOne(tx, form.userId, target);
		if (open) return fieldsNeedAttention({ target: open.decision === 'granted' ? 'This person is authorised for it already.' : 'This person has asked for it: answer the request instead.' });
		const now = new Date();
		const [row] = await tx
			.insert(a)
			.values({ userId: form.userId, labId: target.labId, laserId: target.laserId, areaId: target.areaId, decision: 'granted', requestedBy: scope.userId, requestedAt: now, decidedBy: scope.userId, decidedAt: now, decisionReason: form.reason, expiresOn: form.expiresOn || null })
			.returning();
		await writeConditions(tx, row.id, checked.topics, checked.procedureIds);
		await audit.record(tx, { actorId: scope.userId, action: 'authorisation.grant', entity: 'authorisation', entityId: row.id, after: { ...row, trainingTopics: checked.topics, procedureIds: checked.procedureIds } });
		return { ok: true as const, id: row.id };
	});
}

/** An officer answers a request: granted with conditions, or refused with a reason. */
export async function decide(scope: Scope, authorisationId: string, form: DecideForm, today: string): Promise<{ ok: true } | Failure> {
	if (!can(scope, 'approveProcedures')) return failure(403, 'Only a laser safety officer decides on authorisations.');
	if (!isUuid(authorisationId)) return notFound('authorisation');
	return db.transaction(async (tx) => {
		const [row] = await tx.select().from(a).where(eq(a.id, authorisationId)).for('update');
		if (!row) return notFound('authorisation');
		if (row.version !== form.version) return changedMeanwhile('authorisation');
		if (row.decision !== 'requested') return failure(409, 'This request has been answered already.');
		if (row.userId === scope.userId) return failure(403, 'You asked for this yourself: another officer decides.');
		let topics: string[] = [];
		let procedureIds: string[] = [];
		if (form.decision === 'granted') {
			const target = { laserId: row.laserId, areaId: row.areaId, labId: row.labId, label: '' };
			const who = await eligible(tx, row.userId, row.labId);
			if (who) return failure(409, who);
			const checked = await checkConditions(tx, target, form, today);
			if (!checked.ok) return checked;
			({ topics, procedureIds } = checked);
		}
		const [after] = await tx
			.update(a)
			.set({ decision: form.decision, decidedBy: scope.userId, decidedAt: new Date(), decisionReason: form.reason, expiresOn: form.decision === 'granted' ? form.expiresOn || null : null, version: row.version + 1, updatedAt: new Date() })
			.where(eq(a.id, row.id))
			.returning();
		await writeConditions(tx, row.id, topics, procedureIds);
		await audit.record(tx, { actorId: scope.userId, action: form.decision === 'granted' ? 'authorisation.grant' : 'authorisation.refuse', entity: 'authorisation', entityId: row.id, before: { decision: row.decision }, after: { decision: after.decision, reason: form.reason, expiresOn: after.expiresOn, trainingTopics: topics, procedureIds } });
		return { ok: true } as const;
	});
}

/** An officer withdraws a grant (or a request nobody will answer), with a reason. */
export async function withdraw(scope: Scope, authorisationId: string, reason: string, version: number): Promise<{ ok: true } | Failure> {
	if (!can(scope, 'approveProcedures')) return failure(403, 'Only a laser safety officer withdraws authorisations.');
	if (!isUuid(authorisationId)) return notFound('authorisation');
	return db.transaction(async (tx) => {
		const [before] = await tx.select().from(a).where(eq(a.id, authorisationId)).for('update');
		if (!before) return notFound('authorisation');
		const [after] = await tx
			.update(a)
			.set({ decision: 'withdrawn', decidedBy: scope.userId, decidedAt: new Date(), decisionReason: reason, version: version + 1, updatedAt: new Date() })
			.where(and(eq(a.id, authorisationId), eq(a.version, version), inArray(a.decision, ['requested', 'granted'])))
			.returning();
		if (!after) return before.decision === 'withdrawn' || before.decision === 'refused' ? failure(409, 'This authorisation is not open any more.') : changedMeanwhile('authorisation');
		await audit.record(tx, { actorId: scope.userId, action: 'authorisation.withdraw', entity: 'authorisation', entityId: authorisationId, before: { decision: before.decision }, after: { decision: 'withdrawn', reason } });
		return { ok: true } as const;
	});
}

// ---------------------------------------------------------------------------------------------
// Who may be here, and what each person must do

/** The people authorised now for an area (or one of its lasers): in force only, for the door. */
export async function inForceForArea(areaId: string, today: string) {
	const rows = await list(null, today, { areaId, decisions: ['granted'] });
	return rows.filter((r) => isInForce(r.outcome.state));
}

export type Duty = { kind: 'sign' | 'renew' | 'request' | 'lapsed'; text: string; href: string; state: string };

/** What a person must do: sign procedures, renew what lapses, and request what they lack. */
export async function dutiesOf(scope: Scope, today: string): Promise<Duty[]> {
	const mine = await list(null, today, { userId: scope.userId, decisions: ['granted', 'requested'] });
	const duties: Duty[] = [];
	const seen = new Set<string>();
	for (const r of mine) {
		if (r.decision !== 'granted') continue;
		for (const c of r.outcome.conditions) {
			const soon = c.until !== null && daysBetween(today, c.until) <= LAPSE_NOTICE_DAYS;
			if (c.holds && !soon) continue;
			if (seen.has(c.key)) continue;
			seen.add(c.key);
			if (c.kind === 'procedure') duties.push({ kind: 'sign', text: c.holds ? `Sign again: ${c.detail}` : c.detail, href: `/procedures/${c.key.split(':')[1]}`, state: c.holds ? 'lapses_soon' : r.outcome.state });
			else if (c.kind === 'training') duties.push({ kind: 'renew', text: c.holds ? `Renew in time: ${c.detail}` : c.detail, href: '/training', state: c.holds ? 'lapses_soon' : r.outcome.state });
			else if (c.holds) duties.push({ kind: 'request', text: `${r.targetLabel}: ${c.detail} Ask the officer in time if you need it longer.`, href: `/authorisations/${r.id}`, state: 'lapses_soon' });
			else duties.push({ kind: 'lapsed', text: `${r.targetLabel}: ${c.detail}`, href: `/authorisations/${r.id}`, state: r.outcome.state });
		}
	}
	// Lasers of one's own labs (Class 3B and 4, in use) with no open request or grant.
	if (scope.role === 'researcher' && Array.isArray(scope.labIds) && scope.labIds.length) {
		const held = new Set(mine.map((r) => r.laserId).filter(Boolean));
		const lasers = await db
			.select({ id: table.laser.id, maker: table.laser.maker, model: table.laser.model })
			.from(table.laser)
			.where(and(inArray(table.laser.labId, scope.labIds), eq(table.laser.status, 'active'), inArray(table.laser.laserClass, ['3B', '4'])))
			.orderBy(asc(table.laser.maker));
		for (const l of lasers.filter((l) => !held.has(l.id)).slice(0, 5))
			duties.push({ kind: 'request', text: `You hold no authorisation for the ${l.maker} ${l.model}. Ask for one before you operate it.`, href: `/authorisations?request=laser:${l.id}`, state: 'none' });
	}
	return duties;
}

/** For the officer: what lapses within the window, what has lapsed, and requests waiting. */
export async function officerDesk(today: string) {
	const rows = await list(null, today, { decisions: ['granted', 'requested'] });
	return {
		lapsing: rows.filter((r) => r.outcome.state === 'lapses_soon').sort((x, y) => (x.outcome.validUntil ?? '').localeCompare(y.outcome.validUntil ?? '')),
		lapsed: rows.filter((r) => r.outcome.state === 'lapsed'),
		requests: rows.filter((r) => r.decision === 'requested')
	};
}

/** The fields a page shows of an authorisation in a list. */
export function summary(r: AuthorisationRow) {
	return {
		id: r.id,
		userId: r.userId,
		personName: r.personName,
		laserId: r.laserId,
		areaId: r.areaId,
		targetLabel: r.targetLabel,
		labCode: r.labCode,
		decision: r.decision,
		state: r.outcome.state,
		reasons: r.outcome.reasons,
		validUntil: r.outcome.validUntil
	};
}

/** People who can hold an authorisation: active researchers and officers. */
export async function candidates() {
	return db
		.select({ id: table.user.id, name: table.user.name, role: table.user.role })
		.from(table.user)
		.where(and(eq(table.user.disabled, false), inArray(table.user.role, ['researcher', 'officer'])))
		.orderBy(asc(table.user.name));
}
