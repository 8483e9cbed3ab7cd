/**
 * The one shape of a beam path in SI units, shared by the browser and the server: what the editor
 * sends to the preview, what a save validates and stores (one column per field), what the
 * re-evaluation reads back from the rows, and what the hazard engine takes. One schema, one mapper
 * from rows (`beamPathFromRows`), no other copy.
 *
 * Numbers are SI decimal strings ("5e-3"), as PostgreSQL `numeric` holds them and as the unit parser
 * writes them; a JSON number is accepted too and written as a string. Structure is checked here
 * (every object strict: unknown keys are refused); physical ranges (λ within 180 nm – 1 mm,
 * transmission 0–1, f ≥ 1 mm, …) are the engine's rules, which name the offending field.
 */
import { z } from 'zod';
import { beamDefinitions, beamProfiles, elementKinds, emissionModes, limitQuantities, pointKinds, pulseBases, tissues, wavelengthFactorKinds } from '../enums';
import type { BeamDefinition, BeamProfile, ElementKind, EmissionMode, LimitQuantity, PointKind, PulseBasis, Tissue, WavelengthFactorKind } from '../enums';

export const NUMERIC_TEXT = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** A finite number in SI units, as a JSON number or a numeric string; output is a decimal string. */
export const siNumber = z
	.union([
		z.number({ error: 'Enter a number.' }).refine(Number.isFinite, 'Enter a finite number.'),
		z
			.string()
			.trim()
			.max(64, 'That number is too long.')
			.regex(NUMERIC_TEXT, 'Enter a number in SI units, using “.” as the decimal separator (for example 5e-3).')
	])
	.transform((v) => (typeof v === 'number' ? String(v) : v));

/** An optional SI number: absent, null or a number; always null or a decimal string after parsing. */
const siOrNull = siNumber.nullish().transform((v) => v ?? null);
const text = (max: number) => z.string().trim().max(max, `At most ${max} characters.`).default('');

/** An emission line of a laser, as stored (one column per field). */
export const lineSchema = z
	.object({
		id: z.string().trim().max(100).nullish().transform((v) => v ?? null),
		label: text(120),
		/** Lines with the same group name are emitted together; '' = on its own. */
		emissionGroup: text(60),
		mode: z.enum(emissionModes, { error: 'Choose continuous, single_pulse or repetitive.' }),
		wavelength: siNumber,
		/** Upper end of a tunable line's range; null for a fixed line. */
		wavelengthMax: siOrNull,
		power: siOrNull,
		pulseEnergy: siOrNull,
		pulseDuration: siOrNull,
		repetitionRate: siOrNull,
		beamProfile: z.enum(beamProfiles, { error: 'Choose gaussian or flat_top.' }).default('gaussian'),
		beamDiameter: siNumber,
		beamDiameterDefinition: z.enum(beamDefinitions, { error: 'Choose 1/e, 1/e2 or fwhm.' }).default('1/e'),
		divergence: siNumber,
		divergenceDefinition: z.enum(beamDefinitions, { error: 'Choose 1/e, 1/e2 or fwhm.' }).default('1/e'),
		beamQuality: siOrNull,
		/** Peak ÷ average irradiance across the beam (≥ 1); null for an ideal profile. */
		hotSpotFactor: siOrNull
	})
	.strict();

/** What a transmission element or mirror passes on in one wavelength band (inclusive ends). */
export const bandSchema = z
	.object({
		wavelengthMin: siNumber,
		wavelengthMax: siNumber,
		/** Fraction passed on along the path, 0–1 (a mirror: its reflectance in the band). */
		transmission: siNumber
	})
	.strict();

/** A path element; only the fields of its kind are used (the others are null). */
export const elementSchema = z
	.object({
		kind: z.enum(elementKinds, { error: `Choose an element kind: ${elementKinds.join(', ')}.` }),
		label: text(120),
		length: siOrNull,
		transmission: siOrNull,
		reflectance: siOrNull,
		magnification: siOrNull,
		focalLength: siOrNull,
		coreDiameter: siOrNull,
		numericalAperture: siOrNull,
		couplingTransmission: siOrNull,
		/** Transmission elements and mirrors: per wavelength band; a line in no band takes the element's own value. */
		bands: z
			.array(bandSchema)
			.max(20, 'At most 20 wavelength bands.')
			.nullish()
			.transform((v) => (v && v.length ? v : null))
	})
	.strict();

/** A point of concern: where a person could be exposed. */
export const pointSchema = z
	.object({
		id: z.string().trim().min(1, 'Give the point an id.').max(100),
		label: text(120),
		kind: z.enum(pointKinds, { error: 'Choose intrabeam or diffuse.' }),
		tissue: z.enum(tissues, { error: 'Choose eye or skin.' }),
		position: siNumber,
		exposureDuration: siOrNull,
		reflectance: siOrNull,
		viewingAngle: siOrNull,
		viewingDistance: siOrNull
	})
	.strict();

/** Bounds of one path (a saved path and a preview alike). */
export const PATH_BOUNDS = { lines: 12, elements: 200, points: 100 } as const;

export const beamPathSchema = z
	.object({
		lines: z.array(lineSchema).min(1, 'A beam path carries at least one emission line.').max(PATH_BOUNDS.lines, `At most ${PATH_BOUNDS.lines} emission lines.`),
		elements: z.array(elementSchema).max(PATH_BOUNDS.elements, `At most ${PATH_BOUNDS.elements} path elements.`).default([]),
		points: z.array(pointSchema).max(PATH_BOUNDS.points, `At most ${PATH_BOUNDS.points} points of concern.`).default([]),
		/** Exposure duration assumed for the hazard distances (e.g. 0.25 s for accidental visible viewing). */
		nohdExposureDuration: siOrNull
	})
	.strict();

/** An exposure limit as the laser safety officer entered it from the local code. */
export const limitSchema = z
	.object({
		id: z.string().trim().min(1).max(100),
		version: z.union([z.string().trim().min(1).max(50), z.number().int().nonnegative()]).transform(String),
		label: z.string().trim().min(1, 'Give the limit a label.').max(200),
		citation: z.string().trim().min(1, 'Cite the local code the limit comes from.').max(1000),
		tissue: z.enum(tissues, { error: 'Choose eye or skin.' }),
		wavelengthMin: siNumber,
		wavelengthMax: siNumber,
		durationMin: siNumber,
		durationMax: siNumber,
		quantity: z.enum(limitQuantities, { error: 'Choose irradiance or radiant_exposure.' }),
		/** Limit value k·C(λ)·C_E(α)·tⁿ in W/m² or J/m², t in s. */
		k: siNumber,
		n: siNumber,
		/** C(λ): none, a constant value, or 10^(slope·(λ − origin)) with λ clamped to [from, to] (slope per m). */
		wavelengthFactorKind: z.enum(wavelengthFactorKinds, { error: 'Choose none, constant or exponential.' }).default('none'),
		wavelengthFactorValue: siOrNull,
		wavelengthFactorSlope: siOrNull,
		wavelengthFactorOrigin: siOrNull,
		wavelengthFactorFrom: siOrNull,
		wavelengthFactorTo: siOrNull,
		/** C_E(α) = (α/α_min)^exponent between α_min and α_max (rad), 1 below, held above; absent = point source. */
		extendedAlphaMin: siOrNull,
		extendedAlphaMax: siOrNull,
		extendedExponent: siOrNull,
		/** Limiting aperture a·tᵇ (a in m, b dimensionless; b = 0 for a constant aperture). */
		limitingAperture: siNumber,
		limitingApertureExponent: siNumber.default('0'),
		pulseBasis: z.enum(pulseBases, { error: 'Choose single_pulse or continuous.' }),
		/** Pulses closer together than T_i (s) count as one pulse. */
		pulseGroupingTime: siOrNull,
		/** Single-pulse limits: the pulse-train check multiplies the limit by N^exponent (N = f·T). */
		pulseTrainExponent: siOrNull,
		/** Set by the officer: the code applies no pulse-train correction to this single-pulse limit. */
		noTrainCorrection: z.boolean().default(false)
	})
	.strict();

export type LineSI = z.infer<typeof lineSchema>;
export type ElementSI = z.infer<typeof elementSchema>;
export type PointSI = z.infer<typeof pointSchema>;
export type BeamPath = z.infer<typeof beamPathSchema>;
export type LimitSI = z.infer<typeof limitSchema>;

/** Points × limits in one preview request: the product bounds the work of one request. */
export const PREVIEW_COMPARISONS_MAX = 2000;

/** Body of POST /api/assessments/preview: a path, and optionally the limits to compare with. */
export const previewSchema = z
	.object({
		path: beamPathSchema,
		/** Omitted: the route uses the limits in force in the library. */
		limits: z.array(limitSchema).max(50, 'At most 50 limits in one preview.').optional(),
		/** Include the step-by-step working (default true). */
		breakdown: z.boolean().default(true)
	})
	.strict()
	.refine((b) => !b.limits || b.path.points.length * b.limits.length <= PREVIEW_COMPARISONS_MAX, {
		path: ['limits'],
		message: `Too much for one preview: points × limits may be at most ${PREVIEW_COMPARISONS_MAX}.`
	});

export type PreviewBody = z.infer<typeof previewSchema>;
/** The body as sent (numbers may be JSON numbers, defaults may be left out). */
export type PreviewRequest = z.input<typeof previewSchema>;

// ------------------------------------------------------------------ the one mapper from rows

/** The columns of a stored emission line (a database row has at least these). */
export interface LineColumns {
	id: string;
	label: string;
	emissionGroup: string;
	mode: EmissionMode;
	wavelength: string;
	wavelengthMax: string | null;
	power: string | null;
	pulseEnergy: string | null;
	pulseDuration: string | null;
	repetitionRate: string | null;
	beamProfile: BeamProfile;
	beamDiameter: string;
	beamDiameterDefinition: BeamDefinition;
	divergence: string;
	divergenceDefinition: BeamDefinition;
	beamQuality: string | null;
	hotSpotFactor: string | null;
}
export type ElementColumns = { kind: ElementKind; label: string; bands: ElementSI['bands'] } & Record<Exclude<keyof ElementSI, 'kind' | 'label' | 'bands'>, string | null>;
export interface PointColumns {
	id: string;
	label: string;
	kind: PointKind;
	tissue: Tissue;
	position: string;
	exposureDuration: string | null;
	reflectance: string | null;
	viewingAngle: string | null;
	viewingDistance: string | null;
}
export interface LimitColumns {
	limitId: string;
	version: number;
	label: string;
	citation: string;
	tissue: Tissue;
	wavelengthMin: string;
	wavelengthMax: string;
	durationMin: string;
	durationMax: string;
	quantity: LimitQuantity;
	k: string;
	n: string;
	wavelengthFactorKind: WavelengthFactorKind;
	wavelengthFactorValue: string | null;
	wavelengthFactorSlope: string | null;
	wavelengthFactorOrigin: string | null;
	wavelengthFactorFrom: string | null;
	wavelengthFactorTo: string | null;
	extendedAlphaMin: string | null;
	extendedAlphaMax: string | null;
	extendedExponent: string | null;
	limitingAperture: string;
	limitingApertureExponent: string;
	pulseBasis: PulseBasis;
	pulseGroupingTime: string | null;
	pulseTrainExponent: string | null;
	noTrainCorrection: boolean;
}

export function lineFromRow(r: LineColumns): LineSI {
	return {
		id: r.id,
		label: r.label,
		emissionGroup: r.emissionGroup,
		mode: r.mode,
		wavelength: r.wavelength,
		wavelengthMax: r.wavelengthMax,
		power: r.power,
		pulseEnergy: r.pulseEnergy,
		pulseDuration: r.pulseDuration,
		repetitionRate: r.repetitionRate,
		beamProfile: r.beamProfile,
		beamDiameter: r.beamDiameter,
		beamDiameterDefinition: r.beamDiameterDefinition,
		divergence: r.divergence,
		divergenceDefinition: r.divergenceDefinition,
		beamQuality: r.beamQuality,
		hotSpotFactor: r.hotSpotFactor
	};
}

export function elementFromRow(r: ElementColumns): ElementSI {
	return {
		kind: r.kind,
		label: r.label,
		length: r.length,
		transmission: r.transmission,
		reflectance: r.reflectance,
		magnification: r.magnification,
		focalLength: r.focalLength,
		coreDiameter: r.coreDiameter,
		numericalAperture: r.numericalAperture,
		couplingTransmission: r.couplingTransmission,
		bands: r.bands && r.bands.length ? r.bands : null
	};
}

export function pointFromRow(r: PointColumns): PointSI {
	return {
		id: r.id,
		label: r.label,
		kind: r.kind,
		tissue: r.tissue,
		position: r.position,
		exposureDuration: r.exposureDuration,
		reflectance: r.reflectance,
		viewingAngle: r.viewingAngle,
		viewingDistance: r.viewingDistance
	};
}

export function limitFromRow(r: LimitColumns): LimitSI {
	return {
		id: r.limitId,
		version: String(r.version),
		label: r.label,
		citation: r.citation,
		tissue: r.tissue,
		wavelengthMin: r.wavelengthMin,
		wavelengthMax: r.wavelengthMax,
		durationMin: r.durationMin,
		durationMax: r.durationMax,
		quantity: r.quantity,
		k: r.k,
		n: r.n,
		wavelengthFactorKind: r.wavelengthFactorKind,
		wavelengthFactorValue: r.wavelengthFactorValue,
		wavelengthFactorSlope: r.wavelengthFactorSlope,
		wavelengthFactorOrigin: r.wavelengthFactorOrigin,
		wavelengthFactorFrom: r.wavelengthFactorFrom,
		wavelengthFactorTo: r.wavelengthFactorTo,
		extendedAlphaMin: r.extendedAlphaMin,
		extendedAlphaMax: r.extendedAlphaMax,
		extendedExponent: r.extendedExponent,
		limitingAperture: r.limitingAperture,
		limitingApertureExponent: r.limitingApertureExponent,
		pulseBasis: r.pulseBasis,
		pulseGroupingTime: r.pulseGroupingTime,
		pulseTrainExponent: r.pulseTrainExponent,
		noTrainCorrection: r.noTrainCorrection
	};
}

/** A stored path (its row, its line, its elements and points in order) as the one SI shape. */
export function beamPathFromRows(rows: { path: { nohdExposureDuration: string | null }; lines: LineColumns[]; elements: ElementColumns[]; points: PointColumns[] }): BeamPath {
	return {
		lines: rows.lines.map(lineFromRow),
		elements: rows.elements.map(elementFromRow),
		points: rows.points.map(pointFromRow),
		nohdExposureDuration: rows.path.nohdExposureDuration
	};
}
