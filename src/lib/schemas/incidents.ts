// The incident forms, shared by the browser and the server. A report may be saved half-filled as a
// draft; sending it needs the few facts an officer cannot do without.
import { z } from 'zod';
import { contributingFactors, incidentKinds, medicalAttentionChoices, severityLevels } from '$lib/incidentWords';
import { isCalendarDay } from './dates';

const optionalId = (what: string) =>
	z
		.string()
		.trim()
		.refine((v) => v === '' || z.uuid().safeParse(v).success, `Unknown ${what}.`)
		.default('');

/** 'YYYY-MM-DDTHH:mm' (a datetime-local field) that exists on the calendar. */
export function isWallClock(v: string): boolean {
	const m = /^(\d{4}-\d{2}-\d{2})T(\d{2}):(\d{2})$/.exec(v);
	return !!m && isCalendarDay(m[1]) && Number(m[2]) < 24 && Number(m[3]) < 60;
}

/** Latest wall-clock time accepted as "now": a reporter in any time zone may be ahead of UTC. */
const latestWallClock = () => new Date(Date.now() + 14 * 3600_000).toISOString().slice(0, 16);

export const reportSchema = z
	.object({
		intent: z.enum(['draft', 'submit']).default('submit'),
		kind: z.union([z.enum(incidentKinds), z.literal('')]).default(''),
		occurredAt: z
			.string()
			.trim()
			.refine((v) => v === '' || isWallClock(v), 'Enter the date and time it happened.')
			.default(''),
		areaId: optionalId('area'),
		laserId: optionalId('laser'),
		pathId: optionalId('beam path'),
		locationNotes: z.string().trim().max(500, 'At most 500 characters.').default(''),
		description: z.string().trim().max(8000, 'At most 8000 characters.').default(''),
		peopleInvolved: z.string().trim().max(2000, 'At most 2000 characters.').default(''),
		medicalAttention: z.enum(medicalAttentionChoices).default('unknown'),
		anonymous: z.boolean().default(false),
		version: z.coerce.number().int().min(0).default(0)
	})
	.strict()
	.superRefine((f, ctx) => {
		if (f.occurredAt && isWallClock(f.occurredAt) && f.occurredAt > latestWallClock())
			ctx.addIssue({ code: 'custom', path: ['occurredAt'], message: 'This is in the future.' });
		if (f.intent !== 'submit') return;
		if (!f.kind) ctx.addIssue({ code: 'custom', path: ['kind'], message: 'Choose what kind of event it was.' });
		if (!f.occurredAt) ctx.addIssue({ code: 'custom', path: ['occurredAt'], message: 'Say when it happened (roughly is fine).' });
		if (!f.areaId && !f.laserId) ctx.addIssue({ code: 'custom', path: ['areaId'], message: 'Choose the area or the laser.' });
		if (f.description.length < 10) ctx.addIssue({ code: 'custom', path: ['description'], message: 'Say in a sentence or two what happened.' });
	});
export type ReportForm = z.infer<typeof reportSchema>;

export const investigationSchema = z
	.object({
		severity: z.enum(severityLevels, { error: 'Choose a severity.' }),
		causes: z.string().trim().min(3, 'Describe the causes as far as they are known.').max(8000),
		factors: z.array(z.enum(contributingFactors)).min(1, 'Tick at least one contributing factor.').max(contributingFactors.length),
		pathIds: z.array(z.uuid()).max(50).default([]),
		eyewearIds: z.array(z.uuid()).max(50).default([]),
		procedures: z
			.string()
			.trim()
			.max(2000)
			.default('')
			.refine((t) => t.split('\n').filter((l) => l.trim()).length <= 20, 'At most 20 procedures, one per line.'),
		version: z.coerce.number().int().positive()
	})
	.strict();
export type InvestigationForm = z.infer<typeof investigationSchema>;

export const actionSchema = z
	.object({
		description: z.string().trim().min(3, 'Say what is to be done.').max(2000),
		ownerId: z.string().trim().min(1, 'Choose who owns the action.').max(64),
		dueOn: z.string().trim().refine(isCalendarDay, 'Enter the due date as YYYY-MM-DD.')
	})
	.strict();
export type ActionForm = z.infer<typeof actionSchema>;

export const closeActionSchema = z
	.object({
		actionId: z.uuid({ error: 'Unknown action.' }),
		evidence: z.string().trim().min(3, 'Say what was done (the evidence that the action is complete).').max(4000),
		version: z.coerce.number().int().positive()
	})
	.strict();
export type CloseActionForm = z.infer<typeof closeActionSchema>;

export const suspendSchema = z
	.object({
		laserId: z.uuid({ error: 'Choose the laser.' }),
		reason: z.string().trim().min(3, 'Say why the laser is suspended.').max(1000)
	})
	.strict();
export type SuspendForm = z.infer<typeof suspendSchema>;

export const liftSchema = z
	.object({
		suspensionId: z.uuid({ error: 'Unknown suspension.' }),
		reason: z.string().trim().min(3, 'Say why the suspension can be lifted.').max(1000)
	})
	.strict();
export type LiftForm = z.infer<typeof liftSchema>;

export const closeIncidentSchema = z
	.object({
		closingNote: z.string().trim().max(4000).default(''),
		version: z.coerce.number().int().positive()
	})
	.strict();
export type CloseIncidentForm = z.infer<typeof closeIncidentSchema>;

const optionalDay = (what: string) =>
	z
		.string()
		.trim()
		.refine((t) => t === '' || isCalendarDay(t), `Enter ${what} as YYYY-MM-DD, or leave it empty.`)
		.default('');

export const medicalSchema = z
	.object({
		examinationRequestedOn: optionalDay('the day the examination was requested'),
		examinationDoneOn: optionalDay('the day of the examination'),
		outcome: z
			.string()
			.trim()
			.max(200, 'One line: at most 200 characters.')
			.refine((t) => !/[\r\n]/.test(t), 'One line only.')
			.default(''),
		version: z.coerce.number().int().min(0)
	})
	.strict()
	.superRefine((f, ctx) => {
		if (f.examinationDoneOn && f.examinationRequestedOn && f.examinationDoneOn < f.examinationRequestedOn)
			ctx.addIssue({ code: 'custom', path: ['examinationDoneOn'], message: 'The examination cannot come before it was requested.' });
		if (f.outcome && !f.examinationDoneOn) ctx.addIssue({ code: 'custom', path: ['examinationDoneOn'], message: 'Give the day of the examination with its outcome.' });
	});
export type MedicalForm = z.infer<typeof medicalSchema>;
