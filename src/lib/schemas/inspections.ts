import { z } from 'zod';
import { isCalendarDay } from './dates';
import { checkOutcomes } from '$lib/enums';

const isoDate = (what: string) =>
	z
		.string()
		.trim()
		.refine(isCalendarDay, `Enter ${what} as YYYY-MM-DD.`);

export type CheckOutcome = (typeof checkOutcomes)[number];
export const outcomeWords: Record<CheckOutcome, string> = { pass: 'pass', fail: 'fail', not_applicable: 'not applicable' };

/** Length limits shared by the schema and the text boxes' maxlength. */
export const NOTE_MAX = 2000;
export const INSPECTION_NOTES_MAX = 4000;

/** The items not answered yet, as the form numbers them ("3. Beams enclosed …"). */
export function unansweredItems(results: { itemText: string; outcome: string }[]): string[] {
	return results.flatMap((r, i) => (r.outcome === '' ? [`${i + 1}. ${r.itemText}`] : []));
}

export const recordInspectionSchema = z
	.object({
		completedOn: isoDate('the date of the inspection'),
		templateId: z.uuid({ error: 'Choose a checklist.' }),
		results: z
			.array(
				z
					.object({
						itemText: z.string().trim().min(1).max(500),
						// '' is an item not answered yet: every checklist starts so, none may be recorded so.
						outcome: z.enum([...checkOutcomes, ''], { error: 'Choose pass, fail or not applicable.' }),
						notes: z.string().trim().max(NOTE_MAX).default('')
					})
					.strict()
			)
			.min(1, 'The checklist has no items.')
			.max(100),
		findings: z
			.array(
				z
					.object({
						description: z.string().trim().min(1, 'Describe the finding.').max(NOTE_MAX),
						action: z.string().trim().max(NOTE_MAX).default(''),
						dueOn: z
							.string()
							.trim()
							.default('')
							.refine((t) => t === '' || isCalendarDay(t), 'Enter a date as YYYY-MM-DD.')
					})
					.strict()
			)
			.max(50)
			.default([]),
		notes: z.string().trim().max(INSPECTION_NOTES_MAX).default(''),
		version: z.coerce.number().int().positive()
	})
	.strict()
	.superRefine((f, ctx) => {
		f.results.forEach((r, i) => {
			if (r.outcome === 'fail' && r.notes === '') ctx.addIssue({ code: 'custom', path: ['results', i, 'notes'], message: 'Say what failed.' });
			if (r.outcome === '') ctx.addIssue({ code: 'custom', path: ['results', i, 'outcome'], message: 'Answer this item: pass, fail or not applicable.' });
		});
		const open = unansweredItems(f.results);
		if (open.length) ctx.addIssue({ code: 'custom', path: ['results'], message: `Answer every item before recording the inspection. Not answered yet: ${open.join('; ')}.` });
		if (f.completedOn > new Date().toISOString().slice(0, 10)) ctx.addIssue({ code: 'custom', path: ['completedOn'], message: 'An inspection cannot be recorded for a future date.' });
	});

export const assignSchema = z
	.object({
		inspectionId: z.uuid({ error: 'Unknown inspection.' }),
		inspectorId: z.string().trim().min(1, 'Choose an inspector.').max(64),
		version: z.coerce.number().int().positive()
	})
	.strict();

export const templateSchema = z
	.object({
		name: z.string().trim().min(1, 'Name the checklist.').max(160),
		items: z
			.string()
			.trim()
			.min(1, 'Write at least one item, one per line.')
			.max(20000)
			.refine((t) => t.split('\n').filter((l) => l.trim()).length <= 100, 'At most 100 items.')
	})
	.strict();

export const closeFindingSchema = z
	.object({
		findingId: z.uuid({ error: 'Unknown finding.' }),
		closedOn: isoDate('the day it was closed'),
		closureNote: z.string().trim().min(1, 'Say what was done.').max(NOTE_MAX),
		version: z.coerce.number().int().positive()
	})
	.strict()
	.refine((f) => f.closedOn <= new Date().toISOString().slice(0, 10), { path: ['closedOn'], message: 'A finding cannot be closed on a future date.' });

export type RecordInspectionForm = z.infer<typeof recordInspectionSchema>;
export type CloseFindingForm = z.infer<typeof closeFindingSchema>;
