// Beamwarden's words for incidents and near misses, defined once: the kinds of event, the severity
// scale, the contributing-factor checklist and the states. The database enums, the schemas, the
// pages, the mails and the CSV all read them from here. Shared by client and server.
import type { StateWord } from './words';

export const incidentKinds = ['eye_exposure', 'skin_exposure', 'near_miss', 'fire_or_damage', 'non_beam'] as const;
export type IncidentKind = (typeof incidentKinds)[number];

export const kindWords: Record<IncidentKind, { word: string; hint: string }> = {
	eye_exposure: { word: 'Suspected eye exposure', hint: 'Laser light may have entered someone’s eye, directly or by a reflection.' },
	skin_exposure: { word: 'Skin exposure', hint: 'The beam or a reflection reached someone’s skin.' },
	near_miss: { word: 'Near miss', hint: 'Nobody was hurt and nothing was damaged, but it could have been otherwise.' },
	fire_or_damage: { word: 'Fire or equipment damage', hint: 'Something burned, melted or was damaged by the beam.' },
	non_beam: { word: 'Non-beam hazard', hint: 'Fumes, electrical, chemical, cryogenic or other hazards around the laser.' }
};

/** Our own severity scale, lowest first. The officer picks one when triaging. */
export const severityLevels = ['caught', 'slight', 'serious', 'grave'] as const;
export type Severity = (typeof severityLevels)[number];

export const severityWords: Record<Severity, StateWord & { rank: number }> = {
	caught: { rank: 1, word: 'caught in time', icon: 'ok', tone: 'quiet', hint: 'Nobody hurt and nothing damaged: the hazard was noticed before it did harm.' },
	slight: { rank: 2, word: 'slight', icon: 'info', tone: 'calm', hint: 'First aid at most, or small damage; no lasting effect expected; work goes on.' },
	serious: { rank: 3, word: 'serious', icon: 'alert', tone: 'caution', hint: 'A medical examination is needed, work time is lost, or equipment is out of use.' },
	grave: { rank: 4, word: 'grave', icon: 'alert', tone: 'alert', hint: 'Possible lasting harm (such as an injury to the retina), a fire, or an event to report to an authority.' }
};

/** The contributing-factor checklist of an investigation. */
export const contributingFactors = ['alignment', 'eyewear', 'procedure', 'training', 'equipment', 'enclosure', 'other'] as const;
export type ContributingFactor = (typeof contributingFactors)[number];

export const factorWords: Record<ContributingFactor, { word: string; hint: string }> = {
	alignment: { word: 'Beam alignment work', hint: 'It happened while a beam was being aligned or adjusted.' },
	eyewear: { word: 'Eyewear', hint: 'Eyewear missing, not worn, for the wrong line, or of too low an optical density.' },
	procedure: { word: 'Procedure not followed', hint: 'A written procedure existed and a step of it was skipped or changed.' },
	training: { word: 'Training', hint: 'The person had not been shown how to do this safely, or the training had lapsed.' },
	equipment: { word: 'Equipment', hint: 'A shutter, interlock, mount or other part failed or behaved unexpectedly.' },
	enclosure: { word: 'Enclosure or beam stop', hint: 'A beam left its enclosure, a cover was off, or a beam stop was missing.' },
	other: { word: 'Something else', hint: 'Describe it in the causes.' }
};

export const incidentStates = ['draft', 'reported', 'investigating', 'closed'] as const;
export type IncidentState = (typeof incidentStates)[number];

export const incidentStateWords: Record<IncidentState, StateWord> = {
	draft: { word: 'draft', icon: 'half', tone: 'quiet', hint: 'Saved by the reporter, not yet sent to the laser safety officer.' },
	reported: { word: 'reported', icon: 'clock', tone: 'caution', hint: 'Sent; waiting for the laser safety officer to look into it.' },
	investigating: { word: 'being looked into', icon: 'info', tone: 'caution', hint: 'The laser safety officer is investigating and following up.' },
	closed: { word: 'closed', icon: 'ok', tone: 'calm', hint: 'Investigated, and every corrective action is done.' }
};

export const medicalAttentionChoices = ['sought', 'not_sought', 'unknown'] as const;
export type MedicalAttention = (typeof medicalAttentionChoices)[number];
export const medicalAttentionWords: Record<MedicalAttention, string> = {
	sought: 'Yes, medical attention was sought',
	not_sought: 'No',
	unknown: 'Not yet / not known'
};

export type ActionState = 'open' | 'overdue' | 'done';
export const actionStateWords: Record<ActionState, StateWord> = {
	open: { word: 'open', icon: 'clock', tone: 'caution', hint: 'Not yet done.' },
	overdue: { word: 'overdue', icon: 'alert', tone: 'alert', hint: 'Past its due date and not yet done.' },
	done: { word: 'done', icon: 'ok', tone: 'calm', hint: 'Done, with evidence recorded.' }
};

export function actionState(dueOn: string, closedAt: string | Date | null, today: string): ActionState {
	if (closedAt) return 'done';
	return dueOn < today ? 'overdue' : 'open';
}

export const suspendedWord: StateWord = {
	word: 'suspended',
	icon: 'pause',
	tone: 'alert',
	hint: 'The laser safety officer suspended this laser after an incident: no new clearance until the suspension is lifted.'
};

/** What to do at once after a suspected eye exposure: shown on the form and after sending. */
export const eyeExposureSteps = [
	'Stop the laser work and make the beam safe (shutter closed or laser off).',
	'Get an eye examination today — go to the occupational health service or an eye clinic; do not wait for symptoms.',
	'Tell the laser safety officer now, by phone if you can. Sending this report mails every officer at once.',
	'Do not rub the eye, and do not drive yourself if your sight is affected.'
] as const;

/** A short title for lists and mails: the first line of what happened, cut at a word. */
export function titleOf(description: string, max = 90): string {
	const first = description.trim().split(/\r?\n/)[0]?.trim() ?? '';
	if (!first) return 'Untitled report';
	if (first.length <= max) return first;
	const cut = first.slice(0, max);
	return `${cut.slice(0, Math.max(cut.lastIndexOf(' '), max - 20)).trimEnd()}…`;
}
