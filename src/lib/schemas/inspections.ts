import { z } from 'zod';
import { isCalendarDay } from './dates';

const isoDate = (what: string) =>
	z
		.string()
		.trim()
		.refine(isCalendarDay, `Enter ${what} as YYYY-MM-DD.`);

export const checkOutcomes = ['pass', 'fail', 'not_applicable'] as const;
export const outcomeWords: Record<(typeof checkOutcomes)[number], string> = { pass: 'pass', fail: 'fail', not_applicable: 'not applicable' };

export const recordInspectionSchema = z
	.object({
		completedOn: isoDate('the date of the inspection'),
		templateId: z.uuid({ error: 'Choose a checklist.' }),
		results: z
			.array(
				z
					.object({
						itemText: z.string().trim().min(1).max(500),
						outcome: z.enum(checkOutcomes, { error: 'Choose pass, fail or not applicable.' }),
						notes: z.string().trim().max(2000).default('')
					})
					.strict()
			)
			.min(1, 'The checklist has no items.')
			.max(100),
		findings: z
			.array(
				z
					.object({
						description: z.string().trim().min(1, 'Describe the finding.').max(2000),
						action: z.string().trim().max(2000).default(''),
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
		notes: z.string().trim().max(4000).default(''),
		version: z.coerce.number().int().positive()
	})
	.strict()
	.superRefine((f, ctx) => {
		f.results.forEach((r, i) => {
			if (r.outcome === 'fail' && r.notes === '') ctx.addIssue({ code: 'custom', path: ['results', i, 'notes'], message: 'Say what failed.' });
		});
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

export type RecordInspectionForm = z.infer<typeof recordInspectionSchema>;
