// Where a beam path stands, under one name used everywhere: badges, counters, filters, mails, the API.
// Derived from the stored review state and two facts: the assessment is being re-evaluated (stale),
// and a clearance was given before the latest change (a cleared assessment that is no longer the latest).

export const pathStates = ['being_reevaluated', 'awaiting_review', 'changed_since_clearance', 'returned', 'cleared', 'no_review_needed'] as const;
export type PathState = (typeof pathStates)[number];

export type PathStateInput = { stale: boolean; reviewState: 'not_needed' | 'awaiting_review' | 'returned' | 'cleared'; clearedAssessmentId: string | null };

export function pathStateOf(p: PathStateInput): PathState {
	if (p.stale) return 'being_reevaluated';
	if (p.reviewState === 'awaiting_review') return p.clearedAssessmentId ? 'changed_since_clearance' : 'awaiting_review';
	if (p.reviewState === 'not_needed') return 'no_review_needed';
	return p.reviewState;
}

/** The states that wait for the laser safety officer. */
export const waitingForOfficer: readonly PathState[] = ['awaiting_review', 'changed_since_clearance'];
