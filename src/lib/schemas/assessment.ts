/**
 * Body of POST /api/assessments/preview: an emission line, the path elements, the points of
 * concern and the exposure limits. Every object is strict (unknown keys are refused). Numbers are
 * SI values, given as JSON numbers or numeric strings ("5e-3"); they reach the engine as strings,
 * so no digit is lost to binary floating point. Ranges (λ within 180 nm – 1 mm, transmission 0–1,
 * …) are checked by the engine, which names the offending field.
 */
import { z } from 'zod';
import type { AssessmentInput, ElementInput, LimitInput, LineInput, PointInput } from '../server/hazard/types';

const NUMERIC_TEXT = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** A finite number in SI units, as a JSON number or a numeric string; output is a decimal string. */
export const siNumber = z
	.union([
		z.number({ error: 'Enter a number.' }),
		z
			.string()
			.trim()
			.max(64, 'That number is too long.')
			.regex(NUMERIC_TEXT, 'Enter a number in SI units, using “.” as the decimal separator (for example 5e-3).')
	])
	.transform((v) => (typeof v === 'number' ? String(v) : v));

const optionalNumber = siNumber.nullish();
const label = z.string().trim().max(200).nullish();
const definition = z.enum(['1/e', '1/e2', 'fwhm'], { error: 'Choose 1/e, 1/e2 or fwhm.' });
const tissue = z.enum(['eye', 'skin'], { error: 'Choose eye or skin.' });

const beam = {
	wavelength: siNumber,
	beamDiameter: siNumber,
	beamDiameterDefinition: definition,
	divergence: siNumber,
	divergenceDefinition: definition,
	beamQuality: optionalNumber
};

export const lineSchema = z.discriminatedUnion(
	'mode',
	[
		z.object({ mode: z.literal('continuous'), power: siNumber, ...beam }).strict(),
		z.object({ mode: z.literal('single_pulse'), pulseEnergy: siNumber, pulseDuration: siNumber, ...beam }).strict(),
		z.object({ mode: z.literal('repetitive'), pulseEnergy: siNumber, pulseDuration: siNumber, repetitionRate: siNumber, ...beam }).strict()
	],
	{ error: 'Choose the emission mode: continuous, single_pulse or repetitive.' }
);

export const elementSchema = z.discriminatedUnion(
	'kind',
	[
		z.object({ kind: z.literal('propagate'), length: siNumber, label }).strict(),
		z.object({ kind: z.literal('transmission'), transmission: siNumber, label }).strict(),
		z.object({ kind: z.literal('mirror'), reflectance: optionalNumber, label }).strict(),
		z.object({ kind: z.literal('expander'), magnification: siNumber, label }).strict(),
		z.object({ kind: z.literal('lens'), focalLength: siNumber, label }).strict(),
		z.object({ kind: z.literal('fibre'), coreDiameter: siNumber, numericalAperture: siNumber, couplingTransmission: optionalNumber, label }).strict(),
		z.object({ kind: z.literal('enclosure'), length: siNumber, label }).strict()
	],
	{ error: 'Choose an element kind: propagate, transmission, mirror, expander, lens, fibre or enclosure.' }
);

export const pointSchema = z
	.object({
		id: z.string().trim().min(1, 'Give the point an id.').max(100),
		label,
		position: siNumber,
		tissue,
		exposureDuration: optionalNumber,
		kind: z.enum(['intrabeam', 'diffuse'], { error: 'Choose intrabeam or diffuse.' }),
		reflectance: optionalNumber,
		viewingAngle: optionalNumber,
		viewingDistance: optionalNumber
	})
	.strict();

export const limitSchema = z
	.object({
		id: z.string().trim().min(1).max(100),
		version: z.union([z.string().trim().min(1).max(50), z.number().int().nonnegative()]).transform(String),
		label: z.string().trim().min(1, 'Give the limit a label.').max(200),
		tissue,
		wavelengthMin: siNumber,
		wavelengthMax: siNumber,
		durationMin: siNumber,
		durationMax: siNumber,
		quantity: z.enum(['irradiance', 'radiant_exposure'], { error: 'Choose irradiance or radiant_exposure.' }),
		k: siNumber,
		n: siNumber,
		limitingAperture: siNumber,
		pulseBasis: z.enum(['single_pulse', 'continuous'], { error: 'Choose single_pulse or continuous.' }),
		pulseTrainExponent: optionalNumber,
		citation: z.string().trim().min(1, 'Cite the local code the limit comes from.').max(1000)
	})
	.strict();

/** Points × limits in one preview request (a path of 100 points against 20 limits). */
export const PREVIEW_COMPARISONS_MAX = 2000;

export const assessmentPreviewSchema = z
	.object({
		line: lineSchema,
		elements: z.array(elementSchema).max(200, 'At most 200 path elements.').default([]),
		// The same bounds as a saved path (schemas/register.ts): a preview is one path, not a batch.
		points: z.array(pointSchema).max(100, 'At most 100 points of concern.'),
		/** Omitted: the route uses the limits in force in the library. */
		limits: z.array(limitSchema).max(50, 'At most 50 limits in one preview.').optional(),
		nohd: z.object({ exposureDuration: optionalNumber }).strict().nullish(),
		options: z.object({ breakdown: z.boolean().optional() }).strict().nullish()
	})
	.strict()
	// Every point is compared with every limit: the product bounds the work of one request.
	.refine((b) => !b.limits || b.points.length * b.limits.length <= PREVIEW_COMPARISONS_MAX, {
		path: ['limits'],
		message: `Too much for one preview: points × limits may be at most ${PREVIEW_COMPARISONS_MAX}.`
	});

export type AssessmentPreviewBody = z.infer<typeof assessmentPreviewSchema>;
/** The body as sent (numbers may be JSON numbers). */
export type AssessmentPreviewRequest = z.input<typeof assessmentPreviewSchema>;

/** Maps a parsed preview body to the engine input (values stay decimal strings in SI units). */
export function toAssessmentInput(body: AssessmentPreviewBody): AssessmentInput {
	const line: LineInput = { ...body.line };
	const elements: ElementInput[] = body.elements.map((e) => ({ ...e }) as ElementInput);
	const points: PointInput[] = body.points.map((p) => ({ ...p }));
	const limits: LimitInput[] = (body.limits ?? []).map((l) => ({ ...l }));
	return {
		line,
		elements,
		points,
		limits,
		nohd: body.nohd ? { exposureDuration: body.nohd.exposureDuration ?? null } : null,
		options: body.options ? { breakdown: body.options.breakdown } : null
	};
}
