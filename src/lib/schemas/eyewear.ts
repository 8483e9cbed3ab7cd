import { z } from 'zod';
import { isCalendarDay } from './dates';
import { parseQuantity } from '$lib/units';
import { eyewearConditions } from '$lib/enums';


const wavelength = (what: string) =>
	z
		.string()
		.trim()
		.min(1, `Enter ${what}.`)
		.max(64)
		.superRefine((t, ctx) => {
			const p = parseQuantity(t, 'wavelength');
			if (!p.ok) ctx.addIssue({ code: 'custom', message: p.reason });
		});

export const bandSchema = z
	.object({
		wavelengthMin: wavelength('the shortest wavelength'),
		wavelengthMax: wavelength('the longest wavelength'),
		od: z
			.string()
			.trim()
			.regex(/^\d+(\.\d+)?$/, 'Enter the optical density as a number, e.g. 7.')
			.refine((t) => Number(t) <= 12, 'An optical density above 12 is not credible.')
	})
	.strict()
	.superRefine((b, ctx) => {
		const lo = parseQuantity(b.wavelengthMin, 'wavelength');
		const hi = parseQuantity(b.wavelengthMax, 'wavelength');
		if (lo.ok && hi.ok && lo.value.gt(hi.value)) ctx.addIssue({ code: 'custom', path: ['wavelengthMax'], message: 'The band ends before it starts.' });
	});

export const eyewearSchema = z
	.object({
		labId: z.uuid({ error: 'Choose the lab.' }),
		label: z.string().trim().min(1, 'Give the eyewear a label, e.g. the number on its case.').max(120),
		location: z.string().trim().max(200).default(''),
		frame: z.string().trim().max(200).default(''),
		condition: z.enum(eyewearConditions, { error: 'Choose good, worn or damaged.' }).default('good'),
		lastCheckedAt: z
			.string()
			.trim()
			.default('')
			.refine((t) => t === '' || isCalendarDay(t), 'Enter a date as YYYY-MM-DD.'),
		bands: z.array(bandSchema).min(1, 'Enter at least one wavelength band with its optical density.').max(20),
		version: z.coerce.number().int().nonnegative().default(0)
	})
	.strict();

export type EyewearForm = z.infer<typeof eyewearSchema>;
