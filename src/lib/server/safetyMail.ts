// Mails that an event sends at once (a procedure submitted, a covered path back in review, a request
// for authorisation), put in the mail ledger inside the event's own transaction: the event and its
// word commit together. The delivery job sends them within a minute (a route may nudge it sooner).
import { and, eq, inArray, or } from 'drizzle-orm';
import type { db, Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { readMailConfig } from '$lib/server/mail/config';
import * as outbox from '$lib/server/mail/outbox';
import * as safetyTemplates from '$lib/server/mail/safetyTemplates';
import { procedureKindWords } from '$lib/words';

export type Recipient = { id: string; email: string; name: string; role: string };

/** Active people by id, and (if asked) every active officer. */
export async function recipients(tx: Tx | typeof db, ids: (string | null)[], withOfficers: boolean): Promise<Recipient[]> {
	const u = table.user;
	const wanted = ids.filter((x): x is string => !!x);
	const conds = [];
	if (wanted.length) conds.push(inArray(u.id, wanted));
	if (withOfficers) conds.push(eq(u.role, 'officer'));
	if (conds.length === 0) return [];
	return tx
		.select({ id: u.id, email: u.email, name: u.name, role: u.role })
		.from(u)
		.where(and(eq(u.disabled, false), or(...conds)));
}

/** What a mail says about a procedure: its title, kind, laser or area, lab. */
export async function procedureInfo(tx: Tx | typeof db, procedureId: string): Promise<safetyTemplates.ProcedureInfo & { ownerId: string }> {
	const p = table.procedure;
	const [row] = await tx
		.select({ id: p.id, title: p.title, kind: p.kind, ownerId: p.ownerId, labName: table.lab.name, maker: table.laser.maker, model: table.laser.model, areaName: table.area.name })
		.from(p)
		.innerJoin(table.lab, eq(table.lab.id, p.labId))
		.leftJoin(table.laser, eq(table.laser.id, p.laserId))
		.leftJoin(table.area, eq(table.area.id, p.areaId))
		.where(eq(p.id, procedureId));
	return { id: row.id, title: row.title, kindLabel: procedureKindWords[row.kind], targetLabel: row.areaName ?? `${row.maker} ${row.model}`, labName: row.labName, ownerId: row.ownerId };
}

const body = (b: { subject: string; text: string; html: string }) => ({ subject: b.subject, text: b.text, html: b.html });

/** A draft was submitted: every officer but the one who submitted it. */
export async function procedureSubmitted(tx: Tx, procedureId: string, number: number, submitter: { id: string; name: string }, submittedAt: Date) {
	const { appUrl } = readMailConfig();
	const info = await procedureInfo(tx, procedureId);
	const reason = 'You are a laser safety officer, and a procedure waits for approval by an officer who did not write it.';
	const mail = safetyTemplates.procedureSubmitted({ appUrl, procedure: info, number, submittedBy: submitter.name, reason });
	const to = (await recipients(tx, [], true)).filter((r) => r.id !== submitter.id);
	await outbox.enqueue(
		tx,
		to.map((r) => ({ kind: 'procedure.submitted' as const, recordId: procedureId, dueKey: submittedAt.toISOString(), step: 'once', recipientId: r.id, recipientEmail: r.email, ...body(mail), reason }))
	);
}

/** A covered path went back to review: the procedure's owner and every officer. */
export async function procedureToReview(tx: Tx, procedureId: string, pathName: string, since: Date) {
	const { appUrl } = readMailConfig();
	const info = await procedureInfo(tx, procedureId);
	const mails = (await recipients(tx, [info.ownerId], true)).map((r) => {
		const reason = r.id === info.ownerId ? 'You keep this procedure, and a beam path it covers went back to review.' : 'You are a laser safety officer, and a beam path that a procedure covers went back to review.';
		const mail = safetyTemplates.procedureToReview({ appUrl, procedure: info, pathName, reason });
		return { kind: 'procedure.review' as const, recordId: procedureId, dueKey: since.toISOString(), step: 'once', recipientId: r.id, recipientEmail: r.email, ...body(mail), reason };
	});
	await outbox.enqueue(tx, mails);
}

/** Someone asked for an authorisation: every officer (the daily run repeats it weekly while it waits). */
export function authorisationWaitingMails(
	officers: Recipient[],
	a: safetyTemplates.AuthorisationInfo & { requestedAt: Date; note: string },
	daysWaiting: number,
	appUrl: string
): outbox.MailInput[] {
	const reason = 'You are a laser safety officer, and a request for authorisation waits for an answer.';
	const mail = safetyTemplates.authorisationWaiting({ appUrl, authorisation: a, requestedOn: a.requestedAt.toISOString().slice(0, 10), daysWaiting, note: a.note, reason });
	const step = String(Math.floor(daysWaiting / 7));
	return officers.map((o) => ({ kind: 'authorisation.waiting' as const, recordId: a.id, dueKey: a.requestedAt.toISOString(), step, recipientId: o.id, recipientEmail: o.email, ...body(mail), reason }));
}
