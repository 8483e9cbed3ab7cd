// Beamwarden's words for states, shared by every screen. Status is always a word plus an icon.
import type { IconName } from '$lib/components/Icon.svelte';
import type { PathState } from '$lib/pathState';

export type Tone = 'alert' | 'caution' | 'calm' | 'quiet';
export type StateWord = { word: string; icon: IconName; tone: Tone; hint: string };

export const verdictWords: Record<string, StateWord> = {
	within_limit: { word: 'within limit', icon: 'ok', tone: 'calm', hint: 'Every accessible point is below every applicable limit, as computed from the entered data.' },
	exceeds_limit: { word: 'exceeds limit', icon: 'alert', tone: 'alert', hint: 'At least one accessible point exceeds an applicable limit.' },
	no_applicable_limit: {
		word: 'no applicable limit',
		icon: 'blank',
		tone: 'caution',
		hint: 'No limit in the library covers this wavelength, tissue and duration. This is not a sign of safety.'
	},
	incomplete: { word: 'incomplete', icon: 'half', tone: 'caution', hint: 'Some input needed for the assessment is missing.' },
	unassessed: { word: 'not yet assessed', icon: 'blank', tone: 'quiet', hint: 'No assessment has been saved for this path.' }
};

/** Where a beam path stands (see pathState.ts): one name per state, everywhere. */
export const pathStateWords: Record<PathState, StateWord> = {
	being_reevaluated: { word: 'being re-evaluated', icon: 'clock', tone: 'caution', hint: 'Its laser line, a limit or the engine changed; the assessment is being computed again.' },
	draft: { word: 'draft', icon: 'half', tone: 'caution', hint: 'Some accessible point lacks an input: it is saved as work in progress and cannot be reviewed or cleared until every accessible point is complete.' },
	awaiting_review: { word: 'awaiting review', icon: 'clock', tone: 'caution', hint: 'Not within limit: waiting for the laser safety officer.' },
	changed_since_clearance: { word: 'changed since clearance', icon: 'clock', tone: 'caution', hint: 'It was cleared, then changed: waiting for the laser safety officer again.' },
	returned: { word: 'returned', icon: 'out', tone: 'alert', hint: 'The laser safety officer returned it with comments for the researcher.' },
	cleared: { word: 'cleared with controls', icon: 'ok', tone: 'calm', hint: 'The laser safety officer cleared it with the required controls.' },
	no_review_needed: { word: 'no review needed', icon: 'blank', tone: 'quiet', hint: 'The latest assessment is within limit.' }
};

/** A stored emission line whose values the engine refuses (stored before the line rules, or imported). */
export const lineNeedsAttentionWord: StateWord = { word: 'cannot be assessed', icon: 'half', tone: 'caution', hint: 'The line’s stored values break the rules of the assessment; correct the line before relying on any path of it.' };

/** A stored snapshot that a change of line, limit or engine made out of date (a newer one replaces it). */
export const snapshotOutdatedWord: StateWord = { word: 'out of date', icon: 'clock', tone: 'caution', hint: 'Its laser line, a limit or the engine changed after this snapshot; a re-evaluation replaces it.' };

/** A review decision, in the words of the state it sets. */
export const decisionWords: Record<'cleared' | 'returned', StateWord> = { cleared: pathStateWords.cleared, returned: pathStateWords.returned };

export const eyewearWords: Record<string, StateWord> = {
	adequate: { word: 'adequate', icon: 'ok', tone: 'calm', hint: 'The lab holds one usable pair that covers every line of the path at its required OD.' },
	inadequate: { word: 'inadequate', icon: 'alert', tone: 'alert', hint: 'No single pair of the lab’s eyewear covers every line of the path at its required OD.' },
	none_on_record: { word: 'none on record', icon: 'blank', tone: 'alert', hint: 'No usable eyewear of the lab has a band at these wavelengths.' }
};

export const inspectionWords: Record<string, StateWord> = {
	scheduled: { word: 'scheduled', icon: 'calendar', tone: 'quiet', hint: 'Due more than 30 days from today.' },
	due_soon: { word: 'due soon', icon: 'clock', tone: 'caution', hint: 'Due within 30 days.' },
	overdue: { word: 'overdue', icon: 'alert', tone: 'alert', hint: 'Past its due date and not yet done.' },
	done: { word: 'done', icon: 'ok', tone: 'calm', hint: 'Recorded as done.' }
};

/** An inspection finding whose follow-up is past its due day and not closed. */
export const findingOverdueWord: StateWord = { word: 'overdue', icon: 'alert', tone: 'alert', hint: 'The follow-up is past its due day and the finding is not closed.' };

export const trainingWords: Record<string, StateWord> = {
	current: { word: 'current', icon: 'ok', tone: 'calm', hint: 'Valid for more than 30 days.' },
	expires_soon: { word: 'expires soon', icon: 'clock', tone: 'caution', hint: 'Expires within 30 days.' },
	expired: { word: 'expired', icon: 'alert', tone: 'alert', hint: 'Past its expiry date: renew it.' },
	no_expiry: { word: 'no expiry', icon: 'ok', tone: 'quiet', hint: 'Recorded without an expiry date.' },
	renewed: { word: 'renewed', icon: 'ok', tone: 'quiet', hint: 'A later record of the same training replaces it.' },
	withdrawn: { word: 'withdrawn', icon: 'list', tone: 'quiet', hint: 'Withdrawn by an officer; kept for the record.' }
};

export const laserStatusWords: Record<string, string> = { active: 'in use', in_storage: 'in storage', retired: 'retired' };
export const modeWords: Record<string, string> = { continuous: 'continuous', single_pulse: 'single pulse', repetitive: 'repetitively pulsed' };
export const elementWords: Record<string, string> = {
	propagate: 'Free space',
	transmission: 'Window, filter or splitter branch',
	mirror: 'Mirror',
	expander: 'Beam expander or reducer',
	lens: 'Focusing lens',
	fibre: 'Fibre output',
	enclosure: 'Enclosed section'
};
export const definitionWords: Record<string, string> = { '1/e': '1/e', '1/e2': '1/e²', fwhm: 'FWHM' };
export const profileWords: Record<string, string> = { gaussian: 'Gaussian', flat_top: 'flat-top (even across its full width)' };

export const caution =
	'Computed from the data entered here. It does not replace measurement; the laser safety officer and the applicable local code decide.';

export const procedureWords: Record<string, StateWord> = {
	draft: { word: 'draft', icon: 'half', tone: 'quiet', hint: 'Being written; not yet submitted for approval.' },
	submitted: { word: 'awaiting approval', icon: 'clock', tone: 'caution', hint: 'Submitted; waiting for a laser safety officer who did not write it.' },
	approved: { word: 'approved', icon: 'ok', tone: 'calm', hint: 'Approved by a laser safety officer and in force.' },
	superseded: { word: 'superseded', icon: 'list', tone: 'quiet', hint: 'A later approved version replaces it; kept for the record.' },
	review_due: { word: 'review due soon', icon: 'clock', tone: 'caution', hint: 'Its review-by date is within 30 days.' },
	review_overdue: { word: 'review overdue', icon: 'alert', tone: 'alert', hint: 'Past its review-by date: the officer should review it.' },
	to_be_reviewed: { word: 'to be reviewed', icon: 'alert', tone: 'alert', hint: 'A beam path it covers changed and went back to review: the text may no longer match the set-up.' }
};

export const procedureKindWords: Record<string, string> = {
	operating: 'Operating procedure',
	alignment: 'Alignment procedure',
	service: 'Maintenance and service procedure',
	emergency: 'Emergency procedure'
};

export const signoffWords: Record<string, StateWord> = {
	signed: { word: 'signed', icon: 'ok', tone: 'calm', hint: 'The current version is signed and the sign-off has not lapsed.' },
	signoff_lapses_soon: { word: 'sign again soon', icon: 'clock', tone: 'caution', hint: 'The sign-off lapses within 30 days: read and sign again.' },
	signoff_lapsed: { word: 'sign-off lapsed', icon: 'alert', tone: 'alert', hint: 'The sign-off is older than the programme’s interval: read and sign again.' },
	to_sign: { word: 'to sign', icon: 'pen', tone: 'caution', hint: 'The current approved version has not been signed yet.' },
	no_approved_version: { word: 'nothing to sign yet', icon: 'blank', tone: 'quiet', hint: 'No version has been approved yet.' }
};

export const authorisationWords: Record<string, StateWord> = {
	requested: { word: 'requested', icon: 'clock', tone: 'caution', hint: 'Waiting for a laser safety officer to grant or refuse it.' },
	pending: { word: 'not yet in force', icon: 'half', tone: 'caution', hint: 'Granted, but a condition has not been met yet.' },
	active: { word: 'active', icon: 'ok', tone: 'calm', hint: 'Granted, and every condition holds today.' },
	lapses_soon: { word: 'lapses soon', icon: 'clock', tone: 'caution', hint: 'In force, but a condition ends within 30 days.' },
	lapsed: { word: 'lapsed', icon: 'alert', tone: 'alert', hint: 'A condition no longer holds: the person may not operate until it does again.' },
	refused: { word: 'refused', icon: 'out', tone: 'quiet', hint: 'Refused by a laser safety officer, with a reason.' },
	withdrawn: { word: 'withdrawn', icon: 'list', tone: 'quiet', hint: 'Withdrawn by a laser safety officer; kept for the record.' }
};

export const visitorKindWords: Record<string, string> = { visitor: 'Visitor', contractor: 'Contractor' };

/** The door posting of a laser controlled area. */
export const postingWords = {
	heading: 'Laser controlled area',
	entry: 'Authorised people only. Wear the eyewear posted here when the lasers are on.',
	emergency:
		'In an emergency: switch the lasers off (key switch or emergency stop), keep everyone out, and call the laser safety officer. After a suspected eye exposure, do not rub the eye, do not look at a bright light to test it, and get medical help at once.',
	notAssessed: 'not determined — ask the laser safety officer',
	caution: 'Eyewear figures are computed from the data entered in Beamwarden and do not replace measurement; the laser safety officer decides.'
};

/** Element kinds in a word or two, for labels inside drawings. */
export const elementShortWords: Record<string, string> = { propagate: 'free space', transmission: 'window / filter', mirror: 'mirror', expander: 'expander', lens: 'lens', fibre: 'fibre', enclosure: 'enclosure' };
