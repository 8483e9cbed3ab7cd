import { z } from 'zod';
import { isCalendarDay } from './dates';


/** Recording a training or an authorisation for a person (officers). */
export const recordTrainingSchema = z
	.object({
		userId: z.string().trim().min(1, 'Choose the person.').max(64),
		topic: z.string().trim().min(3, 'Say what was completed, e.g. “Laser safety induction”.').max(200),
		completedOn: z.string().trim().refine(isCalendarDay, 'Enter the date it was completed as YYYY-MM-DD.'),
		expiresOn: z
			.string()
			.trim()
			.refine((t) => t === '' || isCalendarDay(t), 'Enter the expiry date as YYYY-MM-DD, or leave it empty if it does not expire.'),
		notes: z.string().trim().max(1000)
	})
	.strict()
	.superRefine((v, ctx) => {
		if (v.expiresOn && isCalendarDay(v.completedOn) && v.expiresOn <= v.completedOn) ctx.addIssue({ code: 'custom', path: ['expiresOn'], message: 'The expiry date must be after the date it was completed.' });
	});
export type RecordTrainingForm = z.infer<typeof recordTrainingSchema>;

/** Withdrawing a record entered in error (it stays, marked withdrawn, with the reason). */
export const withdrawTrainingSchema = z
	.object({
		recordId: z.uuid({ error: 'Unknown training record.' }),
		reason: z.string().trim().min(3, 'Say why the record is withdrawn.').max(500)
	})
	.strict();
export type WithdrawTrainingForm = z.infer<typeof withdrawTrainingSchema>;
