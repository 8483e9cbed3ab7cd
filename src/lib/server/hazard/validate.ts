/**
 * Input validation: turns an AssessmentInput into a normalised model of decimals, collecting every
 * problem as a HazardInputError that names the field.
 */
import type Decimal from 'decimal.js';
import { HALF_PI, ONE, WAVELENGTH_MAX, WAVELENGTH_MIN, ZERO } from './constants';
import { ErrorList } from './errors';
import { toOneOverE } from './beam';
import { isMissing, optionalNumber, optionalText, requireEnum, requireNumber, requireText, type RangeRule } from './numbers';
import type { BeamDefinition, EmissionMode, LimitQuantity, PulseBasis, Tissue } from './types';

export const BEAM_DEFINITIONS = ['1/e', '1/e2', 'fwhm'] as const;
export const EMISSION_MODES = ['continuous', 'single_pulse', 'repetitive'] as const;
export const TISSUES = ['eye', 'skin'] as const;
export const POINT_KINDS = ['intrabeam', 'diffuse'] as const;
export const ELEMENT_KINDS = ['propagate', 'transmission', 'mirror', 'expander', 'lens', 'fibre', 'enclosure'] as const;
export const LIMIT_QUANTITIES = ['irradiance', 'radiant_exposure'] as const;
export const PULSE_BASES = ['single_pulse', 'continuous'] as const;

const POSITIVE: RangeRule = { min: ZERO, minExclusive: true, describe: 'greater than zero' };
const NON_NEGATIVE: RangeRule = { min: ZERO, describe: 'zero or more' };
const FRACTION: RangeRule = { min: ZERO, max: ONE, describe: 'between 0 and 1' };
const AT_LEAST_ONE: RangeRule = { min: ONE, describe: '1 or more' };
const NOT_POSITIVE: RangeRule = { max: ZERO, describe: 'zero or negative (a pulse train never relaxes a limit)' };
const WAVELENGTH: RangeRule = { min: WAVELENGTH_MIN, max: WAVELENGTH_MAX, describe: 'between 180 nm and 1 mm (1.8e-7 to 1e-3 m)' };
const NUMERICAL_APERTURE: RangeRule = { min: ZERO, minExclusive: true, max: ONE, describe: 'greater than 0 and at most 1' };
const VIEWING_ANGLE: RangeRule = { min: ZERO, max: HALF_PI, maxExclusive: true, describe: 'at least 0 and less than π/2 rad (90°)' };

export interface NormLine {
	wavelength: Decimal;
	mode: EmissionMode;
	/** Continuous power (continuous mode). */
	power: Decimal | null;
	pulseEnergy: Decimal | null;
	pulseDuration: Decimal | null;
	repetitionRate: Decimal | null;
	/** P for continuous, Q·f for repetitive, null for a single pulse. */
	averagePower: Decimal | null;
	/** Q/τ for pulsed modes. */
	peakPower: Decimal | null;
	/** Beam diameter and divergence at the aperture as entered, and on the 1/e basis. */
	beamDiameterEntered: Decimal;
	beamDiameterDefinition: BeamDefinition;
	divergenceEntered: Decimal;
	divergenceDefinition: BeamDefinition;
	d0: Decimal;
	divergence: Decimal;
	beamQuality: Decimal;
}

export type NormElement = { index: number; label: string } & (
	| { kind: 'propagate'; length: Decimal }
	| { kind: 'enclosure'; length: Decimal }
	| { kind: 'transmission'; factor: Decimal }
	| { kind: 'mirror'; factor: Decimal }
	| { kind: 'expander'; magnification: Decimal }
	| { kind: 'lens'; focalLength: Decimal }
	| { kind: 'fibre'; coreDiameter: Decimal; numericalAperture: Decimal; factor: Decimal }
);

export interface NormPoint {
	index: number;
	id: string;
	label: string;
	position: Decimal;
	tissue: Tissue;
	kind: 'intrabeam' | 'diffuse';
	exposureDuration: Decimal | null;
	reflectance: Decimal | null;
	viewingAngle: Decimal;
	viewingDistance: Decimal | null;
}

export interface NormLimit {
	index: number;
	id: string;
	version: string;
	label: string;
	citation: string;
	tissue: Tissue;
	wavelengthMin: Decimal;
	wavelengthMax: Decimal;
	durationMin: Decimal;
	durationMax: Decimal;
	quantity: LimitQuantity;
	k: Decimal;
	n: Decimal;
	limitingAperture: Decimal;
	pulseBasis: PulseBasis;
	pulseTrainExponent: Decimal | null;
	/** Memo of k·tⁿ and of its reciprocal, keyed by the (interned) duration instance. */
	memo: Map<Decimal, Decimal>;
	inverseMemo: Map<Decimal, Decimal>;
}

export interface NormInput {
	line: NormLine;
	elements: NormElement[];
	points: NormPoint[];
	limits: NormLimit[];
	nohdExposureDuration: Decimal | null;
	breakdown: boolean;
}

function isRecord(value: unknown): value is Record<string, unknown> {
	return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Durations are interned by value so that a limit evaluated at the same t is computed once. */
class Interner {
	private readonly map = new Map<string, Decimal>();
	get(d: Decimal): Decimal {
		const key = d.toString();
		const hit = this.map.get(key);
		if (hit) return hit;
		this.map.set(key, d);
		return d;
	}
}

function validateLine(raw: unknown, errors: ErrorList): NormLine | undefined {
	if (!isRecord(raw)) {
		errors.add('line', 'The emission line is required (wavelength, mode, beam diameter and divergence).');
		return undefined;
	}
	const wavelength = requireNumber(errors, 'line.wavelength', raw.wavelength, WAVELENGTH, 'The wavelength');
	const mode = requireEnum(errors, 'line.mode', raw.mode, EMISSION_MODES, 'The emission mode');
	let power: Decimal | null = null;
	let pulseEnergy: Decimal | null = null;
	let pulseDuration: Decimal | null = null;
	let repetitionRate: Decimal | null = null;
	let ok = wavelength !== undefined && mode !== undefined;
	if (mode === 'continuous') {
		const p = requireNumber(errors, 'line.power', raw.power, POSITIVE, 'The power');
		if (p === undefined) ok = false;
		else power = p;
	} else if (mode === 'single_pulse' || mode === 'repetitive') {
		const q = requireNumber(errors, 'line.pulseEnergy', raw.pulseEnergy, POSITIVE, 'The pulse energy');
		const tau = requireNumber(errors, 'line.pulseDuration', raw.pulseDuration, POSITIVE, 'The pulse duration');
		if (q === undefined || tau === undefined) ok = false;
		else {
			pulseEnergy = q;
			pulseDuration = tau;
		}
		if (mode === 'repetitive') {
			const f = requireNumber(errors, 'line.repetitionRate', raw.repetitionRate, POSITIVE, 'The repetition rate');
			if (f === undefined) ok = false;
			else {
				repetitionRate = f;
				if (tau !== undefined && tau.times(f).gte(ONE)) {
					errors.add('line.pulseDuration', `The pulse is longer than its period: τ = ${tau.toString()} s but 1/f = ${ONE.div(f).toSignificantDigits(6).toString()} s.`);
					ok = false;
				}
			}
		}
	}
	const d0Entered = requireNumber(errors, 'line.beamDiameter', raw.beamDiameter, POSITIVE, 'The beam diameter');
	const d0Def = requireEnum(errors, 'line.beamDiameterDefinition', raw.beamDiameterDefinition, BEAM_DEFINITIONS, 'The beam diameter definition');
	const phiEntered = requireNumber(errors, 'line.divergence', raw.divergence, NON_NEGATIVE, 'The divergence');
	const phiDef = requireEnum(errors, 'line.divergenceDefinition', raw.divergenceDefinition, BEAM_DEFINITIONS, 'The divergence definition');
	const m2 = optionalNumber(errors, 'line.beamQuality', raw.beamQuality, AT_LEAST_ONE, 'The beam quality M²');
	if (!ok || d0Entered === undefined || d0Def === undefined || phiEntered === undefined || phiDef === undefined || m2 === undefined) return undefined;

	const averagePower = mode === 'continuous' ? power : mode === 'repetitive' ? pulseEnergy!.times(repetitionRate!) : null;
	const peakPower = mode === 'continuous' ? null : pulseEnergy!.div(pulseDuration!);
	return {
		wavelength: wavelength!,
		mode: mode!,
		power,
		pulseEnergy,
		pulseDuration,
		repetitionRate,
		averagePower,
		peakPower,
		beamDiameterEntered: d0Entered,
		beamDiameterDefinition: d0Def,
		divergenceEntered: phiEntered,
		divergenceDefinition: phiDef,
		d0: toOneOverE(d0Entered, d0Def),
		divergence: toOneOverE(phiEntered, phiDef),
		beamQuality: m2 ?? ONE
	};
}

function validateElement(raw: unknown, i: number, errors: ErrorList): NormElement | undefined {
	const at = `elements.${i}`;
	if (!isRecord(raw)) {
		errors.add(at, `Element ${i + 1} must be an object with a kind.`);
		return undefined;
	}
	const kind = requireEnum(errors, `${at}.kind`, raw.kind, ELEMENT_KINDS, 'The element kind');
	if (kind === undefined) return undefined;
	const label = optionalText(raw.label, kind);
	switch (kind) {
		case 'propagate':
		case 'enclosure': {
			const length = requireNumber(errors, `${at}.length`, raw.length, NON_NEGATIVE, 'The length');
			return length === undefined ? undefined : { index: i, label, kind, length };
		}
		case 'transmission': {
			const factor = requireNumber(errors, `${at}.transmission`, raw.transmission, FRACTION, 'The transmission');
			return factor === undefined ? undefined : { index: i, label, kind, factor };
		}
		case 'mirror': {
			const factor = optionalNumber(errors, `${at}.reflectance`, raw.reflectance, FRACTION, 'The reflectance');
			return factor === undefined ? undefined : { index: i, label, kind, factor: factor ?? ONE };
		}
		case 'expander': {
			const magnification = requireNumber(errors, `${at}.magnification`, raw.magnification, POSITIVE, 'The magnification');
			return magnification === undefined ? undefined : { index: i, label, kind, magnification };
		}
		case 'lens': {
			const focalLength = requireNumber(errors, `${at}.focalLength`, raw.focalLength, POSITIVE, 'The focal length');
			return focalLength === undefined ? undefined : { index: i, label, kind, focalLength };
		}
		case 'fibre': {
			const coreDiameter = requireNumber(errors, `${at}.coreDiameter`, raw.coreDiameter, POSITIVE, 'The core diameter');
			const numericalAperture = requireNumber(errors, `${at}.numericalAperture`, raw.numericalAperture, NUMERICAL_APERTURE, 'The numerical aperture');
			const factor = optionalNumber(errors, `${at}.couplingTransmission`, raw.couplingTransmission, FRACTION, 'The coupling transmission');
			if (coreDiameter === undefined || numericalAperture === undefined || factor === undefined) return undefined;
			return { index: i, label, kind, coreDiameter, numericalAperture, factor: factor ?? ONE };
		}
	}
}

function validatePoint(raw: unknown, i: number, errors: ErrorList, interner: Interner): NormPoint | undefined {
	const at = `points.${i}`;
	if (!isRecord(raw)) {
		errors.add(at, `Point ${i + 1} must be an object.`);
		return undefined;
	}
	const id = requireText(errors, `${at}.id`, raw.id, 'The point id');
	const position = requireNumber(errors, `${at}.position`, raw.position, NON_NEGATIVE, 'The position along the path');
	const tissue = requireEnum(errors, `${at}.tissue`, raw.tissue, TISSUES, 'The tissue');
	const kind = requireEnum(errors, `${at}.kind`, raw.kind, POINT_KINDS, 'The point kind');
	const exposureDuration = optionalNumber(errors, `${at}.exposureDuration`, raw.exposureDuration, POSITIVE, 'The exposure duration');
	let reflectance: Decimal | null | undefined = null;
	let viewingAngle: Decimal | null | undefined = ZERO;
	let viewingDistance: Decimal | null | undefined = null;
	if (kind === 'diffuse') {
		reflectance = optionalNumber(errors, `${at}.reflectance`, raw.reflectance, FRACTION, 'The reflectance');
		viewingAngle = optionalNumber(errors, `${at}.viewingAngle`, raw.viewingAngle, VIEWING_ANGLE, 'The viewing angle');
		viewingDistance = optionalNumber(errors, `${at}.viewingDistance`, raw.viewingDistance, POSITIVE, 'The viewing distance');
	}
	if (id === undefined || position === undefined || tissue === undefined || kind === undefined || exposureDuration === undefined || reflectance === undefined || viewingAngle === undefined || viewingDistance === undefined) return undefined;
	return {
		index: i,
		id,
		label: optionalText(raw.label, id),
		position,
		tissue,
		kind,
		exposureDuration: exposureDuration === null ? null : interner.get(exposureDuration),
		reflectance,
		viewingAngle: viewingAngle ?? ZERO,
		viewingDistance
	};
}

function validateLimit(raw: unknown, i: number, errors: ErrorList): NormLimit | undefined {
	const at = `limits.${i}`;
	if (!isRecord(raw)) {
		errors.add(at, `Limit ${i + 1} must be an object.`);
		return undefined;
	}
	const id = requireText(errors, `${at}.id`, raw.id, 'The limit id');
	const version = requireText(errors, `${at}.version`, raw.version, 'The limit version');
	const citation = requireText(errors, `${at}.citation`, raw.citation, 'The citation of the local code', 1000);
	const tissue = requireEnum(errors, `${at}.tissue`, raw.tissue, TISSUES, 'The tissue');
	const wavelengthMin = requireNumber(errors, `${at}.wavelengthMin`, raw.wavelengthMin, POSITIVE, 'The lower wavelength');
	const wavelengthMax = requireNumber(errors, `${at}.wavelengthMax`, raw.wavelengthMax, POSITIVE, 'The upper wavelength');
	const durationMin = requireNumber(errors, `${at}.durationMin`, raw.durationMin, NON_NEGATIVE, 'The shortest duration');
	const durationMax = requireNumber(errors, `${at}.durationMax`, raw.durationMax, POSITIVE, 'The longest duration');
	const quantity = requireEnum(errors, `${at}.quantity`, raw.quantity, LIMIT_QUANTITIES, 'The quantity');
	const k = requireNumber(errors, `${at}.k`, raw.k, POSITIVE, 'The coefficient k');
	const n = requireNumber(errors, `${at}.n`, raw.n, undefined, 'The exponent n');
	const limitingAperture = requireNumber(errors, `${at}.limitingAperture`, raw.limitingAperture, NON_NEGATIVE, 'The limiting aperture');
	const pulseBasis = requireEnum(errors, `${at}.pulseBasis`, raw.pulseBasis, PULSE_BASES, 'The pulse basis');
	const pulseTrainExponent = optionalNumber(errors, `${at}.pulseTrainExponent`, raw.pulseTrainExponent, NOT_POSITIVE, 'The pulse-train exponent');
	let ok = true;
	if (wavelengthMin && wavelengthMax && wavelengthMax.lt(wavelengthMin)) {
		errors.add(`${at}.wavelengthMax`, 'The upper wavelength must not be below the lower wavelength.');
		ok = false;
	}
	if (durationMin && durationMax && durationMax.lt(durationMin)) {
		errors.add(`${at}.durationMax`, 'The longest duration must not be below the shortest duration.');
		ok = false;
	}
	if (pulseTrainExponent && pulseBasis === 'continuous') {
		errors.add(`${at}.pulseTrainExponent`, 'Only single-pulse limits take a pulse-train exponent.');
		ok = false;
	}
	if (!ok || id === undefined || version === undefined || citation === undefined || tissue === undefined || wavelengthMin === undefined || wavelengthMax === undefined || durationMin === undefined || durationMax === undefined || quantity === undefined || k === undefined || n === undefined || limitingAperture === undefined || pulseBasis === undefined || pulseTrainExponent === undefined) return undefined;
	return {
		index: i,
		id,
		version,
		label: optionalText(raw.label, id),
		citation,
		tissue,
		wavelengthMin,
		wavelengthMax,
		durationMin,
		durationMax,
		quantity,
		k,
		n,
		limitingAperture,
		pulseBasis,
		pulseTrainExponent,
		memo: new Map(),
		inverseMemo: new Map()
	};
}

function validateList<T>(raw: unknown, field: string, required: boolean, errors: ErrorList, each: (item: unknown, i: number) => T | undefined): T[] | undefined {
	if (isMissing(raw)) {
		if (required) {
			errors.add(field, 'This list is required (it may be empty).');
			return undefined;
		}
		return [];
	}
	if (!Array.isArray(raw)) {
		errors.add(field, 'This must be a list.');
		return undefined;
	}
	const out: T[] = [];
	let ok = true;
	raw.forEach((item, i) => {
		const v = each(item, i);
		if (v === undefined) ok = false;
		else out.push(v);
	});
	return ok ? out : undefined;
}

export type Validated = { ok: true; input: NormInput } | { ok: false; errors: ErrorList };

export function validate(raw: unknown): Validated {
	const errors = new ErrorList();
	if (!isRecord(raw)) {
		errors.add('', 'The assessment input must be an object with line, elements, points and limits.');
		return { ok: false, errors };
	}
	const interner = new Interner();
	const line = validateLine(raw.line, errors);
	const elements = validateList(raw.elements, 'elements', false, errors, (e, i) => validateElement(e, i, errors));
	const points = validateList(raw.points, 'points', true, errors, (p, i) => validatePoint(p, i, errors, interner));
	const limits = validateList(raw.limits, 'limits', true, errors, (l, i) => validateLimit(l, i, errors));

	let nohdExposureDuration: Decimal | null | undefined = null;
	if (!isMissing(raw.nohd)) {
		if (!isRecord(raw.nohd)) errors.add('nohd', 'This must be an object with exposureDuration.');
		else nohdExposureDuration = optionalNumber(errors, 'nohd.exposureDuration', raw.nohd.exposureDuration, POSITIVE, 'The NOHD exposure duration');
	}
	let breakdown = true;
	if (isRecord(raw.options) && raw.options.breakdown === false) breakdown = false;

	if (points) {
		const seen = new Map<string, number>();
		for (const p of points) {
			const first = seen.get(p.id);
			if (first !== undefined) errors.add(`points.${p.index}.id`, `The point id “${p.id}” is already used by point ${first + 1}.`);
			else seen.set(p.id, p.index);
		}
	}
	if (elements && points) {
		let length = ZERO;
		for (const e of elements) if (e.kind === 'propagate' || e.kind === 'enclosure') length = length.plus(e.length);
		for (const p of points) {
			if (p.position.gt(length)) {
				errors.add(`points.${p.index}.position`, `The point lies past the end of the path: position ${p.position.toString()} m, path length ${length.toString()} m.`);
			}
		}
	}
	if (!errors.empty || !line || !elements || !points || !limits || nohdExposureDuration === undefined) return { ok: false, errors };
	return {
		ok: true,
		input: {
			line,
			elements,
			points,
			limits,
			nohdExposureDuration: nohdExposureDuration === null ? null : interner.get(nohdExposureDuration),
			breakdown
		}
	};
}
