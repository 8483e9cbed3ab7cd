// Forms of procedures: creating one, its draft, submission, the officer's approval or return,
// sign-offs, the paths it covers, and the programme's sign-off interval.
import { z } from 'zod';
import { isCalendarDay } from './dates';

export const procedureKinds = ['operating', 'alignment', 'service', 'emergency'] as const;
export type ProcedureKind = (typeof procedureKinds)[number];

// eslint-disable-next-line no-control-regex
const controlChars = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;
const noControlChars = [(t: string) => !controlChars.test(t), 'Remove the control characters (invisible characters pasted from elsewhere).'] as const;
/** Text a person types, trimmed: at most `max` characters, no control characters (line breaks and tabs are fine). */
export const plainText = (max: number) =>
	z
		.string()
		.trim()
		.max(max, `At most ${max.toLocaleString('en')} characters.`)
		.refine(...noControlChars);

/** 'laser:<id>' or 'area:<id>': what a procedure or an authorisation is for. */
export const targetField = z
	.string()
	.trim()
	.regex(/^(laser|area):[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i, 'Choose a laser or an area.');

export function parseTarget(target: string): { laserId: string | null; areaId: string | null } {
	const [kind, id] = target.split(':');
	return kind === 'laser' ? { laserId: id, areaId: null } : { laserId: null, areaId: id };
}

/** Markdown; about 40 pages of text at most. */
export const BODY_MAX = 60_000;
const body = z
	.string()
	.max(BODY_MAX, `Keep the text under ${BODY_MAX.toLocaleString('en')} characters; attach a PDF for a longer document.`)
	.refine(...noControlChars);
const pathIds = z.array(z.uuid({ error: 'Unknown beam path.' })).max(200, 'At most 200 beam paths.').default([]);
const version = z.coerce.number({ error: 'Reload the page and try again.' }).int().min(0).max(1_000_000);

export const newProcedureSchema = z
	.object({
		target: targetField,
		kind: z.enum(procedureKinds, { error: 'Choose the kind of procedure.' }),
		title: plainText(200).min(3, 'Give the procedure a title, e.g. “Alignment of the compressor”.'),
		pathIds,
		body
	})
	.strict();
export type NewProcedureForm = z.infer<typeof newProcedureSchema>;

/** Saving the draft of the next version; version 0 starts one from the current approved text. */
export const draftSchema = z
	.object({
		body,
		changeNote: plainText(1000).default(''),
		version
	})
	.strict();
export type DraftForm = z.infer<typeof draftSchema>;

export const submitSchema = z.object({ version }).strict();

export const approveSchema = z
	.object({
		reviewBy: z.string().trim().refine(isCalendarDay, 'Enter the review-by date as YYYY-MM-DD.'),
		comment: plainText(1000).default(''),
		version
	})
	.strict();
export type ApproveForm = z.infer<typeof approveSchema>;

export const returnDraftSchema = z
	.object({
		comment: plainText(2000).min(3, 'Say what needs changing.'),
		version
	})
	.strict();

export const signSchema = z
	.object({
		versionId: z.uuid({ error: 'Reload the page: the version you read is not known.' }),
		understood: z.literal(true, { error: 'Tick the box to confirm you have read and understood this version.' })
	})
	.strict();

export const coverSchema = z.object({ pathIds, version }).strict();

export const confirmSchema = z
	.object({
		note: plainText(1000).min(3, 'Say what you checked, e.g. “Compared with the new path: the steps still apply.”'),
		version
	})
	.strict();

export const SIGNOFF_INTERVAL_MAX_MONTHS = 60;
export const intervalSchema = z
	.object({
		months: z.coerce
			.number({ error: 'Enter a whole number of months.' })
			.int('Enter a whole number of months.')
			.min(1, 'At least one month.')
			.max(SIGNOFF_INTERVAL_MAX_MONTHS, `At most ${SIGNOFF_INTERVAL_MAX_MONTHS} months.`),
		version
	})
	.strict();
