// Beamwarden's mail templates: plain text and HTML from the same parts. Pure functions, no I/O.
// Every inserted value is HTML-escaped; every subject is reduced to one clean line.
import { format, parseISO } from 'date-fns';

export type Rendered = { subject: string; text: string; html: string };

export type Fact = [label: string, value: string];

export type Layout = {
	appUrl: string;
	heading: string;
	paragraphs: string[];
	facts?: Fact[];
	action?: { label: string; url: string };
	/** Why this person got the mail. */
	reason: string;
	/** Extra lines for the footer (e.g. what to do if the reset was not asked for). */
	footerNote?: string;
	/** The preferences line is left out where the preference does not apply (password reset). */
	showPreferences?: boolean;
	list?: { title: string; detail: string; url: string }[];
};

const SUBJECT_MAX = 160;

/**
 * One line fit for a mail header: control characters (CR, LF, TAB, NUL, DEL, C1, and the Unicode
 * line and paragraph separators) become spaces, runs of spaces collapse, the ends are trimmed and
 * an overlong line is cut with an ellipsis. A record title can never add a header.
 */
export function cleanHeaderText(value: string, max = SUBJECT_MAX): string {
	// eslint-disable-next-line no-control-regex
	const one = value.replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029]+/g, ' ').replace(/\s+/g, ' ').trim();
	if (one.length <= max) return one;
	return `${[...one].slice(0, max - 1).join('').trimEnd()}…`;
}

/** Text inside a body: no control characters except line breaks, and no CR. */
function cleanBodyText(value: string): string {
	// eslint-disable-next-line no-control-regex
	return value.replace(/\r\n?/g, '\n').replace(/[\u0000-\u0009\u000b-\u001f\u007f-\u009f]/g, ' ');
}

export function escapeHtml(value: string): string {
	return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** Join the app's base URL and a path of our own; each dynamic segment is URL-encoded. */
export function link(appUrl: string, ...segments: string[]): string {
	return `${appUrl.replace(/\/+$/, '')}/${segments.map((s) => encodeURIComponent(s)).join('/')}`;
}

export function longDate(isoDate: string): string {
	return format(parseISO(isoDate), 'd MMMM yyyy');
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

const ACCENT = '#1d5c7a';

export function render(subject: string, l: Layout): Rendered {
	const preferences = link(l.appUrl, 'preferences');
	const facts = (l.facts ?? []).map(([k, v]) => [cleanHeaderText(k, 80), cleanBodyText(v)] as const);

	// Plain text
	const t: string[] = [l.heading, ''];
	for (const p of l.paragraphs) t.push(cleanBodyText(p), '');
	if (facts.length) {
		const width = Math.max(...facts.map(([k]) => k.length));
		for (const [k, v] of facts) t.push(`  ${`${k}:`.padEnd(width + 2)}${v}`);
		t.push('');
	}
	for (const item of l.list ?? []) t.push(`- ${cleanHeaderText(item.title)}`, `  ${cleanBodyText(item.detail)}`, `  ${item.url}`, '');
	if (l.action) t.push(`${l.action.label}: ${l.action.url}`, '');
	t.push('-- ', `Why you got this: ${cleanBodyText(l.reason)}`);
	if (l.footerNote) t.push(cleanBodyText(l.footerNote));
	if (l.showPreferences !== false) t.push(`Choose separate mails or one daily digest under Preferences: ${preferences}`);
	t.push('Beamwarden, the laser safety register. It computes from entered data; the LSO and the local code decide.');
	const text = `${t.join('\n')}\n`;

	// HTML: a small, calm layout with the same parts
	const e = escapeHtml;
	const para = (s: string) => `<p style="margin:0 0 14px">${e(cleanBodyText(s)).replace(/\n/g, '<br>')}</p>`;
	const h: string[] = [];
	h.push(
		'<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>',
		e(subject),
		'</title></head>',
		'<body style="margin:0;padding:0;background:#f4f5f2;color:#1f2328;font-family:\'Atkinson Hyperlegible\',Verdana,Arial,sans-serif;font-size:16px;line-height:1.5">',
		'<div style="max-width:560px;margin:0 auto;padding:24px 16px">',
		`<p style="margin:0 0 16px;font-weight:700;letter-spacing:.02em;color:${ACCENT}">Beamwarden</p>`,
		'<div style="background:#ffffff;border:1px solid #d9dcd4;border-radius:6px;padding:20px 22px">',
		`<h1 style="margin:0 0 14px;font-size:20px;line-height:1.3">${e(l.heading)}</h1>`
	);
	for (const p of l.paragraphs) h.push(para(p));
	if (facts.length) {
		h.push('<table role="presentation" style="border-collapse:collapse;margin:0 0 16px">');
		for (const [k, v] of facts) h.push(`<tr><th scope="row" style="text-align:left;padding:2px 16px 2px 0;font-weight:700;vertical-align:top">${e(k)}</th><td style="padding:2px 0">${e(v)}</td></tr>`);
		h.push('</table>');
	}
	if (l.list?.length) {
		h.push('<ul style="margin:0 0 16px;padding-left:20px">');
		for (const item of l.list)
			h.push(`<li style="margin:0 0 10px"><a href="${e(item.url)}" style="color:${ACCENT};font-weight:700">${e(cleanHeaderText(item.title))}</a><br><span style="color:#4a4f55">${e(cleanBodyText(item.detail))}</span></li>`);
		h.push('</ul>');
	}
	if (l.action)
		h.push(`<p style="margin:18px 0 4px"><a href="${e(l.action.url)}" style="display:inline-block;background:${ACCENT};color:#ffffff;text-decoration:none;padding:9px 16px;border-radius:4px;font-weight:700">${e(l.action.label)}</a></p>`, `<p style="margin:0;font-size:13px;color:#4a4f55;word-break:break-all">${e(l.action.url)}</p>`);
	h.push('</div>', '<div style="padding:14px 4px 0;font-size:13px;color:#4a4f55">');
	h.push(`<p style="margin:0 0 8px"><strong>Why you got this:</strong> ${e(cleanBodyText(l.reason))}</p>`);
	if (l.footerNote) h.push(`<p style="margin:0 0 8px">${e(cleanBodyText(l.footerNote))}</p>`);
	if (l.showPreferences !== false)
		h.push(`<p style="margin:0 0 8px">Choose separate mails or one daily digest under <a href="${e(preferences)}" style="color:${ACCENT}">Preferences</a>.</p>`);
	h.push('<p style="margin:0">Beamwarden, the laser safety register. It computes from entered data; the LSO and the local code decide.</p>');
	h.push('</div></div></body></html>');

	return { subject: cleanHeaderText(subject), text, html: h.join('') };
}

// ---------------------------------------------------------------------------------------------
// Inspections

export type AreaInfo = { id: string; name: string; room: string; building: string; labName: string };

function areaLabel(a: AreaInfo): string {
	const where = [a.room && `room ${a.room}`, a.building].filter(Boolean).join(', ');
	return where ? `${a.name} (${where})` : a.name;
}

function areaFacts(a: AreaInfo, dueOn: string): Fact[] {
	return [
		['Area', a.name],
		['Where', [a.room && `Room ${a.room}`, a.building].filter(Boolean).join(', ') || 'not recorded'],
		['Lab', a.labName],
		['Due on', longDate(dueOn)]
	];
}

export type InspectionDueInput = {
	appUrl: string;
	inspectionId: string;
	area: AreaInfo;
	dueOn: string;
	/** Whole days from the day of the run to the due date (0 = today). */
	daysUntil: number;
	reason: string;
};

export function inspectionDue(i: InspectionDueInput): Rendered {
	const d = i.daysUntil;
	const when = d < 0 ? `since ${longDate(i.dueOn)}` : d === 0 ? 'today' : d === 1 ? 'tomorrow' : `in ${d} days`;
	const first =
		d < 0
			? `The inspection of ${areaLabel(i.area)} was due on ${longDate(i.dueOn)}, ${plural(-d, 'day')} ago. Please record it in Beamwarden once it is done.`
			: d === 0
				? `The inspection of ${areaLabel(i.area)} is due today. Please record it in Beamwarden once it is done.`
				: `The inspection of ${areaLabel(i.area)} is due on ${longDate(i.dueOn)}. Now is a good time to agree a date with the people who work there.`;
	return render(`Inspection due ${when}: ${areaLabel(i.area)}`, {
		appUrl: i.appUrl,
		heading: `Inspection due ${when}`,
		paragraphs: [first],
		facts: areaFacts(i.area, i.dueOn),
		action: { label: 'Open the inspection', url: link(i.appUrl, 'inspections', i.inspectionId) },
		reason: i.reason
	});
}

export type InspectionOverdueInput = {
	appUrl: string;
	inspectionId: string;
	area: AreaInfo;
	dueOn: string;
	weeksOverdue: number;
	inspectorName: string | null;
	reason: string;
};

export function inspectionOverdue(i: InspectionOverdueInput): Rendered {
	const weeks = plural(i.weeksOverdue, 'week');
	return render(`Inspection overdue by ${weeks}: ${areaLabel(i.area)}`, {
		appUrl: i.appUrl,
		heading: `Inspection overdue by ${weeks}`,
		paragraphs: [
			`The inspection of ${areaLabel(i.area)} was due on ${longDate(i.dueOn)} and has not been recorded as done.`,
			'Until it is done, the controls in this area have not been checked on schedule.'
		],
		facts: [...areaFacts(i.area, i.dueOn), ['Inspector', i.inspectorName ?? 'none assigned']],
		action: { label: 'Open the inspection', url: link(i.appUrl, 'inspections', i.inspectionId) },
		reason: i.reason
	});
}

// ---------------------------------------------------------------------------------------------
// Reviews

export type TrainingInput = {
	appUrl: string;
	personName: string;
	topic: string;
	completedOn: string;
	expiresOn: string;
	daysUntil: number;
	reason: string;
};

export function trainingReminder(i: TrainingInput): Rendered {
	const d = i.daysUntil;
	const expired = d < 0;
	const when = expired ? `expired on ${longDate(i.expiresOn)}` : d === 0 ? 'expires today' : `expires in ${plural(d, 'day')}`;
	return render(`Training ${when}: ${i.topic} (${i.personName})`, {
		appUrl: i.appUrl,
		heading: `Training ${when}`,
		paragraphs: [
			expired
				? `The record “${i.topic}” of ${i.personName} expired on ${longDate(i.expiresOn)}. Until it is renewed, the work it covers should not go on; the laser safety officer decides.`
				: `The record “${i.topic}” of ${i.personName} is valid until ${longDate(i.expiresOn)}. Please arrange the renewal with the laser safety officer in good time.`
		],
		facts: [
			['Person', i.personName],
			['Training or authorisation', i.topic],
			['Completed', longDate(i.completedOn)],
			['Valid until', longDate(i.expiresOn)]
		],
		action: { label: 'Open the training records', url: link(i.appUrl, 'training') },
		reason: i.reason
	});
}

export type ReviewWaitingInput = {
	appUrl: string;
	pathId: string;
	pathName: string;
	laserLabel: string;
	labName: string;
	waitingSince: string;
	daysWaiting: number;
	reason: string;
};

export function reviewWaiting(i: ReviewWaitingInput): Rendered {
	return render(`Awaiting review for ${plural(i.daysWaiting, 'day')}: ${i.pathName}`, {
		appUrl: i.appUrl,
		heading: `A beam path has been awaiting review for ${plural(i.daysWaiting, 'day')}`,
		paragraphs: [`“${i.pathName}” has at least one point that exceeds a limit or has no applicable limit, and nobody has cleared or returned it yet.`],
		facts: [
			['Beam path', i.pathName],
			['Laser', i.laserLabel],
			['Lab', i.labName],
			['Waiting since', longDate(i.waitingSince)]
		],
		action: { label: 'Review the path', url: link(i.appUrl, 'reviews', i.pathId) },
		reason: i.reason
	});
}

// ---------------------------------------------------------------------------------------------
// In-app notifications, mailed one by one

export type NotificationInput = {
	appUrl: string;
	kind: string;
	title: string;
	body: string;
	pathId: string | null;
	createdAt: Date;
};

const notificationWords: Record<string, { reason: string; action: string; to: 'reviews' | 'paths' }> = {
	'path.flagged': { reason: 'You are a laser safety officer, and a beam path now waits for your review.', action: 'Review the path', to: 'reviews' },
	'review.cleared': { reason: 'You registered or last changed this beam path, and an officer cleared it with controls.', action: 'Open the path', to: 'paths' },
	'review.returned': { reason: 'You registered or last changed this beam path, and an officer returned it with comments.', action: 'Open the path', to: 'paths' },
	'review.replied': { reason: 'You decided the review of this beam path, and the lab has answered.', action: 'Read the reply', to: 'reviews' }
};

export function notificationLink(appUrl: string, kind: string, pathId: string | null): string {
	const words = notificationWords[kind];
	if (!pathId) return link(appUrl, 'overview');
	return link(appUrl, words?.to ?? 'paths', pathId);
}

export function notificationMail(i: NotificationInput): Rendered & { reason: string } {
	const words = notificationWords[i.kind] ?? { reason: 'Beamwarden shows you this in the app as well.', action: 'Open Beamwarden', to: 'paths' as const };
	const rendered = render(i.title, {
		appUrl: i.appUrl,
		heading: cleanHeaderText(i.title),
		paragraphs: i.body.trim() ? [i.body] : ['Beamwarden has news about a record of yours.'],
		action: { label: words.action, url: notificationLink(i.appUrl, i.kind, i.pathId) },
		reason: `${words.reason} The same notice is in the app.`
	});
	return { ...rendered, reason: `${words.reason} The same notice is in the app.` };
}

// ---------------------------------------------------------------------------------------------
// Incidents (no person's name ever goes into these mails: the reporter may have asked to stay
// anonymous, and the ledger is read by administrators)

const medicalWords: Record<string, string> = { sought: 'yes', not_sought: 'no', unknown: 'not yet, or not known' };

export type EyeExposureInput = {
	appUrl: string;
	incidentId: string;
	number: number;
	/** Wall-clock 'YYYY-MM-DD HH:mm[:ss]' as reported. */
	occurredAt: string;
	where: string;
	laser: string;
	medicalAttention: string;
	reason: string;
};

export function eyeExposureReported(i: EyeExposureInput): Rendered {
	return render(`Suspected eye exposure reported (incident ${i.number})`, {
		appUrl: i.appUrl,
		heading: 'A suspected eye exposure was reported',
		paragraphs: [
			`Incident ${i.number} reports that laser light may have reached someone’s eye. The person should have an eye examination today, within 24 hours at the latest.`,
			'Please contact the people involved now, make sure the examination is arranged, and record it in the medical follow-up (officers only). Consider suspending the laser until the causes are known.'
		],
		facts: [
			['Incident', String(i.number)],
			['When', i.occurredAt.slice(0, 16).replace('T', ' ')],
			['Where', i.where],
			['Laser', i.laser],
			['Medical attention sought', medicalWords[i.medicalAttention] ?? i.medicalAttention]
		],
		action: { label: 'Open the report', url: link(i.appUrl, 'incidents', i.incidentId) },
		reason: i.reason,
		footerNote: 'Who reported it and who was involved is shown in Beamwarden only, to laser safety officers.'
	});
}

export type ActionOverdueInput = {
	appUrl: string;
	incidentNumber: number;
	description: string;
	dueOn: string;
	daysOverdue: number;
	reason: string;
};

export function actionOverdue(i: ActionOverdueInput): Rendered {
	return render(`Corrective action overdue by ${plural(i.daysOverdue, 'day')} (incident ${i.incidentNumber})`, {
		appUrl: i.appUrl,
		heading: `A corrective action is overdue by ${plural(i.daysOverdue, 'day')}`,
		paragraphs: [`This action, set after incident ${i.incidentNumber}, was due on ${longDate(i.dueOn)} and is not closed yet:`, i.description, 'Once it is done, close it in Beamwarden with a word (and a photo if it helps) on what was done.'],
		facts: [
			['Incident', String(i.incidentNumber)],
			['Due on', longDate(i.dueOn)]
		],
		action: { label: 'Open your actions', url: link(i.appUrl, 'incidents') },
		reason: i.reason
	});
}

export type FindingOverdueInput = {
	appUrl: string;
	inspectionId: string;
	area: AreaInfo;
	description: string;
	action: string;
	dueOn: string;
	daysOverdue: number;
	reason: string;
};

export function findingOverdue(i: FindingOverdueInput): Rendered {
	return render(`Inspection finding overdue by ${plural(i.daysOverdue, 'day')}: ${i.area.name}`, {
		appUrl: i.appUrl,
		heading: `A finding of the inspection of ${i.area.name} is overdue`,
		paragraphs: [
			`The follow-up of this finding was due on ${longDate(i.dueOn)} and the finding is not closed yet:`,
			i.description,
			'Once it is dealt with, a laser safety officer closes it on the inspection page with a word on what was done.'
		],
		facts: [...areaFacts(i.area, i.dueOn), ...(i.action ? [['Follow-up', i.action] as Fact] : [])],
		action: { label: 'Open the inspection', url: link(i.appUrl, 'inspections', i.inspectionId) },
		reason: i.reason
	});
}

// ---------------------------------------------------------------------------------------------
// Daily digest

export type DigestItem = { subject: string; reason: string; url: string };

export function digest(i: { appUrl: string; date: string; items: DigestItem[] }): Rendered {
	const count = plural(i.items.length, 'item');
	return render(`Your Beamwarden digest for ${longDate(i.date)}: ${count}`, {
		appUrl: i.appUrl,
		heading: `Your digest for ${longDate(i.date)}`,
		paragraphs: [`${count} since your last digest. Each line opens its record.`],
		list: i.items.map((it) => ({ title: it.subject, detail: it.reason, url: it.url })),
		reason: 'You chose one daily digest instead of separate mails.'
	});
}

// ---------------------------------------------------------------------------------------------
// Password reset

export function passwordReset(i: { appUrl: string; name: string; resetUrl: string; expiresAt: Date }): Rendered {
	const expires = `${format(i.expiresAt, "d MMMM yyyy 'at' HH:mm")} (server time)`;
	return render('Reset your Beamwarden password', {
		appUrl: i.appUrl,
		heading: 'Reset your password',
		paragraphs: [`Hello ${i.name},`, `Use the link below to choose a new password. It works once and expires on ${expires}.`],
		action: { label: 'Choose a new password', url: i.resetUrl },
		reason: 'Someone asked to reset the password of the Beamwarden account with this address.',
		footerNote: 'If that was not you, ignore this mail: your password stays as it is. This mail is always sent at once, whatever your digest setting.',
		showPreferences: false
	});
}
