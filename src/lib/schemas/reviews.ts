import { z } from 'zod';
import { isCalendarDay } from './dates';
import { formatQuantity, parseQuantity } from '$lib/units';
import { controlKinds, decisionKinds } from '$lib/enums';


export const controlWords: Record<(typeof controlKinds)[number], string> = {
	eyewear: 'Protective eyewear',
	enclosure: 'Beam enclosure',
	interlock: 'Interlock',
	signage: 'Area signage',
	beam_stop: 'Beam stops or barriers',
	procedure: 'Procedure (SOP)',
	training: 'Training required',
	other: 'Other'
};

/** One required control in words, as the screens and the mails show it (wavelengths in SI, as stored). */
export function describeControl(c: { kind: (typeof controlKinds)[number]; minOd: string | null; wavelength: string | null; wavelengthMax: string | null; details: string }): string {
	const eyewear = c.kind === 'eyewear' && c.wavelength !== null ? `: at least OD ${Number(c.minOd)} at ${formatQuantity(c.wavelength, 'wavelength')}${c.wavelengthMax ? `–${formatQuantity(c.wavelengthMax, 'wavelength')}` : ''}` : '';
	return `${controlWords[c.kind]}${eyewear}${c.details ? ` — ${c.details}` : ''}`;
}

const wavelengthText = z
	.string()
	.trim()
	.max(64)
	.default('')
	.superRefine((t, ctx) => {
		if (t === '') return;
		const p = parseQuantity(t, 'wavelength');
		if (!p.ok) ctx.addIssue({ code: 'custom', message: p.reason });
	});

export const controlSchema = z
	.object({
		kind: z.enum(controlKinds, { error: 'Choose the kind of control.' }),
		minOd: z
			.string()
			.trim()
			.max(8)
			.default('')
			.refine((t) => t === '' || (/^\d+(\.\d+)?$/.test(t) && Number(t) <= 12), 'Enter an optical density from 0 to 12.'),
		wavelength: wavelengthText,
		/** Eyewear over a range of wavelengths (a tunable line): the upper end; empty for one wavelength. */
		wavelengthMax: wavelengthText,
		details: z.string().trim().max(1000).default('')
	})
	.strict()
	.superRefine((c, ctx) => {
		if (c.kind === 'eyewear') {
			if (c.minOd === '') ctx.addIssue({ code: 'custom', path: ['minOd'], message: 'Eyewear needs a minimum optical density.' });
			if (c.wavelength === '') ctx.addIssue({ code: 'custom', path: ['wavelength'], message: 'Eyewear needs the wavelength it must block.' });
			const lo = parseQuantity(c.wavelength, 'wavelength');
			const hi = c.wavelengthMax === '' ? null : parseQuantity(c.wavelengthMax, 'wavelength');
			if (lo.ok && hi?.ok && hi.value.lt(lo.value)) ctx.addIssue({ code: 'custom', path: ['wavelengthMax'], message: 'The upper end is below the wavelength.' });
		} else if (c.details === '') ctx.addIssue({ code: 'custom', path: ['details'], message: 'Say what is required.' });
	});

export const decisionSchema = z
	.object({
		assessmentId: z.uuid({ error: 'Reload the page: the assessment you read is unknown.' }),
		/** The newest decision on the path when the officer opened it ('' for none): another officer's decision meanwhile is a 409. */
		afterDecisionId: z.string().trim().max(64).default(''),
		decision: z.enum(decisionKinds, { error: 'Choose to clear with controls or to return.' }),
		comments: z.string().trim().max(4000).default(''),
		reviewBy: z
			.string()
			.trim()
			.default('')
			.refine((t) => t === '' || isCalendarDay(t), 'Enter a date as YYYY-MM-DD.'),
		controls: z.array(controlSchema).max(30).default([])
	})
	.strict()
	.superRefine((d, ctx) => {
		if (d.decision === 'cleared' && d.controls.length === 0) ctx.addIssue({ code: 'custom', path: ['controls'], message: 'A clearance names at least one required control.' });
		if (d.decision === 'returned' && d.comments === '') ctx.addIssue({ code: 'custom', path: ['comments'], message: 'Say what the researcher should change.' });
	});

export const replySchema = z.object({ body: z.string().trim().min(1, 'Write your answer.').max(4000) }).strict();

export type DecisionForm = z.infer<typeof decisionSchema>;
export type ControlForm = z.infer<typeof controlSchema>;
