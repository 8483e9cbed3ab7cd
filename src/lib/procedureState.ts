// Where a procedure stands on a given day, shared by server and browser. Pure.
import { differenceInCalendarDays, parseISO } from 'date-fns';

/** A review-by date is shown as due (and mailed) from this many days before. */
export const REVIEW_NOTICE_DAYS = 30;

export type ProcedureState = 'draft' | 'submitted' | 'approved' | 'review_due' | 'review_overdue' | 'to_be_reviewed';
export type VersionState = 'draft' | 'submitted' | 'approved' | 'superseded';

/**
 * Before its first approval a procedure is its draft's state. Once approved: "to be reviewed" when a
 * covered path changed, else by its review-by date (the last day the approval is meant to stand).
 */
export function procedureState(p: { reviewNeeded: boolean; current: { reviewBy: string } | null; draftState: 'draft' | 'submitted' | null }, today: string): ProcedureState {
	if (!p.current) return p.draftState ?? 'draft';
	if (p.reviewNeeded) return 'to_be_reviewed';
	const days = differenceInCalendarDays(parseISO(p.current.reviewBy), parseISO(today));
	if (days < 0) return 'review_overdue';
	if (days <= REVIEW_NOTICE_DAYS) return 'review_due';
	return 'approved';
}
