// Mails about procedures, sign-offs and authorisations to operate. Pure functions on the shared
// layout (templates.render): every value is escaped there, every subject reduced to one line.
import { link, longDate, render, type Fact, type Rendered } from './templates';

export type ProcedureInfo = { id: string; title: string; kindLabel: string; targetLabel: string; labName: string };

const procedureFacts = (p: ProcedureInfo): Fact[] => [
	['Procedure', p.title],
	['Kind', p.kindLabel],
	['For', p.targetLabel],
	['Lab', p.labName]
];
const openProcedure = (appUrl: string, p: ProcedureInfo) => ({ label: 'Open the procedure', url: link(appUrl, 'procedures', p.id) });

export function procedureSubmitted(i: { appUrl: string; procedure: ProcedureInfo; number: number; submittedBy: string; reason: string }): Rendered {
	return render(`Procedure awaiting approval: ${i.procedure.title}`, {
		appUrl: i.appUrl,
		heading: 'A procedure awaits your approval',
		paragraphs: [`${i.submittedBy} submitted version ${i.number} of “${i.procedure.title}”. Read it, compare it with the version before, and approve it or send it back with a comment. An officer who wrote the draft cannot approve it.`],
		facts: procedureFacts(i.procedure),
		action: openProcedure(i.appUrl, i.procedure),
		reason: i.reason
	});
}

export function procedureToReview(i: { appUrl: string; procedure: ProcedureInfo; pathName: string; reason: string }): Rendered {
	return render(`Procedure to be reviewed: ${i.procedure.title}`, {
		appUrl: i.appUrl,
		heading: 'A procedure may no longer match its set-up',
		paragraphs: [
			`The beam path “${i.pathName}”, which this procedure covers, changed and went back to review. Check that the procedure still describes the set-up; change it and submit a new version, or confirm it as it stands.`,
			'Until then, people keep working to the approved version; the laser safety officer decides whether the work should pause.'
		],
		facts: [...procedureFacts(i.procedure), ['Beam path', i.pathName]],
		action: openProcedure(i.appUrl, i.procedure),
		reason: i.reason
	});
}

export function procedureReviewDue(i: { appUrl: string; procedure: ProcedureInfo; number: number; reviewBy: string; daysUntil: number; reason: string }): Rendered {
	const overdue = i.daysUntil < 0;
	const when = overdue ? `was due on ${longDate(i.reviewBy)}` : i.daysUntil === 0 ? 'is due today' : `is due on ${longDate(i.reviewBy)}`;
	return render(`Procedure review ${overdue ? 'overdue' : 'due'}: ${i.procedure.title}`, {
		appUrl: i.appUrl,
		heading: overdue ? 'A procedure’s review is overdue' : 'A procedure’s review is due soon',
		paragraphs: [`The review of version ${i.number} of “${i.procedure.title}” ${when}. Check it against the lasers and paths as they are now, and approve a new version or a new review-by date.`],
		facts: [...procedureFacts(i.procedure), ['Review by', longDate(i.reviewBy)]],
		action: openProcedure(i.appUrl, i.procedure),
		reason: i.reason
	});
}

export function signoffNeeded(i: { appUrl: string; procedure: ProcedureInfo; number: number; approvedOn: string; lapsing: { validUntil: string } | null; reason: string }): Rendered {
	const again = i.lapsing !== null;
	return render(`${again ? 'Sign again' : 'Please read and sign'}: ${i.procedure.title}`, {
		appUrl: i.appUrl,
		heading: again ? 'Your sign-off is about to lapse' : 'A procedure needs your signature',
		paragraphs: [
			again
				? `Your sign-off of “${i.procedure.title}” (version ${i.number}) holds until ${longDate(i.lapsing!.validUntil)}. Read it again and sign, so that your authorisation does not lapse.`
				: `Version ${i.number} of “${i.procedure.title}” was approved on ${longDate(i.approvedOn)}. Read it and sign that you have read and understood it: your authorisation needs it.`
		],
		facts: [...procedureFacts(i.procedure), ['Version', String(i.number)]],
		action: { label: 'Read and sign', url: link(i.appUrl, 'procedures', i.procedure.id) },
		reason: i.reason
	});
}

export type AuthorisationInfo = { id: string; personName: string; targetLabel: string; labName: string };

const authorisationFacts = (a: AuthorisationInfo): Fact[] => [
	['Person', a.personName],
	['For', a.targetLabel],
	['Lab', a.labName]
];
const openAuthorisation = (appUrl: string, a: AuthorisationInfo) => ({ label: 'Open the authorisation', url: link(appUrl, 'authorisations', a.id) });

export function authorisationWaiting(i: { appUrl: string; authorisation: AuthorisationInfo; requestedOn: string; daysWaiting: number; note: string; reason: string }): Rendered {
	const waited = i.daysWaiting > 0 ? ` It has waited ${i.daysWaiting} day${i.daysWaiting === 1 ? '' : 's'}.` : '';
	return render(`Authorisation request waiting: ${i.authorisation.personName}, ${i.authorisation.targetLabel}`, {
		appUrl: i.appUrl,
		heading: 'A request for authorisation waits for you',
		paragraphs: [`${i.authorisation.personName} asks to be authorised for ${i.authorisation.targetLabel}.${waited} Grant it with its conditions, or refuse it with a reason.`, ...(i.note ? [`Their note: ${i.note}`] : [])],
		facts: [...authorisationFacts(i.authorisation), ['Requested on', longDate(i.requestedOn)]],
		action: openAuthorisation(i.appUrl, i.authorisation),
		reason: i.reason
	});
}

export function authorisationLapsing(i: { appUrl: string; authorisation: AuthorisationInfo; validUntil: string; ending: string[]; reason: string }): Rendered {
	return render(`Authorisation lapses on ${longDate(i.validUntil)}: ${i.authorisation.targetLabel}`, {
		appUrl: i.appUrl,
		heading: 'An authorisation lapses soon',
		paragraphs: [`The authorisation of ${i.authorisation.personName} for ${i.authorisation.targetLabel} holds until ${longDate(i.validUntil)}, because:`, i.ending.map((e) => `• ${e}`).join('\n'), 'Renew the training or sign again in good time; after that day the authorisation lapses by itself.'],
		facts: [...authorisationFacts(i.authorisation), ['Holds until', longDate(i.validUntil)]],
		action: openAuthorisation(i.appUrl, i.authorisation),
		reason: i.reason
	});
}

export function authorisationLapsed(i: { appUrl: string; authorisation: AuthorisationInfo; since: string; reasons: string[]; reason: string }): Rendered {
	return render(`Authorisation lapsed: ${i.authorisation.personName}, ${i.authorisation.targetLabel}`, {
		appUrl: i.appUrl,
		heading: 'An authorisation has lapsed',
		paragraphs: [
			`Since ${longDate(i.since)} the authorisation of ${i.authorisation.personName} for ${i.authorisation.targetLabel} no longer holds, because:`,
			i.reasons.map((r) => `• ${r}`).join('\n'),
			'Until every condition holds again, the person may not operate the laser or work in the area unsupervised; the laser safety officer decides.'
		],
		facts: [...authorisationFacts(i.authorisation), ['Lapsed on', longDate(i.since)]],
		action: openAuthorisation(i.appUrl, i.authorisation),
		reason: i.reason
	});
}
