// The exposure-limit form: values typed with their units, checked the same way in browser and server.
import { z } from 'zod';
import { isCalendarDay } from './dates';
import { parseQuantity, type QuantityKind } from '$lib/units';
import { limitQuantities, pulseBases, tissues } from '../enums';

export { limitQuantities, pulseBases };

const withUnit = (kind: QuantityKind, what: string, defaultUnit?: string) =>
	z
		.string()
		.trim()
		.min(1, `Enter ${what}.`)
		.max(64)
		.superRefine((t, ctx) => {
			const p = parseQuantity(t, kind, { defaultUnit });
			if (!p.ok) ctx.addIssue({ code: 'custom', message: p.reason });
		});

const number = (what: string) =>
	z
		.string()
		.trim()
		.min(1, `Enter ${what}.`)
		.max(32)
		.regex(/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/, 'Enter a plain number, like 0.75 or -0.25.');

const date = z
	.string()
	.trim()
	.default('')
	.refine((t) => t === '' || isCalendarDay(t), 'Enter a date as YYYY-MM-DD.');

export const limitFormSchema = z
	.object({
		label: z.string().trim().min(1, 'Give the limit a short name.').max(200),
		tissue: z.enum(tissues, { error: 'Choose eye or skin.' }).default('eye'),
		wavelengthMin: withUnit('wavelength', 'the shortest wavelength'),
		wavelengthMax: withUnit('wavelength', 'the longest wavelength'),
		durationMin: withUnit('time', 'the shortest exposure duration'),
		durationMax: withUnit('time', 'the longest exposure duration'),
		quantity: z.enum(limitQuantities, { error: 'Choose irradiance or radiant exposure.' }).default('irradiance'),
		k: z.string().trim().min(1, 'Enter the coefficient k.').max(64),
		n: number('the exponent n (0 for a constant)').default('0'),
		limitingAperture: withUnit('length', 'the limiting aperture', 'mm'),
		pulseBasis: z.enum(pulseBases, { error: 'Choose what the limit applies to.' }).default('continuous'),
		pulseTrainExponent: z
			.string()
			.trim()
			.max(32)
			.default('')
			.refine((t) => t === '' || /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t), 'Enter a plain number, like -0.25, or leave it empty.'),
		/** A single-pulse limit without an exponent: the officer states that the code applies no train correction. */
		noTrainCorrection: z.boolean().default(false),
		citation: z.string().trim().min(1, 'Cite the clause of the local code this value comes from.').max(1000),
		demonstration: z.boolean().default(false),
		validFrom: date,
		validUntil: date,
		version: z.coerce.number().int().nonnegative().default(0)
	})
	.strict()
	.superRefine((l, ctx) => {
		const kKind: QuantityKind = l.quantity === 'irradiance' ? 'irradiance' : 'radiant_exposure';
		const k = parseQuantity(l.k, kKind);
		if (!k.ok) ctx.addIssue({ code: 'custom', path: ['k'], message: k.reason });
		else if (k.value.lte(0)) ctx.addIssue({ code: 'custom', path: ['k'], message: 'The limit must be above zero.' });
		const range = (a: keyof typeof l, b: keyof typeof l, kind: QuantityKind, message: string) => {
			const lo = parseQuantity(String(l[a]), kind, { defaultUnit: kind === 'length' ? 'mm' : undefined });
			const hi = parseQuantity(String(l[b]), kind);
			if (lo.ok && hi.ok && lo.value.gt(hi.value)) ctx.addIssue({ code: 'custom', path: [b], message });
			if (lo.ok && lo.value.lt(0)) ctx.addIssue({ code: 'custom', path: [a], message: 'Must not be negative.' });
		};
		range('wavelengthMin', 'wavelengthMax', 'wavelength', 'The longest wavelength is below the shortest.');
		range('durationMin', 'durationMax', 'time', 'The longest duration is below the shortest.');
		const ap = parseQuantity(l.limitingAperture, 'length', { defaultUnit: 'mm' });
		if (ap.ok && ap.value.lte(0)) ctx.addIssue({ code: 'custom', path: ['limitingAperture'], message: 'The limiting aperture must be above zero.' });
		if (l.validFrom && l.validUntil && l.validFrom > l.validUntil) ctx.addIssue({ code: 'custom', path: ['validUntil'], message: 'Ends before it starts.' });
		if (l.pulseTrainExponent !== '' && l.pulseBasis !== 'single_pulse')
			ctx.addIssue({ code: 'custom', path: ['pulseTrainExponent'], message: 'A pulse-train exponent belongs to a single-pulse limit.' });
		if (l.noTrainCorrection && l.pulseBasis !== 'single_pulse') ctx.addIssue({ code: 'custom', path: ['noTrainCorrection'], message: 'Only a single-pulse limit has a pulse-train rule.' });
		if (l.noTrainCorrection && l.pulseTrainExponent !== '') ctx.addIssue({ code: 'custom', path: ['noTrainCorrection'], message: 'Give either a pulse-train exponent or “no train correction”, not both.' });
	});

export type LimitForm = z.infer<typeof limitFormSchema>;

/** The limit form in SI units, as stored. Call only on a form that passed the schema. */
export function limitToSI(l: LimitForm) {
	const si = (t: string, kind: QuantityKind, defaultUnit?: string) => {
		const p = parseQuantity(t, kind, { defaultUnit });
		if (!p.ok) throw new Error('limitToSI on an unchecked form');
		return p.value.toString();
	};
	return {
		label: l.label,
		tissue: l.tissue,
		wavelengthMin: si(l.wavelengthMin, 'wavelength'),
		wavelengthMax: si(l.wavelengthMax, 'wavelength'),
		durationMin: si(l.durationMin, 'time'),
		durationMax: si(l.durationMax, 'time'),
		quantity: l.quantity,
		k: si(l.k, l.quantity === 'irradiance' ? 'irradiance' : 'radiant_exposure'),
		n: l.n,
		limitingAperture: si(l.limitingAperture, 'length', 'mm'),
		pulseBasis: l.pulseBasis,
		pulseTrainExponent: l.pulseTrainExponent === '' ? null : l.pulseTrainExponent,
		noTrainCorrection: l.pulseBasis === 'single_pulse' && l.noTrainCorrection,
		citation: l.citation,
		demonstration: l.demonstration,
		validFrom: l.validFrom ? new Date(l.validFrom + 'T00:00:00Z') : null,
		validUntil: l.validUntil ? new Date(l.validUntil + 'T00:00:00Z') : null
	};
}
