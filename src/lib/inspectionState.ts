// The state of an inspection on a given day, shared by server and browser.
import { differenceInCalendarDays, parseISO } from 'date-fns';

export const DUE_SOON_DAYS = 30;
export type InspectionState = 'scheduled' | 'due_soon' | 'overdue' | 'done';

/** Dates are 'YYYY-MM-DD' (calendar days, no time zone). */
export function inspectionState(dueOn: string, completedOn: string | null, today: string): InspectionState {
	if (completedOn) return 'done';
	const days = differenceInCalendarDays(parseISO(dueOn), parseISO(today));
	if (days < 0) return 'overdue';
	if (days <= DUE_SOON_DAYS) return 'due_soon';
	return 'scheduled';
}

export function todayISO(now = new Date()): string {
	return now.toISOString().slice(0, 10);
}

/** Inspections falling due (or overdue) in one calendar month, for the chart. */
export type MonthCount = { month: string; count: number };
