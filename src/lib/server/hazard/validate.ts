/**
 * Input rules of the engine: a beam path and limits, as decimal strings (or numbers) in SI units,
 * become a normalised model of float64 numbers, and every problem becomes an error that names its
 * field ('lines.0.power', 'elements.2.focalLength', 'points.1.reflectance', 'limits.3.n').
 * The same rules serve the forms (the line form and the limit form check with them before saving).
 */
import { beamDefinitions, beamProfiles, elementKinds, emissionModes, limitQuantities, pointKinds, pulseBases, tissues, wavelengthFactorKinds } from '$lib/enums';
import type { BeamDefinition, BeamProfile, ElementKind, EmissionMode, LimitQuantity, PointKind, PulseBasis, Tissue } from '$lib/enums';
import type { CitedLimit, InputError, LimitRef } from '$lib/assessmentResult';
import { WAVELENGTH_MAX, WAVELENGTH_MIN } from './constants';
import { toOneOverE } from './beam';

export interface NormLine {
	/** Index in the path's lines; the variants of a tunable line share it (see tuning.ts). */
	index: number;
	id: string | null;
	label: string;
	emissionGroup: string;
	wavelength: number;
	/** Upper end of a tunable line's range; null for a fixed line. */
	wavelengthMax: number | null;
	mode: EmissionMode;
	/** Q for pulsed modes, τ, f for repetitive; null otherwise. */
	pulseEnergy: number | null;
	pulseDuration: number | null;
	repetitionRate: number | null;
	/** P for continuous, Q·f for repetitive, null for a single pulse. */
	averagePower: number | null;
	/** Q/τ for pulsed modes. */
	peakPower: number | null;
	profile: BeamProfile;
	/** As entered, and as used: 1/e for a Gaussian beam, the full width for a flat-top one. */
	beamDiameterEntered: number;
	beamDiameterDefinition: BeamDefinition;
	divergenceEntered: number;
	divergenceDefinition: BeamDefinition;
	d0: number;
	divergence: number;
	beamQuality: number;
	/** Peak ÷ average across the beam, 1 when not given. */
	hotSpot: number;
}

export interface NormBand {
	from: number;
	to: number;
	factor: number;
}

export type NormElement = { index: number; label: string; kind: ElementKind } & {
	length: number;
	/** Power factor of the element (transmission, reflectance, fibre coupling); 1 for the others. */
	factor: number;
	/** Per wavelength band (transmission elements, mirrors); empty = the one factor for every line. */
	bands: NormBand[];
	magnification: number;
	focalLength: number;
	coreDiameter: number;
	numericalAperture: number;
};

export interface NormPoint {
	index: number;
	id: string;
	label: string;
	position: number;
	tissue: Tissue;
	kind: PointKind;
	exposureDuration: number | null;
	reflectance: number | null;
	viewingAngle: number;
	viewingDistance: number | null;
}

export interface NormLimit {
	index: number;
	id: string;
	version: string;
	label: string;
	citation: string;
	tissue: Tissue;
	wavelengthMin: number;
	wavelengthMax: number;
	durationMin: number;
	durationMax: number;
	quantity: LimitQuantity;
	k: number;
	n: number;
	/** C(λ): null = 1; a constant; or 10^(slope·(clamp(λ, from, to) − origin)). */
	wavelengthFactor: { kind: 'constant'; value: number } | { kind: 'exponential'; slope: number; origin: number; from: number; to: number } | null;
	/** C_E(α) rule; null = every source a point source (C_E = 1, conservative). */
	extendedSource: { alphaMin: number; alphaMax: number; exponent: number } | null;
	/** Limiting aperture a·tᵇ. */
	limitingAperture: number;
	apertureExponent: number;
	pulseBasis: PulseBasis;
	/** T_i: pulses closer together than this count as one; null = no grouping rule. */
	groupingTime: number | null;
	trainExponent: number | null;
	noTrainCorrection: boolean;
	/** Its reference and its citation as results carry them: one object each, shared by every comparison. */
	ref: LimitRef;
	cited: CitedLimit;
}

export interface NormPath {
	lines: NormLine[];
	elements: NormElement[];
	points: NormPoint[];
	nohdExposureDuration: number | null;
	/** Sum of the propagation and enclosure lengths, m. */
	length: number;
}

/** Numbers the engine takes: zero, or a magnitude between 1e-30 and 1e30, so nothing over- or underflows. */
const MAGNITUDE_MIN = 1e-30;
const MAGNITUDE_MAX = 1e30;
const DECIMAL_TEXT = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

interface Rule {
	min?: number;
	minExclusive?: boolean;
	max?: number;
	maxExclusive?: boolean;
	describe: string;
}
const POSITIVE: Rule = { min: 0, minExclusive: true, describe: 'greater than zero' };
const NON_NEGATIVE: Rule = { min: 0, describe: 'zero or more' };
const FRACTION: Rule = { min: 0, max: 1, describe: 'between 0 and 1' };
const AT_LEAST_ONE: Rule = { min: 1, describe: '1 or more' };
const HOT_SPOT: Rule = { min: 1, max: 1000, describe: 'between 1 (an even profile) and 1000' };
const WAVELENGTH: Rule = { min: WAVELENGTH_MIN, max: WAVELENGTH_MAX, describe: 'between 180 nm and 1 mm (1.8e-7 to 1e-3 m)' };
const DIVERGENCE: Rule = { min: 0, max: Math.PI, describe: 'between 0 and π rad (180°)' };
const MAGNIFICATION: Rule = { min: 0.01, max: 1000, describe: 'between 0.01 and 1000' };
const FOCAL_LENGTH: Rule = { min: 1e-3, describe: 'at least 1 mm (a shorter focal length is not a lens a beam path uses)' };
const NUMERICAL_APERTURE: Rule = { min: 0, minExclusive: true, max: 1, describe: 'greater than 0 and at most 1' };
const VIEWING_ANGLE: Rule = { min: 0, max: Math.PI / 2, maxExclusive: true, describe: 'at least 0 and less than π/2 rad (90°)' };
const EXPONENT: Rule = { min: -2, max: 2, describe: 'between −2 and 2' };
const TRAIN_EXPONENT: Rule = { min: -2, max: 0, describe: 'between −2 and 0 (a pulse train never relaxes a limit)' };
/** 10^(s·Δλ): ±1e8 per metre is ±0.1 per nanometre, a factor of 10 every 10 nm. */
const SLOPE: Rule = { min: -1e8, max: 1e8, describe: 'between −1e8 and 1e8 per metre (±0.1 per nm)' };
const EXTENDED_EXPONENT: Rule = { min: 0, max: 2, describe: 'between 0 and 2' };

export class Errors {
	readonly items: InputError[] = [];
	add(field: string, reason: string): void {
		this.items.push({ field, reason });
	}
	get empty(): boolean {
		return this.items.length === 0;
	}
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const isMissing = (v: unknown) => v === undefined || v === null || (typeof v === 'string' && v.trim() === '');

/** A number from a decimal string or a JSON number, checked against a rule; undefined (error added) when it is not. */
function num(errors: Errors, field: string, raw: unknown, rule: Rule | null, what: string): number | undefined {
	let v: number;
	if (typeof raw === 'number') v = raw;
	else if (typeof raw === 'string' && DECIMAL_TEXT.test(raw.trim())) v = Number(raw.trim());
	else if (isMissing(raw)) {
		errors.add(field, `${what} is required.`);
		return undefined;
	} else {
		errors.add(field, `${what} must be a number in SI units (digits, “.” and an optional exponent).`);
		return undefined;
	}
	if (!Number.isFinite(v)) {
		errors.add(field, `${what} must be a finite number.`);
		return undefined;
	}
	const a = Math.abs(v);
	if (a !== 0 && (a < MAGNITUDE_MIN || a > MAGNITUDE_MAX)) {
		errors.add(field, `${what} is outside the range the engine accepts (zero, or a size between 1e-30 and 1e30 in SI units).`);
		return undefined;
	}
	if (rule) {
		const low = rule.min !== undefined && (rule.minExclusive ? v <= rule.min : v < rule.min);
		const high = rule.max !== undefined && (rule.maxExclusive ? v >= rule.max : v > rule.max);
		if (low || high) {
			errors.add(field, `${what} must be ${rule.describe}.`);
			return undefined;
		}
	}
	return v;
}

/** Like num, but absent is null. */
function optionalNum(errors: Errors, field: string, raw: unknown, rule: Rule | null, what: string): number | null | undefined {
	return isMissing(raw) ? null : num(errors, field, raw, rule, what);
}

function oneOf<T extends string>(errors: Errors, field: string, raw: unknown, allowed: readonly T[], what: string): T | undefined {
	if (typeof raw === 'string' && (allowed as readonly string[]).includes(raw)) return raw as T;
	errors.add(field, `${what} must be one of ${allowed.join(', ')}.`);
	return undefined;
}

function textOf(raw: unknown, fallback: string): string {
	return typeof raw === 'string' && raw.trim() !== '' ? raw.trim().slice(0, 200) : fallback;
}

// ------------------------------------------------------------------ lines

export function readLine(raw: unknown, i: number, errors: Errors): NormLine | undefined {
	const at = `lines.${i}`;
	if (!isRecord(raw)) {
		errors.add(at, 'The emission line is required (wavelength, mode, beam diameter and divergence).');
		return undefined;
	}
	const n0 = errors.items.length;
	const wavelength = num(errors, `${at}.wavelength`, raw.wavelength, WAVELENGTH, 'The wavelength');
	let wavelengthMax: number | null = null;
	if (!isMissing(raw.wavelengthMax)) {
		const top = num(errors, `${at}.wavelengthMax`, raw.wavelengthMax, WAVELENGTH, 'The upper end of the tuning range');
		if (top !== undefined && wavelength !== undefined && top < wavelength) errors.add(`${at}.wavelengthMax`, 'The upper end of the tuning range must not be below the wavelength.');
		else if (top !== undefined && wavelength !== undefined && top > wavelength) wavelengthMax = top;
	}
	const mode = oneOf(errors, `${at}.mode`, raw.mode, emissionModes, 'The emission mode');
	let power: number | undefined;
	let q: number | undefined;
	let tau: number | undefined;
	let f: number | undefined;
	if (mode === 'continuous') power = num(errors, `${at}.power`, raw.power, POSITIVE, 'The power');
	if (mode === 'single_pulse' || mode === 'repetitive') {
		q = num(errors, `${at}.pulseEnergy`, raw.pulseEnergy, POSITIVE, 'The pulse energy');
		tau = num(errors, `${at}.pulseDuration`, raw.pulseDuration, POSITIVE, 'The pulse duration');
	}
	if (mode === 'repetitive') {
		f = num(errors, `${at}.repetitionRate`, raw.repetitionRate, POSITIVE, 'The repetition rate');
		if (f !== undefined && tau !== undefined && tau * f >= 1) errors.add(`${at}.pulseDuration`, `The pulse is longer than its period: τ = ${tau} s but 1/f = ${Number((1 / f).toPrecision(6))} s.`);
	}
	const profile = isMissing(raw.beamProfile) ? 'gaussian' : oneOf(errors, `${at}.beamProfile`, raw.beamProfile, beamProfiles, 'The beam profile');
	const d = num(errors, `${at}.beamDiameter`, raw.beamDiameter, POSITIVE, 'The beam diameter');
	const dDef = isMissing(raw.beamDiameterDefinition) ? '1/e' : oneOf(errors, `${at}.beamDiameterDefinition`, raw.beamDiameterDefinition, beamDefinitions, 'The beam diameter definition');
	const phi = num(errors, `${at}.divergence`, raw.divergence, DIVERGENCE, 'The divergence');
	const phiDef = isMissing(raw.divergenceDefinition) ? '1/e' : oneOf(errors, `${at}.divergenceDefinition`, raw.divergenceDefinition, beamDefinitions, 'The divergence definition');
	const m2 = optionalNum(errors, `${at}.beamQuality`, raw.beamQuality, AT_LEAST_ONE, 'The beam quality M²');
	const hot = optionalNum(errors, `${at}.hotSpotFactor`, raw.hotSpotFactor, HOT_SPOT, 'The hot-spot factor (peak ÷ average)');
	if (errors.items.length > n0 || wavelength === undefined || mode === undefined || profile === undefined || d === undefined || dDef === undefined || phi === undefined || phiDef === undefined || m2 === undefined || hot === undefined) return undefined;
	const flat = profile === 'flat_top';
	return {
		index: i,
		id: typeof raw.id === 'string' ? raw.id : null,
		label: textOf(raw.label, `line ${i + 1}`),
		emissionGroup: typeof raw.emissionGroup === 'string' ? raw.emissionGroup.trim() : '',
		wavelength,
		wavelengthMax,
		mode,
		pulseEnergy: q ?? null,
		pulseDuration: tau ?? null,
		repetitionRate: f ?? null,
		averagePower: mode === 'continuous' ? power! : mode === 'repetitive' ? q! * f! : null,
		peakPower: mode === 'continuous' ? null : q! / tau!,
		profile,
		beamDiameterEntered: d,
		beamDiameterDefinition: dDef,
		divergenceEntered: phi,
		divergenceDefinition: phiDef,
		// A flat-top beam is entered by its full width, which is what its irradiance is averaged over.
		d0: flat ? d : toOneOverE(d, dDef),
		divergence: flat ? phi : toOneOverE(phi, phiDef),
		beamQuality: m2 ?? 1,
		hotSpot: hot ?? 1
	};
}

/** The line rules alone, for the line form: every problem, named by its field ('power', …). */
export function lineProblems(raw: unknown): InputError[] {
	const errors = new Errors();
	readLine(raw, 0, errors);
	return errors.items.map((e) => ({ field: e.field.replace(/^lines\.0\.?/, ''), reason: e.reason }));
}

// ------------------------------------------------------------------ elements and points

function readElement(raw: unknown, i: number, errors: Errors): NormElement | undefined {
	const at = `elements.${i}`;
	if (!isRecord(raw)) {
		errors.add(at, `Element ${i + 1} must be an object with a kind.`);
		return undefined;
	}
	const kind = oneOf(errors, `${at}.kind`, raw.kind, elementKinds, 'The element kind');
	if (kind === undefined) return undefined;
	const e: NormElement = { index: i, label: textOf(raw.label, ''), kind, length: 0, factor: 1, bands: [], magnification: 1, focalLength: 0, coreDiameter: 0, numericalAperture: 0 };
	const n0 = errors.items.length;
	switch (kind) {
		case 'propagate':
		case 'enclosure':
			e.length = num(errors, `${at}.length`, raw.length, NON_NEGATIVE, 'The length') ?? 0;
			break;
		case 'transmission':
			e.factor = num(errors, `${at}.transmission`, raw.transmission, FRACTION, 'The transmission') ?? 0;
			e.bands = readBands(raw.bands, at, errors);
			break;
		case 'mirror':
			e.factor = optionalNum(errors, `${at}.reflectance`, raw.reflectance, FRACTION, 'The reflectance') ?? 1;
			e.bands = readBands(raw.bands, at, errors);
			break;
		case 'expander':
			e.magnification = num(errors, `${at}.magnification`, raw.magnification, MAGNIFICATION, 'The magnification') ?? 1;
			break;
		case 'lens':
			e.focalLength = num(errors, `${at}.focalLength`, raw.focalLength, FOCAL_LENGTH, 'The focal length') ?? 0;
			break;
		case 'fibre':
			e.coreDiameter = num(errors, `${at}.coreDiameter`, raw.coreDiameter, POSITIVE, 'The core diameter') ?? 0;
			e.numericalAperture = num(errors, `${at}.numericalAperture`, raw.numericalAperture, NUMERICAL_APERTURE, 'The numerical aperture') ?? 0;
			e.factor = optionalNum(errors, `${at}.couplingTransmission`, raw.couplingTransmission, FRACTION, 'The coupling transmission') ?? 1;
			break;
	}
	return errors.items.length > n0 ? undefined : e;
}

/** Bands of a transmission element or mirror: inclusive wavelength ranges with what they pass on. */
function readBands(raw: unknown, at: string, errors: Errors): NormBand[] {
	if (isMissing(raw)) return [];
	if (!Array.isArray(raw)) {
		errors.add(`${at}.bands`, 'The wavelength bands must be a list.');
		return [];
	}
	const out: NormBand[] = [];
	raw.forEach((b, j) => {
		const where = `${at}.bands.${j}`;
		if (!isRecord(b)) return errors.add(where, `Band ${j + 1} must give wavelengthMin, wavelengthMax and transmission.`);
		const from = num(errors, `${where}.wavelengthMin`, b.wavelengthMin, POSITIVE, 'The shortest wavelength of the band');
		const to = num(errors, `${where}.wavelengthMax`, b.wavelengthMax, POSITIVE, 'The longest wavelength of the band');
		const factor = num(errors, `${where}.transmission`, b.transmission, FRACTION, 'The transmission in the band');
		if (from !== undefined && to !== undefined && to < from) errors.add(`${where}.wavelengthMax`, 'The longest wavelength of the band must not be below the shortest.');
		else if (from !== undefined && to !== undefined && factor !== undefined) out.push({ from, to, factor });
	});
	return out;
}

function readPoint(raw: unknown, i: number, errors: Errors): NormPoint | undefined {
	const at = `points.${i}`;
	if (!isRecord(raw)) {
		errors.add(at, `Point ${i + 1} must be an object.`);
		return undefined;
	}
	const n0 = errors.items.length;
	const id = typeof raw.id === 'string' && raw.id.trim() !== '' ? raw.id.trim() : undefined;
	if (id === undefined) errors.add(`${at}.id`, 'The point id is required.');
	const position = num(errors, `${at}.position`, raw.position, NON_NEGATIVE, 'The position along the path');
	const tissue = oneOf(errors, `${at}.tissue`, raw.tissue, tissues, 'The tissue');
	const kind = oneOf(errors, `${at}.kind`, raw.kind, pointKinds, 'The point kind');
	const exposureDuration = optionalNum(errors, `${at}.exposureDuration`, raw.exposureDuration, POSITIVE, 'The exposure duration');
	let reflectance: number | null | undefined = null;
	let viewingAngle: number | null | undefined = 0;
	let viewingDistance: number | null | undefined = null;
	if (kind === 'diffuse') {
		reflectance = optionalNum(errors, `${at}.reflectance`, raw.reflectance, FRACTION, 'The reflectance');
		viewingAngle = optionalNum(errors, `${at}.viewingAngle`, raw.viewingAngle, VIEWING_ANGLE, 'The viewing angle');
		viewingDistance = optionalNum(errors, `${at}.viewingDistance`, raw.viewingDistance, POSITIVE, 'The viewing distance');
	}
	if (errors.items.length > n0) return undefined;
	return {
		index: i,
		id: id!,
		label: textOf(raw.label, id!),
		position: position!,
		tissue: tissue!,
		kind: kind!,
		exposureDuration: exposureDuration!,
		reflectance: reflectance!,
		viewingAngle: viewingAngle ?? 0,
		viewingDistance: viewingDistance!
	};
}

// ------------------------------------------------------------------ limits

export function readLimit(raw: unknown, i: number, errors: Errors): NormLimit | undefined {
	const at = `limits.${i}`;
	if (!isRecord(raw)) {
		errors.add(at, `Limit ${i + 1} must be an object.`);
		return undefined;
	}
	const n0 = errors.items.length;
	const text = (f: string, what: string, max: number) => {
		const v = raw[f];
		if (typeof v === 'string' && v.trim() !== '' && v.length <= max) return v.trim();
		if (typeof v === 'number' && f === 'version') return String(v);
		errors.add(`${at}.${f}`, `${what} is required (at most ${max} characters).`);
		return undefined;
	};
	const id = text('id', 'The limit id', 100);
	const version = text('version', 'The limit version', 50);
	const citation = text('citation', 'The citation of the local code', 1000);
	const tissue = oneOf(errors, `${at}.tissue`, raw.tissue, tissues, 'The tissue');
	const wavelengthMin = num(errors, `${at}.wavelengthMin`, raw.wavelengthMin, POSITIVE, 'The shortest wavelength');
	const wavelengthMax = num(errors, `${at}.wavelengthMax`, raw.wavelengthMax, POSITIVE, 'The longest wavelength');
	const durationMin = num(errors, `${at}.durationMin`, raw.durationMin, NON_NEGATIVE, 'The shortest duration');
	const durationMax = num(errors, `${at}.durationMax`, raw.durationMax, POSITIVE, 'The longest duration');
	const quantity = oneOf(errors, `${at}.quantity`, raw.quantity, limitQuantities, 'The quantity');
	const k = num(errors, `${at}.k`, raw.k, POSITIVE, 'The coefficient k');
	const n = num(errors, `${at}.n`, raw.n, EXPONENT, 'The exponent n');
	const limitingAperture = num(errors, `${at}.limitingAperture`, raw.limitingAperture, NON_NEGATIVE, 'The limiting aperture');
	const apertureExponent = optionalNum(errors, `${at}.limitingApertureExponent`, raw.limitingApertureExponent, EXPONENT, 'The exponent of the limiting aperture') ?? 0;
	const pulseBasis = oneOf(errors, `${at}.pulseBasis`, raw.pulseBasis, pulseBases, 'The pulse basis');
	const groupingTime = optionalNum(errors, `${at}.pulseGroupingTime`, raw.pulseGroupingTime, POSITIVE, 'The pulse-grouping time T_i');
	const wavelengthFactor = readWavelengthFactor(raw, at, errors, wavelengthMin, wavelengthMax);
	const extendedSource = readExtendedSource(raw, at, errors);
	const trainExponent = optionalNum(errors, `${at}.pulseTrainExponent`, raw.pulseTrainExponent, TRAIN_EXPONENT, 'The pulse-train exponent');
	const noTrainCorrection = raw.noTrainCorrection === true;
	if (raw.noTrainCorrection !== undefined && raw.noTrainCorrection !== null && typeof raw.noTrainCorrection !== 'boolean') errors.add(`${at}.noTrainCorrection`, 'Must be true or false.');
	if (wavelengthMin !== undefined && wavelengthMax !== undefined && wavelengthMax < wavelengthMin) errors.add(`${at}.wavelengthMax`, 'The longest wavelength must not be below the shortest.');
	if (durationMin !== undefined && durationMax !== undefined && durationMax < durationMin) errors.add(`${at}.durationMax`, 'The longest duration must not be below the shortest.');
	if (pulseBasis === 'continuous' && (trainExponent !== null || noTrainCorrection)) errors.add(`${at}.pulseTrainExponent`, 'Only single-pulse limits take a pulse-train rule.');
	if (pulseBasis === 'continuous' && groupingTime !== null && groupingTime !== undefined) errors.add(`${at}.pulseGroupingTime`, 'Only single-pulse limits take a pulse-grouping time.');
	if (trainExponent !== null && trainExponent !== undefined && noTrainCorrection) errors.add(`${at}.noTrainCorrection`, 'Give either a pulse-train exponent or “no train correction”, not both.');
	if (errors.items.length > n0) return undefined;
	return {
		index: i,
		id: id!,
		version: version!,
		label: textOf(raw.label, id!),
		citation: citation!,
		tissue: tissue!,
		wavelengthMin: wavelengthMin!,
		wavelengthMax: wavelengthMax!,
		durationMin: durationMin!,
		durationMax: durationMax!,
		quantity: quantity!,
		k: k!,
		n: n!,
		wavelengthFactor: wavelengthFactor!,
		extendedSource: extendedSource!,
		limitingAperture: limitingAperture!,
		apertureExponent,
		pulseBasis: pulseBasis!,
		groupingTime: groupingTime ?? null,
		trainExponent: trainExponent ?? null,
		noTrainCorrection,
		ref: { id: id!, version: version! },
		cited: { id: id!, version: version!, label: textOf(raw.label, id!), citation: citation! }
	};
}

/** The wavelength factor of a limit: none, a constant C > 0, or 10^(s·(λ − λ₀)) over [from, to]. */
function readWavelengthFactor(raw: Record<string, unknown>, at: string, errors: Errors, lo: number | undefined, hi: number | undefined): NormLimit['wavelengthFactor'] | undefined {
	const kind = isMissing(raw.wavelengthFactorKind) ? 'none' : oneOf(errors, `${at}.wavelengthFactorKind`, raw.wavelengthFactorKind, wavelengthFactorKinds, 'The kind of wavelength factor');
	if (kind === undefined) return undefined;
	if (kind === 'none') return null;
	if (kind === 'constant') {
		const value = num(errors, `${at}.wavelengthFactorValue`, raw.wavelengthFactorValue, POSITIVE, 'The wavelength factor');
		return value === undefined ? undefined : { kind, value };
	}
	const slope = num(errors, `${at}.wavelengthFactorSlope`, raw.wavelengthFactorSlope, SLOPE, 'The slope of the wavelength factor (per metre)');
	const origin = num(errors, `${at}.wavelengthFactorOrigin`, raw.wavelengthFactorOrigin, POSITIVE, 'The wavelength λ₀ of the factor');
	const from = optionalNum(errors, `${at}.wavelengthFactorFrom`, raw.wavelengthFactorFrom, POSITIVE, 'The start of the factor’s range');
	const to = optionalNum(errors, `${at}.wavelengthFactorTo`, raw.wavelengthFactorTo, POSITIVE, 'The end of the factor’s range');
	if (slope === undefined || origin === undefined || from === undefined || to === undefined || lo === undefined || hi === undefined) return undefined;
	const a = from ?? lo;
	const b = to ?? hi;
	if (b < a) {
		errors.add(`${at}.wavelengthFactorTo`, 'The end of the factor’s range must not be below its start.');
		return undefined;
	}
	return { kind, slope, origin, from: a, to: b };
}

/** C_E(α): α_min, α_max and the exponent, all three or none. */
function readExtendedSource(raw: Record<string, unknown>, at: string, errors: Errors): NormLimit['extendedSource'] | undefined {
	const given = [raw.extendedAlphaMin, raw.extendedAlphaMax, raw.extendedExponent].filter((v) => !isMissing(v)).length;
	if (given === 0) return null;
	if (given < 3) {
		errors.add(`${at}.extendedAlphaMin`, 'An extended-source rule needs α_min, α_max and its exponent (or none of them: every source is then a point source).');
		return undefined;
	}
	const alphaMin = num(errors, `${at}.extendedAlphaMin`, raw.extendedAlphaMin, POSITIVE, 'α_min');
	const alphaMax = num(errors, `${at}.extendedAlphaMax`, raw.extendedAlphaMax, POSITIVE, 'α_max');
	const exponent = num(errors, `${at}.extendedExponent`, raw.extendedExponent, EXTENDED_EXPONENT, 'The exponent of C_E');
	if (alphaMin === undefined || alphaMax === undefined || exponent === undefined) return undefined;
	if (alphaMax < alphaMin) {
		errors.add(`${at}.extendedAlphaMax`, 'α_max must not be below α_min.');
		return undefined;
	}
	return { alphaMin, alphaMax, exponent };
}

/** The limit rules alone, for the limit form: every problem, named by its field ('n', …). */
export function limitProblems(raw: unknown): InputError[] {
	const errors = new Errors();
	readLimit(raw, 0, errors);
	return errors.items.map((e) => ({ field: e.field.replace(/^limits\.0\.?/, ''), reason: e.reason }));
}

// ------------------------------------------------------------------ the whole input

function readList<T>(raw: unknown, field: string, errors: Errors, each: (item: unknown, i: number) => T | undefined): T[] | undefined {
	if (isMissing(raw)) return [];
	if (!Array.isArray(raw)) {
		errors.add(field, 'This must be a list.');
		return undefined;
	}
	const out: T[] = [];
	let ok = true;
	for (let i = 0; i < raw.length; i++) {
		const v = each(raw[i], i);
		if (v === undefined) ok = false;
		else out.push(v);
	}
	return ok ? out : undefined;
}

/** Relative tolerance for positions along the path (see the error budget in constants.ts). */
export const POSITION_TOLERANCE = 1e-9;

export type Validated = { ok: true; path: NormPath; limits: NormLimit[] } | { ok: false; errors: InputError[] };

export function validate(path: unknown, limits: unknown): Validated {
	const errors = new Errors();
	if (!isRecord(path)) {
		errors.add('', 'The beam path must be an object with lines, elements, points and nohdExposureDuration.');
		return { ok: false, errors: errors.items };
	}
	let lines: NormLine[] | undefined;
	if (!Array.isArray(path.lines) || path.lines.length === 0) errors.add('lines', 'A beam path needs its emission line.');
	else lines = readList(path.lines, 'lines', errors, (l, i) => readLine(l, i, errors));
	const elements = readList(path.elements, 'elements', errors, (e, i) => readElement(e, i, errors));
	const points = readList(path.points, 'points', errors, (p, i) => readPoint(p, i, errors));
	const limitList = readList(limits, 'limits', errors, (l, i) => readLimit(l, i, errors));
	const nohd = optionalNum(errors, 'nohdExposureDuration', path.nohdExposureDuration, POSITIVE, 'The exposure duration for the hazard distances');

	let length = 0;
	if (elements) for (const e of elements) length += e.length;
	if (points) {
		const seen = new Map<string, number>();
		for (const p of points) {
			const first = seen.get(p.id);
			if (first !== undefined) errors.add(`points.${p.index}.id`, `The point id “${p.id}” is already used by point ${first + 1}.`);
			else seen.set(p.id, p.index);
			if (elements && p.position > length * (1 + POSITION_TOLERANCE) + 1e-12)
				errors.add(`points.${p.index}.position`, `The point lies past the end of the path: ${p.position} m along a path of ${Number(length.toPrecision(12))} m.`);
		}
	}
	if (!errors.empty || !lines || !elements || !points || !limitList || nohd === undefined) return { ok: false, errors: errors.items };
	return { ok: true, path: { lines, elements, points, nohdExposureDuration: nohd, length }, limits: limitList };
}
