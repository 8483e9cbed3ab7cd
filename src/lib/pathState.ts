// Where a beam path stands, under one name used everywhere: badges, counters, filters, mails, the API.
// Derived from the stored review state and three facts: the assessment is being re-evaluated (stale),
// some accessible point lacks an input (a draft), and a clearance was given before the latest change.

export const pathStates = ['being_reevaluated', 'draft', 'awaiting_review', 'changed_since_clearance', 'returned', 'cleared', 'no_review_needed'] as const;
export type PathState = (typeof pathStates)[number];

export type PathStateInput = { stale: boolean; draft: boolean; reviewState: 'not_needed' | 'awaiting_review' | 'returned' | 'cleared'; clearedAssessmentId: string | null };

export function pathStateOf(p: PathStateInput): PathState {
	if (p.stale) return 'being_reevaluated';
	if (p.draft) return 'draft';
	if (p.reviewState === 'awaiting_review') return p.clearedAssessmentId ? 'changed_since_clearance' : 'awaiting_review';
	if (p.reviewState === 'not_needed') return 'no_review_needed';
	return p.reviewState;
}

/** The states that wait for the laser safety officer. */
export const waitingForOfficer: readonly PathState[] = ['awaiting_review', 'changed_since_clearance'];
