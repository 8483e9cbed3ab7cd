// The daily reminder computation. It reads the register, works out which reminders are due on the
// given day and puts them in the mail ledger; it never sends (outbox.deliver does). Because the
// ledger key is (kind, record, due key, step, recipient), running it again, late, or in two
// processes at once adds nothing that is already there.
import { aliasedTable, and, eq, gt, gte, inArray, isNotNull, isNull, lt, lte, notExists, or, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { readMailConfig } from '$lib/server/mail/config';
import * as outbox from '$lib/server/mail/outbox';
import type { MailInput } from '$lib/server/mail/outbox';
import { actionOverdueStep, inspectionStep, reviewWaitStep, shiftDay, startOfUtcDay, toIsoDay, trainingStep } from '$lib/server/mail/schedule';
import * as templates from '$lib/server/mail/templates';
import * as safetyReminders from '$lib/server/safetyReminders';
import { TRAINING_EXPIRED_NOTICE_DAYS, TRAINING_NOTICE_DAYS } from '$lib/trainingState';

/** In-app notifications younger than this are mailed; older ones are history, not news. */
export const NOTIFICATION_WINDOW_DAYS = 7;

export type DailyCounts = {
	today: string;
	inspectionDue: number;
	inspectionOverdue: number;
	reviewWaiting: number;
	trainingExpiring: number;
	trainingExpired: number;
	actionOverdue: number;
	findingOverdue: number;
	notifications: number;
	/** Procedures and authorisations (see safetyReminders). */
	safety: Omit<safetyReminders.SafetyCounts, 'held'>;
	/** Of the new rows, how many wait for a digest. */
	held: number;
	digests: number;
	digestItems: number;
};

type Person = { id: string; email: string; name: string; role: string };

async function activeUsers(where: { ids?: string[]; roles?: ('officer' | 'manager')[] }): Promise<Person[]> {
	const u = table.user;
	const conds = [];
	if (where.ids?.length) conds.push(inArray(u.id, where.ids));
	if (where.roles?.length) conds.push(inArray(u.role, where.roles));
	if (conds.length === 0) return [];
	return db
		.select({ id: u.id, email: u.email, name: u.name, role: u.role })
		.from(u)
		.where(and(eq(u.disabled, false), or(...conds)));
}

/** Recipients of one mail with the reasons they get it (one person, one mail, all reasons said). */
class Recipients {
	private map = new Map<string, { person: Person; reasons: string[] }>();
	add(person: Person | undefined, reason: string) {
		if (!person) return;
		const entry = this.map.get(person.id) ?? { person, reasons: [] };
		if (!entry.reasons.includes(reason)) entry.reasons.push(reason);
		this.map.set(person.id, entry);
	}
	list() {
		return [...this.map.values()].map((e) => ({ person: e.person, reason: e.reasons.join(' ') }));
	}
}

// ---------------------------------------------------------------------------------------------

/** Inspection reminders for `today`: due (30 / 7 / 0 days) and overdue (weekly, escalating). */
export async function inspectionMails(today: string, appUrl: string): Promise<MailInput[]> {
	const i = table.inspection;
	const a = table.area;
	const rows = await db
		.select({
			id: i.id,
			dueOn: i.dueOn,
			inspectorId: i.inspectorId,
			areaId: a.id,
			areaName: a.name,
			room: a.room,
			building: a.building,
			areaInspectorId: a.inspectorId,
			responsibleId: a.responsibleId,
			labName: table.lab.name
		})
		.from(i)
		.innerJoin(a, eq(a.id, i.areaId))
		.innerJoin(table.lab, eq(table.lab.id, a.labId))
		.where(and(isNull(i.completedOn), lte(i.dueOn, shiftDay(today, 30))));
	if (rows.length === 0) return [];

	const ids = [...new Set(rows.flatMap((r) => [r.inspectorId, r.areaInspectorId, r.responsibleId]).filter((x): x is string => !!x))];
	const people = await activeUsers({ ids, roles: ['officer', 'manager'] });
	const byId = new Map(people.map((p) => [p.id, p]));
	const officers = people.filter((p) => p.role === 'officer');
	const managers = people.filter((p) => p.role === 'manager');

	const mails: MailInput[] = [];
	for (const r of rows) {
		const step = inspectionStep(r.dueOn, today);
		if (!step) continue;
		const area: templates.AreaInfo = { id: r.areaId, name: r.areaName, room: r.room, building: r.building, labName: r.labName };
		const inspectorId = r.inspectorId ?? r.areaInspectorId;
		const inspector = inspectorId ? byId.get(inspectorId) : undefined;
		const to = new Recipients();
		if (inspector) to.add(inspector, 'You are the inspector of this area.');
		else for (const o of officers) to.add(o, 'This area has no active inspector assigned, so every laser safety officer is told.');
		if (r.responsibleId) to.add(byId.get(r.responsibleId), 'You are the person responsible for this area.');
		if (step.kind === 'inspection.overdue' && step.escalate)
			for (const m of managers) to.add(m, `You are a facility manager: an inspection overdue for two weeks or more is passed on to you.`);

		for (const { person, reason } of to.list()) {
			const body =
				step.kind === 'inspection.due'
					? templates.inspectionDue({ appUrl, inspectionId: r.id, area, dueOn: r.dueOn, daysUntil: step.daysUntil, reason })
					: templates.inspectionOverdue({ appUrl, inspectionId: r.id, area, dueOn: r.dueOn, weeksOverdue: step.weeksOverdue, inspectorName: inspector?.name ?? null, reason });
			mails.push({ kind: step.kind, recordId: r.id, dueKey: r.dueOn, step: step.step, recipientId: person.id, recipientEmail: person.email, ...mailBody(body), reason });
		}
	}
	return mails;
}

const mailBody = (b: templates.Rendered) => ({ subject: b.subject, text: b.text, html: b.html });

/** Paths awaiting review for more than seven days: weekly, to every officer. */
export async function reviewWaitingMails(today: string, appUrl: string): Promise<MailInput[]> {
	const p = table.beamPath;
	const rows = await db
		.select({ id: p.id, name: p.name, awaitingSince: p.awaitingSince, maker: table.laser.maker, model: table.laser.model, labName: table.lab.name })
		.from(p)
		.innerJoin(table.laser, eq(table.laser.id, p.laserId))
		.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
		.where(and(eq(p.reviewState, 'awaiting_review'), eq(p.retired, false), isNotNull(p.awaitingSince), lt(p.awaitingSince, startOfUtcDay(shiftDay(today, -7)))));
	if (rows.length === 0) return [];
	const officers = await activeUsers({ roles: ['officer'] });
	const mails: MailInput[] = [];
	for (const r of rows) {
		const since = r.awaitingSince!.toISOString();
		const step = reviewWaitStep(since.slice(0, 10), today);
		if (!step) continue;
		const reason = 'You are a laser safety officer, and this path has waited more than seven days for a review.';
		const body = templates.reviewWaiting({ appUrl, pathId: r.id, pathName: r.name, laserLabel: `${r.maker} ${r.model}`, labName: r.labName, waitingSince: since.slice(0, 10), daysWaiting: step.daysWaiting, reason });
		for (const o of officers)
			mails.push({ kind: 'review.waiting', recordId: r.id, dueKey: since, step: step.step, recipientId: o.id, recipientEmail: o.email, ...mailBody(body), reason });
	}
	return mails;
}

/**
 * Training records expiring within 30 days (to the person) or expired in the last seven days (to the
 * person and every officer). A record renewed by a later one of the same topic is not reminded.
 */
export async function trainingMails(today: string, appUrl: string): Promise<MailInput[]> {
	const t = table.trainingRecord;
	const later = aliasedTable(t, 'later');
	const rows = await db
		.select({ id: t.id, userId: t.userId, topic: t.topic, completedOn: t.completedOn, expiresOn: t.expiresOn })
		.from(t)
		.where(
			and(
				isNull(t.withdrawnAt),
				isNotNull(t.expiresOn),
				gte(t.expiresOn, shiftDay(today, -TRAINING_EXPIRED_NOTICE_DAYS)),
				lte(t.expiresOn, shiftDay(today, TRAINING_NOTICE_DAYS)),
				notExists(
					db
						.select({ one: sql`1` })
						.from(later)
						.where(and(eq(later.userId, t.userId), sql`lower(${later.topic}) = lower(${t.topic})`, isNull(later.withdrawnAt), gt(later.completedOn, t.completedOn)))
				)
			)
		);
	if (rows.length === 0) return [];
	const people = await activeUsers({ ids: [...new Set(rows.map((r) => r.userId))], roles: ['officer'] });
	const byId = new Map(people.map((p) => [p.id, p]));
	const officers = people.filter((p) => p.role === 'officer');
	const mails: MailInput[] = [];
	for (const r of rows) {
		const step = trainingStep(r.expiresOn!, today);
		const person = byId.get(r.userId);
		if (!step || !person) continue; // a disabled account is not reminded
		const to = new Recipients();
		to.add(person, 'This is your own training record.');
		if (step.kind === 'training.expired') for (const o of officers) to.add(o, 'You are a laser safety officer: an expired training or authorisation is passed on to you.');
		for (const { person: recipient, reason } of to.list()) {
			const body = templates.trainingReminder({ appUrl, personName: person.name, topic: r.topic, completedOn: r.completedOn, expiresOn: r.expiresOn!, daysUntil: step.daysUntil, reason });
			mails.push({ kind: step.kind, recordId: r.id, dueKey: r.expiresOn!, step: step.kind === 'training.expiring' ? 'before' : 'after', recipientId: recipient.id, recipientEmail: recipient.email, ...mailBody(body), reason });
		}
	}
	return mails;
}

/**
 * Open corrective actions past their due day: weekly, to the owner and to the officer who set the
 * action. The mail names the incident by number only, never a person.
 */
export async function actionOverdueMails(today: string, appUrl: string): Promise<MailInput[]> {
	const a = table.correctiveAction;
	const rows = await db
		.select({ id: a.id, description: a.description, dueOn: a.dueOn, ownerId: a.ownerId, createdBy: a.createdBy, number: table.incident.number })
		.from(a)
		.innerJoin(table.incident, eq(table.incident.id, a.incidentId))
		.where(and(isNull(a.closedAt), lt(a.dueOn, today)));
	if (rows.length === 0) return [];
	const people = await activeUsers({ ids: [...new Set(rows.flatMap((r) => [r.ownerId, r.createdBy]))] });
	const byId = new Map(people.map((p) => [p.id, p]));
	const mails: MailInput[] = [];
	for (const r of rows) {
		const step = actionOverdueStep(r.dueOn, today);
		if (!step) continue;
		const to = new Recipients();
		to.add(byId.get(r.ownerId), 'You own this corrective action.');
		to.add(byId.get(r.createdBy), 'You set this corrective action.');
		for (const { person, reason } of to.list()) {
			const body = templates.actionOverdue({ appUrl, incidentNumber: r.number, description: r.description, dueOn: r.dueOn, daysOverdue: step.daysOverdue, reason });
			mails.push({ kind: 'action.overdue', recordId: r.id, dueKey: r.dueOn, step: step.step, recipientId: person.id, recipientEmail: person.email, ...mailBody(body), reason });
		}
	}
	return mails;
}

/**
 * Open inspection findings past their follow-up day: weekly, to the person responsible for the
 * area, the area's inspector and the officer who recorded the inspection.
 */
export async function findingOverdueMails(today: string, appUrl: string): Promise<MailInput[]> {
	const f = table.finding;
	const i = table.inspection;
	const a = table.area;
	const rows = await db
		.select({
			id: f.id,
			description: f.description,
			action: f.action,
			dueOn: f.dueOn,
			ownerId: f.ownerId,
			inspectionId: i.id,
			completedBy: i.completedBy,
			areaInspectorId: a.inspectorId,
			areaId: a.id,
			areaName: a.name,
			room: a.room,
			building: a.building,
			labName: table.lab.name
		})
		.from(f)
		.innerJoin(i, eq(i.id, f.inspectionId))
		.innerJoin(a, eq(a.id, i.areaId))
		.innerJoin(table.lab, eq(table.lab.id, a.labId))
		.where(and(isNull(f.closedOn), isNotNull(f.dueOn), lt(f.dueOn, today)));
	if (rows.length === 0) return [];
	const people = await activeUsers({ ids: [...new Set(rows.flatMap((r) => [r.ownerId, r.completedBy, r.areaInspectorId]).filter((x): x is string => !!x))] });
	const byId = new Map(people.map((p) => [p.id, p]));
	const mails: MailInput[] = [];
	for (const r of rows) {
		const step = actionOverdueStep(r.dueOn!, today);
		if (!step) continue;
		const to = new Recipients();
		if (r.ownerId) to.add(byId.get(r.ownerId), 'You are the person responsible for this area.');
		if (r.areaInspectorId) to.add(byId.get(r.areaInspectorId), 'You are the inspector of this area.');
		if (r.completedBy) to.add(byId.get(r.completedBy), 'You recorded the inspection that found this.');
		const area: templates.AreaInfo = { id: r.areaId, name: r.areaName, room: r.room, building: r.building, labName: r.labName };
		for (const { person, reason } of to.list()) {
			const body = templates.findingOverdue({ appUrl, inspectionId: r.inspectionId, area, description: r.description, action: r.action, dueOn: r.dueOn!, daysOverdue: step.daysOverdue, reason });
			mails.push({ kind: 'finding.overdue', recordId: r.id, dueKey: r.dueOn!, step: step.step, recipientId: person.id, recipientEmail: person.email, ...mailBody(body), reason });
		}
	}
	return mails;
}

/** One mail per in-app notification created in [from, to). */
export async function notificationMailsBetween(from: Date, to: Date, appUrl: string): Promise<MailInput[]> {
	const n = table.notification;
	const rows = await db
		.select({ id: n.id, kind: n.kind, title: n.title, body: n.body, pathId: n.pathId, createdAt: n.createdAt, userId: table.user.id, email: table.user.email })
		.from(n)
		.innerJoin(table.user, eq(table.user.id, n.userId))
		.where(
			and(
				gte(n.createdAt, from),
				lt(n.createdAt, to),
				eq(table.user.disabled, false),
				// Skip those already in the ledger (the key would skip them too; this saves rendering them).
				notExists(
					db
						.select({ one: sql`1` })
						.from(table.mailOutbox)
						.where(and(eq(table.mailOutbox.kind, 'notification'), eq(table.mailOutbox.recordId, sql`${n.id}::text`)))
				)
			)
		);
	return rows.map((r) => {
		const body = templates.notificationMail({ appUrl, kind: r.kind, title: r.title, body: r.body, pathId: r.pathId, createdAt: r.createdAt });
		return { kind: 'notification' as const, recordId: r.id, dueKey: r.kind, step: 'once', recipientId: r.userId, recipientEmail: r.email, ...mailBody(body), reason: body.reason };
	});
}

async function enqueueAll(mails: MailInput[]) {
	return db.transaction((tx) => outbox.enqueue(tx, mails));
}

/**
 * Mail the in-app notifications of the last seven days that have no ledger row yet (the delivery
 * job calls this every minute, so notices go out soon after they appear).
 */
export async function enqueueNotificationMails(now: Date = new Date()): Promise<{ inserted: number; held: number }> {
	const { appUrl } = readMailConfig();
	const mails = await notificationMailsBetween(new Date(now.getTime() - NOTIFICATION_WINDOW_DAYS * 86_400_000), new Date(now.getTime() + 1), appUrl);
	return enqueueAll(mails);
}

/**
 * Every reminder due on `today` (a UTC day), put in the ledger, then the day's digests assembled.
 * Sending is separate (outbox.deliver).
 */
export async function runDaily(today: Date | string): Promise<DailyCounts> {
	const day = toIsoDay(today);
	const { appUrl } = readMailConfig();

	const inspections = await inspectionMails(day, appUrl);
	const due = await enqueueAll(inspections.filter((m) => m.kind === 'inspection.due'));
	const overdue = await enqueueAll(inspections.filter((m) => m.kind === 'inspection.overdue'));
	const reviews = await enqueueAll(await reviewWaitingMails(day, appUrl));
	const trainings = await trainingMails(day, appUrl);
	const expiring = await enqueueAll(trainings.filter((m) => m.kind === 'training.expiring'));
	const expired = await enqueueAll(trainings.filter((m) => m.kind === 'training.expired'));
	const actions = await enqueueAll(await actionOverdueMails(day, appUrl));
	const findings = await enqueueAll(await findingOverdueMails(day, appUrl));
	const { held: safetyHeld, ...safety } = await safetyReminders.runDaily(day, appUrl, enqueueAll);
	const start = startOfUtcDay(shiftDay(day, -NOTIFICATION_WINDOW_DAYS));
	const notes = await enqueueAll(await notificationMailsBetween(start, startOfUtcDay(shiftDay(day, 1)), appUrl));
	const digests = await outbox.assembleDigests(day);

	return {
		today: day,
		inspectionDue: due.inserted,
		inspectionOverdue: overdue.inserted,
		reviewWaiting: reviews.inserted,
		trainingExpiring: expiring.inserted,
		trainingExpired: expired.inserted,
		actionOverdue: actions.inserted,
		findingOverdue: findings.inserted,
		notifications: notes.inserted,
		safety,
		held: due.held + overdue.held + reviews.held + expiring.held + expired.held + actions.held + findings.held + notes.held + safetyHeld,
		digests: digests.digests,
		digestItems: digests.items
	};
}
