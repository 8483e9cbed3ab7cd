// The state of a training record on a given day, shared by server and browser.
import { differenceInCalendarDays, parseISO } from 'date-fns';

/** Reminded from this many days before expiry; shown as "expires soon" from then on. */
export const TRAINING_NOTICE_DAYS = 30;
/** Reminded (with the officers) for this many days after expiry: a late daily run catches up. */
export const TRAINING_EXPIRED_NOTICE_DAYS = 7;
export type TrainingState = 'current' | 'expires_soon' | 'expired' | 'no_expiry' | 'renewed' | 'withdrawn';

/**
 * Dates are 'YYYY-MM-DD'. A record is valid up to and including its expiry day; one superseded by a
 * later record of the same topic for the same person is "renewed".
 */
export function trainingState(expiresOn: string | null, withdrawn: boolean, today: string, renewed = false): TrainingState {
	if (withdrawn) return 'withdrawn';
	if (renewed) return 'renewed';
	if (!expiresOn) return 'no_expiry';
	const days = differenceInCalendarDays(parseISO(expiresOn), parseISO(today));
	if (days < 0) return 'expired';
	if (days <= TRAINING_NOTICE_DAYS) return 'expires_soon';
	return 'current';
}
