// When each reminder is due: pure date rules on 'YYYY-MM-DD' days (UTC), no I/O.
// Each rule is a window, not an exact day, so a day on which the daily job did not run is caught
// up the next time it runs; but a window names one step only, so a late run sends the current
// step and never the older ones it missed.
import { addDays, differenceInCalendarDays, formatISO, parseISO } from 'date-fns';
import { TRAINING_EXPIRED_NOTICE_DAYS, TRAINING_NOTICE_DAYS } from '$lib/trainingState';

export const REVIEW_WAIT_DAYS = 7;

const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

/** A day as 'YYYY-MM-DD': a string is checked, a Date is read in UTC. */
export function toIsoDay(day: Date | string): string {
	if (typeof day === 'string') {
		if (!ISO_DAY.test(day) || Number.isNaN(parseISO(day).getTime()) || formatISO(parseISO(day), { representation: 'date' }) !== day)
			throw new Error(`not a calendar date (YYYY-MM-DD): ${day}`);
		return day;
	}
	if (Number.isNaN(day.getTime())) throw new Error('not a valid date');
	return day.toISOString().slice(0, 10);
}

/** Whole days from `from` to `to` (both 'YYYY-MM-DD'); positive when `to` is later. */
export function daysBetween(from: string, to: string): number {
	return differenceInCalendarDays(parseISO(to), parseISO(from));
}

export function shiftDay(day: string, days: number): string {
	return formatISO(addDays(parseISO(day), days), { representation: 'date' });
}

/** Midnight UTC at the start of a day. */
export function startOfUtcDay(day: string): Date {
	return new Date(`${day}T00:00:00.000Z`);
}

export type InspectionStep =
	| { kind: 'inspection.due'; step: '30' | '7' | '0'; daysUntil: number }
	| { kind: 'inspection.overdue'; step: string; weeksOverdue: number; escalate: boolean };

/**
 * The one reminder an open inspection is in for, on `today`:
 *   30 days before   when it is due in 8 … 30 days
 *   7 days before    when it is due in 1 … 7 days
 *   on the day       on the due day and the six days after (catch-up)
 *   overdue, week n  from n·7 days after the due day (n ≥ 1), weekly; managers from week 2
 */
export function inspectionStep(dueOn: string, today: string): InspectionStep | null {
	const daysUntil = daysBetween(today, dueOn);
	if (daysUntil > 30) return null;
	if (daysUntil > 7) return { kind: 'inspection.due', step: '30', daysUntil };
	if (daysUntil > 0) return { kind: 'inspection.due', step: '7', daysUntil };
	const daysOver = -daysUntil;
	if (daysOver < 7) return { kind: 'inspection.due', step: '0', daysUntil };
	const weeks = Math.floor(daysOver / 7);
	return { kind: 'inspection.overdue', step: String(weeks), weeksOverdue: weeks, escalate: weeks >= 2 };
}

/**
 * A path awaiting review is reminded about once it has waited more than seven days, then weekly:
 * step n covers the days 7n+1 … 7n+7 of the wait.
 */
export function reviewWaitStep(awaitingSinceDay: string, today: string): { step: string; daysWaiting: number } | null {
	const daysWaiting = daysBetween(awaitingSinceDay, today);
	if (daysWaiting <= REVIEW_WAIT_DAYS) return null;
	return { step: String(Math.floor((daysWaiting - 1) / REVIEW_WAIT_DAYS)), daysWaiting };
}

/**
 * The one reminder a training record is in for, on `today` (a record is valid up to and including
 * its expiry day):
 *   expiring   in the 30 days up to and including the expiry day (one mail)
 *   expired    in the seven days after it (one mail, catch-up), officers told as well
 */
export function trainingStep(expiresOn: string, today: string): { kind: 'training.expiring' | 'training.expired'; daysUntil: number } | null {
	const daysUntil = daysBetween(today, expiresOn);
	if (daysUntil > TRAINING_NOTICE_DAYS || daysUntil < -TRAINING_EXPIRED_NOTICE_DAYS) return null;
	return { kind: daysUntil >= 0 ? 'training.expiring' : 'training.expired', daysUntil };
}

/**
 * An open corrective action is reminded about weekly once past its due day: step n covers the
 * days 7n+1 … 7n+7 after it (a late run sends the current week only).
 */
export function actionOverdueStep(dueOn: string, today: string): { step: string; daysOverdue: number } | null {
	const daysOverdue = daysBetween(dueOn, today);
	if (daysOverdue < 1) return null;
	return { step: String(Math.floor((daysOverdue - 1) / 7)), daysOverdue };
}
