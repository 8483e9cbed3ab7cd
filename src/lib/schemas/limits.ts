// The exposure-limit form: values typed with their units, checked the same way in browser and server.
import { z } from 'zod';
import { isCalendarDay } from './dates';
import { asEntered, parseQuantity, UnitDecimal, type QuantityKind } from '$lib/units';
import { limitQuantities, pulseBases, tissues, wavelengthFactorKinds } from '../enums';

export { limitQuantities, pulseBases, wavelengthFactorKinds };

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

/** A quantity with its unit that may be left empty. */
const optionalWithUnit = (kind: QuantityKind, defaultUnit?: string) =>
	z
		.string()
		.trim()
		.max(64)
		.default('')
		.superRefine((t, ctx) => {
			if (t === '') return;
			const p = parseQuantity(t, kind, { defaultUnit });
			if (!p.ok) ctx.addIssue({ code: 'custom', message: p.reason });
		});

const optionalNumber = z
	.string()
	.trim()
	.max(32)
	.default('')
	.refine((t) => t === '' || /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t), 'Enter a plain number, or leave it empty.');

const date = z
	.string()
	.trim()
	.default('')
	.refine((t) => t === '' || isCalendarDay(t), 'Enter a date as YYYY-MM-DD.');

/** The fields of a limit, shared by the limit form and the limit-set file (see limitSet.ts). */
export const limitFields = z.object({
	label: z.string().trim().min(1, 'Give the limit a short name.').max(200),
	tissue: z.enum(tissues, { error: 'Choose eye or skin.' }).default('eye'),
	wavelengthMin: withUnit('wavelength', 'the shortest wavelength'),
	wavelengthMax: withUnit('wavelength', 'the longest wavelength'),
	durationMin: withUnit('time', 'the shortest exposure duration'),
	durationMax: withUnit('time', 'the longest exposure duration'),
	quantity: z.enum(limitQuantities, { error: 'Choose irradiance or radiant exposure.' }).default('irradiance'),
	k: z.string().trim().min(1, 'Enter the coefficient k.').max(64),
	n: number('the exponent n (0 for a constant)').default('0'),
	/** C(λ): none, a constant, or 10^(s·(λ − λ₀)) with s per nanometre, over its own range (empty: the limit's). */
	wavelengthFactorKind: z.enum(wavelengthFactorKinds, { error: 'Choose none, a constant or the exponential form.' }).default('none'),
	wavelengthFactorValue: optionalNumber,
	wavelengthFactorSlope: optionalNumber,
	wavelengthFactorOrigin: optionalWithUnit('wavelength'),
	wavelengthFactorFrom: optionalWithUnit('wavelength'),
	wavelengthFactorTo: optionalWithUnit('wavelength'),
	/** C_E(α) = (α/α_min)^exponent between α_min and α_max; all three or none (none: every source a point source). */
	extendedAlphaMin: optionalWithUnit('angle', 'mrad'),
	extendedAlphaMax: optionalWithUnit('angle', 'mrad'),
	extendedExponent: optionalNumber,
	limitingAperture: withUnit('length', 'the limiting aperture', 'mm'),
	/** The aperture a·tᵇ: b (0 for a constant aperture). */
	limitingApertureExponent: optionalNumber,
	/** Pulses closer together than T_i count as one pulse. */
	pulseGroupingTime: optionalWithUnit('time'),
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
	});

/** The rules across fields, the same for the form and for each row of a limit-set file. */
export function limitRules(l: Omit<z.output<typeof limitFields>, 'version'>, ctx: z.RefinementCtx): void {
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
	if (l.wavelengthFactorKind === 'constant' && l.wavelengthFactorValue === '') ctx.addIssue({ code: 'custom', path: ['wavelengthFactorValue'], message: 'Enter the factor’s value.' });
	if (l.wavelengthFactorKind === 'exponential') {
		if (l.wavelengthFactorSlope === '') ctx.addIssue({ code: 'custom', path: ['wavelengthFactorSlope'], message: 'Enter the slope s (per nm), e.g. 0.002.' });
		if (l.wavelengthFactorOrigin === '') ctx.addIssue({ code: 'custom', path: ['wavelengthFactorOrigin'], message: 'Enter the wavelength λ₀, e.g. 700 nm.' });
	}
	const extended = [l.extendedAlphaMin, l.extendedAlphaMax, l.extendedExponent].filter((t) => t !== '').length;
	if (extended > 0 && extended < 3)
		for (const f of ['extendedAlphaMin', 'extendedAlphaMax', 'extendedExponent'] as const)
			if (l[f] === '') ctx.addIssue({ code: 'custom', path: [f], message: 'An extended-source rule needs α_min, α_max and its exponent — or none of them.' });
	if (l.pulseGroupingTime !== '' && l.pulseBasis !== 'single_pulse') ctx.addIssue({ code: 'custom', path: ['pulseGroupingTime'], message: 'A pulse-grouping time belongs to a single-pulse limit.' });
}

export const limitFormSchema = limitFields.strict().superRefine(limitRules);

export type LimitForm = z.infer<typeof limitFormSchema>;

/** What each field is called on the limit form, for messages that name a field. */
export const limitFieldNames: Record<Exclude<keyof LimitForm, 'version'>, string> = {
	label: 'Name',
	tissue: 'Tissue',
	wavelengthMin: 'Shortest wavelength',
	wavelengthMax: 'Longest wavelength',
	durationMin: 'Shortest exposure duration',
	durationMax: 'Longest exposure duration',
	quantity: 'Quantity',
	k: 'Coefficient k',
	n: 'Exponent n',
	wavelengthFactorKind: 'Wavelength factor: form',
	wavelengthFactorValue: 'Wavelength factor: value of C',
	wavelengthFactorSlope: 'Wavelength factor: slope s',
	wavelengthFactorOrigin: 'Wavelength factor: λ₀',
	wavelengthFactorFrom: 'Wavelength factor: applies from',
	wavelengthFactorTo: 'Wavelength factor: applies up to',
	extendedAlphaMin: 'Extended source: α_min',
	extendedAlphaMax: 'Extended source: α_max',
	extendedExponent: 'Extended source: exponent',
	limitingAperture: 'Limiting aperture a',
	limitingApertureExponent: 'Aperture exponent b',
	pulseGroupingTime: 'Pulse-grouping time Tᵢ',
	pulseBasis: 'Applies to',
	pulseTrainExponent: 'Pulse-train exponent',
	noTrainCorrection: 'No train correction',
	citation: 'Citation of the local code',
	demonstration: 'Demonstration value',
	validFrom: 'Valid from',
	validUntil: 'Valid until'
};

/** The limit form in SI units, as stored. Call only on a form that passed the schema. */
export function limitToSI(l: Omit<LimitForm, 'version'>) {
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
		wavelengthFactorKind: l.wavelengthFactorKind,
		wavelengthFactorValue: l.wavelengthFactorKind === 'constant' ? l.wavelengthFactorValue : null,
		// s is entered per nanometre and stored per metre.
		wavelengthFactorSlope: l.wavelengthFactorKind === 'exponential' ? new UnitDecimal(l.wavelengthFactorSlope).times(1e9).toString() : null,
		wavelengthFactorOrigin: l.wavelengthFactorKind === 'exponential' ? si(l.wavelengthFactorOrigin, 'wavelength') : null,
		wavelengthFactorFrom: l.wavelengthFactorKind === 'exponential' && l.wavelengthFactorFrom !== '' ? si(l.wavelengthFactorFrom, 'wavelength') : null,
		wavelengthFactorTo: l.wavelengthFactorKind === 'exponential' && l.wavelengthFactorTo !== '' ? si(l.wavelengthFactorTo, 'wavelength') : null,
		extendedAlphaMin: l.extendedAlphaMin === '' ? null : si(l.extendedAlphaMin, 'angle', 'mrad'),
		extendedAlphaMax: l.extendedAlphaMax === '' ? null : si(l.extendedAlphaMax, 'angle', 'mrad'),
		extendedExponent: l.extendedExponent === '' ? null : l.extendedExponent,
		limitingAperture: si(l.limitingAperture, 'length', 'mm'),
		limitingApertureExponent: l.limitingApertureExponent === '' ? '0' : l.limitingApertureExponent,
		pulseGroupingTime: l.pulseGroupingTime === '' ? null : si(l.pulseGroupingTime, 'time'),
		pulseBasis: l.pulseBasis,
		pulseTrainExponent: l.pulseTrainExponent === '' ? null : l.pulseTrainExponent,
		noTrainCorrection: l.pulseBasis === 'single_pulse' && l.noTrainCorrection,
		citation: l.citation,
		demonstration: l.demonstration,
		validFrom: l.validFrom ? new Date(l.validFrom + 'T00:00:00Z') : null,
		validUntil: l.validUntil ? new Date(l.validUntil + 'T00:00:00Z') : null
	};
}

/** A stored limit version (numbers as exact decimal strings in SI) — the columns the form shows. */
export type StoredLimit = Omit<ReturnType<typeof limitToSI>, 'validFrom' | 'validUntil'> & { validFrom: Date | null; validUntil: Date | null };

/** The form of a stored limit: each quantity as entered (asEntered), in a readable unit. */
export function limitFormValues(c: StoredLimit, version: number): LimitForm {
	const plain = (v: string | null) => asEntered(v, null);
	const day = (d: Date | null) => (d ? d.toISOString().slice(0, 10) : '');
	return {
		label: c.label,
		tissue: c.tissue,
		wavelengthMin: asEntered(c.wavelengthMin, 'wavelength'),
		wavelengthMax: asEntered(c.wavelengthMax, 'wavelength'),
		durationMin: asEntered(c.durationMin, 'time'),
		durationMax: asEntered(c.durationMax, 'time'),
		quantity: c.quantity,
		k: asEntered(c.k, c.quantity === 'irradiance' ? 'irradiance' : 'radiant_exposure'),
		n: plain(c.n),
		wavelengthFactorKind: c.wavelengthFactorKind,
		wavelengthFactorValue: plain(c.wavelengthFactorValue),
		wavelengthFactorSlope: c.wavelengthFactorSlope === null ? '' : new UnitDecimal(c.wavelengthFactorSlope).div(1e9).toString(),
		wavelengthFactorOrigin: asEntered(c.wavelengthFactorOrigin, 'wavelength'),
		wavelengthFactorFrom: asEntered(c.wavelengthFactorFrom, 'wavelength'),
		wavelengthFactorTo: asEntered(c.wavelengthFactorTo, 'wavelength'),
		extendedAlphaMin: asEntered(c.extendedAlphaMin, 'angle', 'mrad'),
		extendedAlphaMax: asEntered(c.extendedAlphaMax, 'angle', 'mrad'),
		extendedExponent: plain(c.extendedExponent),
		limitingAperture: asEntered(c.limitingAperture, 'length', 'mm'),
		limitingApertureExponent: new UnitDecimal(c.limitingApertureExponent).isZero() ? '' : plain(c.limitingApertureExponent),
		pulseGroupingTime: asEntered(c.pulseGroupingTime, 'time'),
		pulseBasis: c.pulseBasis,
		pulseTrainExponent: plain(c.pulseTrainExponent),
		noTrainCorrection: c.noTrainCorrection,
		citation: c.citation,
		demonstration: c.demonstration,
		validFrom: day(c.validFrom),
		validUntil: day(c.validUntil),
		version
	};
}
