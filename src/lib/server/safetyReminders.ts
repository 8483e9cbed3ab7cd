// The daily reminders about procedures and authorisations (part of reminders.runDaily). The states
// are derived, so nothing here decides anything: it reads what holds today and puts the mails in
// the ledger, whose key makes each one go out once per cause, however often this runs.
//   procedure.review_due   the current version's review-by date within 30 days, then once overdue
//   signoff.needed         a current version the person must sign (their authorisation names it)
//   signoff.lapsing        their sign-off lapses within 30 days
//   authorisation.waiting  a request waits for the officers (weekly)
//   authorisation.lapsing  an authorisation in force ends within 30 days, and why
//   authorisation.lapsed   a condition stopped holding: recorded once per cause (audit row) and mailed
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import * as authorisations from '$lib/server/authorisations';
import type { MailInput } from '$lib/server/mail/outbox';
import * as outbox from '$lib/server/mail/outbox';
import { daysBetween, shiftDay } from '$lib/server/mail/schedule';
import * as safetyTemplates from '$lib/server/mail/safetyTemplates';
import * as procedures from '$lib/server/procedures';
import * as safetyMail from '$lib/server/safetyMail';
import { LAPSE_NOTICE_DAYS, signoffState } from '$lib/authorisationState';
import { REVIEW_NOTICE_DAYS } from '$lib/procedureState';

export type SafetyCounts = {
	procedureReviewDue: number;
	signoffNeeded: number;
	signoffLapsing: number;
	authorisationWaiting: number;
	authorisationLapsing: number;
	authorisationLapsed: number;
	held: number;
};

const body = (b: { subject: string; text: string; html: string }) => ({ subject: b.subject, text: b.text, html: b.html });
type Row = authorisations.AuthorisationRow;

async function officers() {
	return safetyMail.recipients(db, [], true);
}

/** Procedure information for mails, read once per procedure per run. */
function procedureInfoCache() {
	const cache = new Map<string, Promise<Awaited<ReturnType<typeof safetyMail.procedureInfo>>>>();
	return (id: string) => {
		if (!cache.has(id)) cache.set(id, safetyMail.procedureInfo(db, id));
		return cache.get(id)!;
	};
}

export async function procedureReviewMails(today: string, appUrl: string): Promise<MailInput[]> {
	const due = await procedures.reviewDue(shiftDay(today, REVIEW_NOTICE_DAYS));
	if (due.length === 0) return [];
	const people = await safetyMail.recipients(db, [...new Set(due.map((r) => r.ownerId))], true);
	const info = procedureInfoCache();
	const mails: MailInput[] = [];
	for (const r of due) {
		const daysUntil = daysBetween(today, r.reviewBy);
		const procedure = await info(r.procedureId);
		for (const person of people.filter((x) => x.id === r.ownerId || x.role === 'officer')) {
			const reason = person.id === r.ownerId ? 'You keep this procedure.' : 'You are a laser safety officer: procedures are reviewed with you.';
			const mail = safetyTemplates.procedureReviewDue({ appUrl, procedure, number: r.number, reviewBy: r.reviewBy, daysUntil, reason });
			mails.push({ kind: 'procedure.review_due', recordId: r.procedureId, dueKey: r.reviewBy, step: `v${r.number}:${daysUntil >= 0 ? 'before' : 'after'}`, recipientId: person.id, recipientEmail: person.email, ...body(mail), reason });
		}
	}
	return mails;
}

/** Sign-offs the holders of authorisations owe: a version to sign, or a sign-off about to lapse. */
export async function signoffMails(rows: Row[], today: string, appUrl: string): Promise<MailInput[]> {
	const granted = rows.filter((r) => r.decision === 'granted');
	if (granted.length === 0) return [];
	const { months } = await procedures.signoffInterval();
	const people = new Map((await safetyMail.recipients(db, [...new Set(granted.map((r) => r.userId))], false)).map((p) => [p.id, p]));
	const info = procedureInfoCache();
	const mails: MailInput[] = [];
	for (const r of granted) {
		const person = people.get(r.userId);
		if (!person) continue; // a disabled account is not reminded
		for (const p of r.procedures) {
			if (!p.current) continue;
			const s = signoffState(p, months, today);
			if (s.state !== 'to_sign' && s.state !== 'signoff_lapses_soon') continue;
			const procedure = await info(p.procedureId);
			const reason = `Your authorisation for ${r.targetLabel} needs your signature on this procedure.`;
			const lapsing = s.state === 'signoff_lapses_soon' ? { validUntil: s.validUntil! } : null;
			const mail = safetyTemplates.signoffNeeded({ appUrl, procedure, number: p.current.number, approvedOn: p.current.approvedOn, lapsing, reason });
			mails.push(
				lapsing
					? { kind: 'signoff.lapsing', recordId: p.procedureId, dueKey: lapsing.validUntil, step: `v${p.current.number}`, recipientId: person.id, recipientEmail: person.email, ...body(mail), reason }
					: { kind: 'signoff.needed', recordId: p.procedureId, dueKey: `v${p.current.number}`, step: 'needed', recipientId: person.id, recipientEmail: person.email, ...body(mail), reason }
			);
		}
	}
	return mails;
}

const infoOf = (r: Row): safetyTemplates.AuthorisationInfo => ({ id: r.id, personName: r.personName, targetLabel: r.targetLabel, labName: r.labName });

/** Requests waiting for the officers, weekly; the request itself sent week 0 already. */
export async function waitingMails(rows: Row[], today: string, appUrl: string): Promise<MailInput[]> {
	const waiting = rows.filter((r) => r.decision === 'requested');
	if (waiting.length === 0) return [];
	const all = await officers();
	return waiting.flatMap((r) =>
		safetyMail.authorisationWaitingMails(
			all.filter((o) => o.id !== r.userId),
			{ ...infoOf(r), requestedAt: r.requestedAt, note: r.requestNote },
			Math.max(0, daysBetween(r.requestedAt.toISOString().slice(0, 10), today)),
			appUrl
		)
	);
}

/** Authorisations in force that end within the notice window: the person, with what ends. */
export async function lapsingMails(rows: Row[], appUrl: string): Promise<MailInput[]> {
	const soon = rows.filter((r) => r.outcome.state === 'lapses_soon' && r.outcome.validUntil);
	if (soon.length === 0) return [];
	const people = new Map((await safetyMail.recipients(db, [...new Set(soon.map((r) => r.userId))], false)).map((p) => [p.id, p]));
	const mails: MailInput[] = [];
	for (const r of soon) {
		const person = people.get(r.userId);
		if (!person) continue;
		const validUntil = r.outcome.validUntil!;
		const ending = r.outcome.conditions.filter((c) => c.until === validUntil).map((c) => c.detail);
		const reason = `This is your own authorisation; it lapses by itself unless renewed within ${LAPSE_NOTICE_DAYS} days.`;
		const mail = safetyTemplates.authorisationLapsing({ appUrl, authorisation: infoOf(r), validUntil, ending, reason });
		mails.push({ kind: 'authorisation.lapsing', recordId: r.id, dueKey: validUntil, step: 'before', recipientId: person.id, recipientEmail: person.email, ...body(mail), reason });
	}
	return mails;
}

/**
 * Each lapse noticed for the first time is recorded (authorisation_lapse, unique per cause), with its
 * audit row and a mail to the person and every officer, in one transaction per authorisation.
 */
export async function recordLapses(rows: Row[], appUrl: string): Promise<{ inserted: number; held: number; lapses: number }> {
	const lapsed = rows.filter((r) => r.decision === 'granted' && r.outcome.lapses.length);
	const total = { inserted: 0, held: 0, lapses: 0 };
	if (lapsed.length === 0) return total;
	const all = await officers();
	for (const r of lapsed) {
		const out = await db.transaction(async (tx) => {
			const mails: MailInput[] = [];
			let lapses = 0;
			for (const c of r.outcome.lapses) {
				const [noticed] = await tx
					.insert(table.authorisationLapse)
					.values({ authorisationId: r.id, cause: c.key, since: c.since!, reason: c.detail })
					.onConflictDoNothing()
					.returning();
				if (!noticed) continue;
				lapses++;
				await audit.record(tx, { actorId: null, action: 'authorisation.lapse', entity: 'authorisation', entityId: r.id, after: { cause: c.key, since: c.since, reason: c.detail } });
				const to = await safetyMail.recipients(tx, [r.userId], false);
				for (const person of [...to, ...all.filter((o) => o.id !== r.userId)]) {
					const reason = person.id === r.userId ? 'This is your own authorisation.' : 'You are a laser safety officer: a lapsed authorisation is passed on to you.';
					const mail = safetyTemplates.authorisationLapsed({ appUrl, authorisation: infoOf(r), since: c.since!, reasons: r.outcome.reasons, reason });
					mails.push({ kind: 'authorisation.lapsed', recordId: r.id, dueKey: c.since!, step: c.key, recipientId: person.id, recipientEmail: person.email, ...body(mail), reason });
				}
			}
			const q = await outbox.enqueue(tx, mails);
			return { ...q, lapses };
		});
		total.inserted += out.inserted;
		total.held += out.held;
		total.lapses += out.lapses;
	}
	return total;
}

/** Everything of this module for one day; `enqueue` is the caller's (one transaction per kind). */
export async function runDaily(today: string, appUrl: string, enqueue: (mails: MailInput[]) => Promise<{ inserted: number; held: number }>): Promise<SafetyCounts> {
	const rows = await authorisations.list(null, today, { decisions: ['granted', 'requested'] });
	const review = await enqueue(await procedureReviewMails(today, appUrl));
	const signoffs = await signoffMails(rows, today, appUrl);
	const needed = await enqueue(signoffs.filter((m) => m.kind === 'signoff.needed'));
	const lapsingSignoffs = await enqueue(signoffs.filter((m) => m.kind === 'signoff.lapsing'));
	const waiting = await enqueue(await waitingMails(rows, today, appUrl));
	const lapsing = await enqueue(await lapsingMails(rows, appUrl));
	const lapsed = await recordLapses(rows, appUrl);
	return {
		procedureReviewDue: review.inserted,
		signoffNeeded: needed.inserted,
		signoffLapsing: lapsingSignoffs.inserted,
		authorisationWaiting: waiting.inserted,
		authorisationLapsing: lapsing.inserted,
		authorisationLapsed: lapsed.inserted,
		held: review.held + needed.held + lapsingSignoffs.held + waiting.held + lapsing.held + lapsed.held
	};
}
