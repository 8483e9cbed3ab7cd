// Forms of authorisations to operate and of visits.
import { z } from 'zod';
import { isCalendarDay } from './dates';
import { plainText, targetField } from './procedures';

export const visitorKinds = ['visitor', 'contractor'] as const;

const optionalDay = (what: string) =>
	z
		.string()
		.trim()
		.refine((t) => t === '' || isCalendarDay(t), `Enter ${what} as YYYY-MM-DD, or leave it empty.`)
		.default('');
const topics = z.array(plainText(200).min(1)).max(20, 'At most 20 trainings.').default([]);
const procedureIds = z.array(z.uuid({ error: 'Unknown procedure.' })).max(20, 'At most 20 procedures.').default([]);
const version = z.coerce.number({ error: 'Reload the page and try again.' }).int().min(0).max(1_000_000);

/** A researcher asks for themselves. */
export const requestSchema = z
	.object({
		target: targetField,
		note: plainText(1000).default('')
	})
	.strict();
export type RequestForm = z.infer<typeof requestSchema>;

const conditions = { trainingTopics: topics, procedureIds, expiresOn: optionalDay('the end date') };

/** An officer grants directly (no request first). */
export const grantSchema = z
	.object({
		userId: z.string().trim().min(1, 'Choose the person.').max(64),
		target: targetField,
		...conditions,
		reason: plainText(1000).default('')
	})
	.strict();
export type GrantForm = z.infer<typeof grantSchema>;

/** An officer answers a request: granted with conditions, or refused with a reason. */
export const decideSchema = z
	.object({
		decision: z.enum(['granted', 'refused'], { error: 'Grant or refuse.' }),
		...conditions,
		reason: plainText(1000).default(''),
		version
	})
	.strict()
	.superRefine((v, ctx) => {
		if (v.decision === 'refused' && v.reason.length < 3) ctx.addIssue({ code: 'custom', path: ['reason'], message: 'Say why it is refused; the person reads it.' });
	});
export type DecideForm = z.infer<typeof decideSchema>;

export const withdrawSchema = z
	.object({
		reason: plainText(1000).min(3, 'Say why it is withdrawn; the person reads it.'),
		version
	})
	.strict();

export const visitSchema = z
	.object({
		visitorName: plainText(200).min(2, 'Enter the visitor’s name.'),
		organisation: plainText(200).default(''),
		kind: z.enum(visitorKinds, { error: 'Visitor or contractor?' }),
		startsOn: z.string().trim().refine(isCalendarDay, 'Enter the first day of the visit as YYYY-MM-DD.'),
		endsOn: optionalDay('the last day'),
		escortName: plainText(200).min(2, 'Name the authorised person who escorts them.'),
		briefing: plainText(2000).min(3, 'Say what briefing was given, e.g. “Hazards, eyewear, stay behind the curtain”.')
	})
	.strict()
	.superRefine((v, ctx) => {
		if (v.endsOn && isCalendarDay(v.startsOn) && v.endsOn < v.startsOn) ctx.addIssue({ code: 'custom', path: ['endsOn'], message: 'The last day cannot be before the first.' });
	});
export type VisitForm = z.infer<typeof visitSchema>;
