/**
 * Input validation: turns an AssessmentInput into a normalised model of decimals, collecting every
 * problem as a HazardInputError that names the field.
 */
import type Decimal from 'decimal.js';
import { Dec, HALF_PI, ONE, WAVELENGTH_MAX, WAVELENGTH_MIN, ZERO, numbersFor, type DecimalClone } from './constants';
import { compare } from './digits';
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
	| { kind: 'propagate'; length: Decimal; end?: Decimal }
	| { kind: 'enclosure'; length: Decimal; end?: Decimal }
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
	/** 1/(π·D_f²/4), the reciprocal of the aperture area; null when D_f = 0. */
	perApertureArea: Decimal | null;
	/** Written values (12 digits), formed when first needed; shared like the memos. */
	texts: { k?: string; n?: string; aperture?: string; trainExponent?: string };
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
	// An assessment has a handful of distinct durations: a list compared by identity, then by value.
	private readonly seen: Decimal[] = [];
	get(d: Decimal): Decimal {
		for (const s of this.seen) if (s === d) return s;
		for (const s of this.seen) if (compare(s, d) === 0) return s;
		this.seen.push(d);
		return d;
	}
}

function validateLine(raw: unknown, errors: ErrorList, D: DecimalClone): NormLine | undefined {
	if (!isRecord(raw)) {
		errors.add('line', 'The emission line is required (wavelength, mode, beam diameter and divergence).');
		return undefined;
	}
	// Wavelengths and repetition rates recur across a register: read through the cache.
	const wavelength = requireNumber(errors, 'line.wavelength', raw.wavelength, WAVELENGTH, 'The wavelength', D, true);
	const mode = requireEnum(errors, 'line.mode', raw.mode, EMISSION_MODES, 'The emission mode');
	let power: Decimal | null = null;
	let pulseEnergy: Decimal | null = null;
	let pulseDuration: Decimal | null = null;
	let repetitionRate: Decimal | null = null;
	let ok = wavelength !== undefined && mode !== undefined;
	if (mode === 'continuous') {
		const p = requireNumber(errors, 'line.power', raw.power, POSITIVE, 'The power', D);
		if (p === undefined) ok = false;
		else power = p;
	} else if (mode === 'single_pulse' || mode === 'repetitive') {
		const q = requireNumber(errors, 'line.pulseEnergy', raw.pulseEnergy, POSITIVE, 'The pulse energy', D);
		const tau = requireNumber(errors, 'line.pulseDuration', raw.pulseDuration, POSITIVE, 'The pulse duration', D);
		if (q === undefined || tau === undefined) ok = false;
		else {
			pulseEnergy = q;
			pulseDuration = tau;
		}
		if (mode === 'repetitive') {
			const f = requireNumber(errors, 'line.repetitionRate', raw.repetitionRate, POSITIVE, 'The repetition rate', D, true);
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
	const d0Entered = requireNumber(errors, 'line.beamDiameter', raw.beamDiameter, POSITIVE, 'The beam diameter', D);
	const d0Def = requireEnum(errors, 'line.beamDiameterDefinition', raw.beamDiameterDefinition, BEAM_DEFINITIONS, 'The beam diameter definition');
	const phiEntered = requireNumber(errors, 'line.divergence', raw.divergence, NON_NEGATIVE, 'The divergence', D);
	const phiDef = requireEnum(errors, 'line.divergenceDefinition', raw.divergenceDefinition, BEAM_DEFINITIONS, 'The divergence definition');
	const m2 = optionalNumber(errors, 'line.beamQuality', raw.beamQuality, AT_LEAST_ONE, 'The beam quality M²', D);
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
		beamQuality: m2 ?? numbersFor(D).ONE
	};
}

function validateElement(raw: unknown, i: number, errors: ErrorList, D: DecimalClone): NormElement | undefined {
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
			const length = requireNumber(errors, `${at}.length`, raw.length, NON_NEGATIVE, 'The length', D);
			return length === undefined ? undefined : { index: i, label, kind, length };
		}
		case 'transmission': {
			const factor = requireNumber(errors, `${at}.transmission`, raw.transmission, FRACTION, 'The transmission', D);
			return factor === undefined ? undefined : { index: i, label, kind, factor };
		}
		case 'mirror': {
			const factor = optionalNumber(errors, `${at}.reflectance`, raw.reflectance, FRACTION, 'The reflectance', D);
			return factor === undefined ? undefined : { index: i, label, kind, factor: factor ?? numbersFor(D).ONE };
		}
		case 'expander': {
			const magnification = requireNumber(errors, `${at}.magnification`, raw.magnification, POSITIVE, 'The magnification', D);
			return magnification === undefined ? undefined : { index: i, label, kind, magnification };
		}
		case 'lens': {
			const focalLength = requireNumber(errors, `${at}.focalLength`, raw.focalLength, POSITIVE, 'The focal length', D);
			return focalLength === undefined ? undefined : { index: i, label, kind, focalLength };
		}
		case 'fibre': {
			const coreDiameter = requireNumber(errors, `${at}.coreDiameter`, raw.coreDiameter, POSITIVE, 'The core diameter', D);
			const numericalAperture = requireNumber(errors, `${at}.numericalAperture`, raw.numericalAperture, NUMERICAL_APERTURE, 'The numerical aperture', D);
			const factor = optionalNumber(errors, `${at}.couplingTransmission`, raw.couplingTransmission, FRACTION, 'The coupling transmission', D);
			if (coreDiameter === undefined || numericalAperture === undefined || factor === undefined) return undefined;
			return { index: i, label, kind, coreDiameter, numericalAperture, factor: factor ?? numbersFor(D).ONE };
		}
	}
}

function validatePoint(raw: unknown, i: number, errors: ErrorList, interner: Interner, D: DecimalClone): NormPoint | undefined {
	const at = `points.${i}`;
	if (!isRecord(raw)) {
		errors.add(at, `Point ${i + 1} must be an object.`);
		return undefined;
	}
	const id = requireText(errors, `${at}.id`, raw.id, 'The point id');
	const position = requireNumber(errors, `${at}.position`, raw.position, NON_NEGATIVE, 'The position along the path', D);
	const tissue = requireEnum(errors, `${at}.tissue`, raw.tissue, TISSUES, 'The tissue');
	const kind = requireEnum(errors, `${at}.kind`, raw.kind, POINT_KINDS, 'The point kind');
	// Exposure durations recur across a register (a few standard values): read through the cache.
	const exposureDuration = optionalNumber(errors, `${at}.exposureDuration`, raw.exposureDuration, POSITIVE, 'The exposure duration', D, true);
	const zero = numbersFor(D).ZERO;
	let reflectance: Decimal | null | undefined = null;
	let viewingAngle: Decimal | null | undefined = zero;
	let viewingDistance: Decimal | null | undefined = null;
	if (kind === 'diffuse') {
		reflectance = optionalNumber(errors, `${at}.reflectance`, raw.reflectance, FRACTION, 'The reflectance', D);
		viewingAngle = optionalNumber(errors, `${at}.viewingAngle`, raw.viewingAngle, VIEWING_ANGLE, 'The viewing angle', D);
		viewingDistance = optionalNumber(errors, `${at}.viewingDistance`, raw.viewingDistance, POSITIVE, 'The viewing distance', D);
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
		viewingAngle: viewingAngle ?? zero,
		viewingDistance
	};
}

/**
 * A register offers the same few limits to every assessment. A valid limit is normalised once per
 * content and clone: the cache is keyed by the whole content (every field, compared by type and
 * value on each hit), never by id and version alone, so an edited limit that keeps its id (a
 * preview, a draft) is read afresh. Only plain strings and numbers (and a missing exponent) are
 * cached; anything else is validated every time. Invalid limits are never cached, so their errors
 * are always reported. Bounded: cleared when full.
 */
type LimitCore = Omit<NormLimit, 'index'>;
interface CachedLimit {
	fields: unknown[];
	core: LimitCore;
}
const LIMIT_CACHE_MAX = 512;
const limitCaches = new Map<DecimalClone, Map<number, CachedLimit[]>>();

/** Every field of the limit input (id … pulseTrainExponent), or null when one is not a plain string or number. */
function limitFields(raw: Record<string, unknown>): unknown[] | null {
	const out = [raw.id, raw.version, raw.label, raw.citation, raw.tissue, raw.wavelengthMin, raw.wavelengthMax, raw.durationMin, raw.durationMax, raw.quantity, raw.k, raw.n, raw.limitingAperture, raw.pulseBasis, raw.pulseTrainExponent];
	for (const v of out) if (typeof v !== 'string' && typeof v !== 'number' && v !== undefined && v !== null) return null;
	return out;
}

/** A cheap hash of the field values (lengths and a few characters of the strings, the numbers). */
function hashFields(fields: unknown[]): number {
	let h = 17;
	for (const v of fields) {
		if (typeof v === 'string') {
			const n = v.length;
			h = Math.imul(h ^ n, 0x9e3779b1);
			if (n > 0) h = Math.imul(h ^ (v.charCodeAt(0) | (v.charCodeAt(n - 1) << 8) | (v.charCodeAt(n >> 1) << 16)), 0x85ebca6b);
		} else if (typeof v === 'number') h = Math.imul(h ^ ((v * 1e6) | 0) ^ 0x5bd1e995, 0xc2b2ae35);
		else h = Math.imul(h ^ (v === null ? 3 : 5), 0x27d4eb2f);
	}
	return h;
}

function sameFields(a: unknown[], b: unknown[]): boolean {
	for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
	return true;
}

function fromCore(c: LimitCore, index: number): NormLimit {
	return {
		index,
		id: c.id,
		version: c.version,
		label: c.label,
		citation: c.citation,
		tissue: c.tissue,
		wavelengthMin: c.wavelengthMin,
		wavelengthMax: c.wavelengthMax,
		durationMin: c.durationMin,
		durationMax: c.durationMax,
		quantity: c.quantity,
		k: c.k,
		n: c.n,
		limitingAperture: c.limitingAperture,
		pulseBasis: c.pulseBasis,
		pulseTrainExponent: c.pulseTrainExponent,
		perApertureArea: c.perApertureArea,
		texts: c.texts,
		memo: c.memo,
		inverseMemo: c.inverseMemo
	};
}

function validateLimit(raw: unknown, i: number, errors: ErrorList, D: DecimalClone): NormLimit | undefined {
	if (!isRecord(raw)) {
		errors.add(`limits.${i}`, `Limit ${i + 1} must be an object.`);
		return undefined;
	}
	const fields = limitFields(raw);
	if (fields === null) return readLimit(raw, i, errors, D);
	let cache = limitCaches.get(D);
	if (!cache) {
		cache = new Map();
		limitCaches.set(D, cache);
	}
	const hash = hashFields(fields);
	const bucket = cache.get(hash);
	if (bucket) for (const c of bucket) if (sameFields(c.fields, fields)) return fromCore(c.core, i);
	const limit = readLimit(raw, i, errors, D);
	if (limit) {
		if (cache.size >= LIMIT_CACHE_MAX) cache.clear();
		const entry = { fields, core: limit };
		const list = cache.get(hash);
		if (list) list.push(entry);
		else cache.set(hash, [entry]);
	}
	return limit;
}

function readLimit(raw: Record<string, unknown>, i: number, errors: ErrorList, D: DecimalClone): NormLimit | undefined {
	const at = `limits.${i}`;
	const id = requireText(errors, `${at}.id`, raw.id, 'The limit id');
	const version = requireText(errors, `${at}.version`, raw.version, 'The limit version');
	const citation = requireText(errors, `${at}.citation`, raw.citation, 'The citation of the local code', 1000);
	const tissue = requireEnum(errors, `${at}.tissue`, raw.tissue, TISSUES, 'The tissue');
	const wavelengthMin = requireNumber(errors, `${at}.wavelengthMin`, raw.wavelengthMin, POSITIVE, 'The lower wavelength', D);
	const wavelengthMax = requireNumber(errors, `${at}.wavelengthMax`, raw.wavelengthMax, POSITIVE, 'The upper wavelength', D);
	const durationMin = requireNumber(errors, `${at}.durationMin`, raw.durationMin, NON_NEGATIVE, 'The shortest duration', D);
	const durationMax = requireNumber(errors, `${at}.durationMax`, raw.durationMax, POSITIVE, 'The longest duration', D);
	const quantity = requireEnum(errors, `${at}.quantity`, raw.quantity, LIMIT_QUANTITIES, 'The quantity');
	const k = requireNumber(errors, `${at}.k`, raw.k, POSITIVE, 'The coefficient k', D);
	const n = requireNumber(errors, `${at}.n`, raw.n, undefined, 'The exponent n', D);
	const limitingAperture = requireNumber(errors, `${at}.limitingAperture`, raw.limitingAperture, NON_NEGATIVE, 'The limiting aperture', D);
	const pulseBasis = requireEnum(errors, `${at}.pulseBasis`, raw.pulseBasis, PULSE_BASES, 'The pulse basis');
	const pulseTrainExponent = optionalNumber(errors, `${at}.pulseTrainExponent`, raw.pulseTrainExponent, NOT_POSITIVE, 'The pulse-train exponent', D);
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
	const K = numbersFor(D);
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
		perApertureArea: limitingAperture.isZero() ? null : K.FOUR_OVER_PI.div(limitingAperture.times(limitingAperture)),
		texts: {},
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

/**
 * Validates and normalises an assessment input into decimals of clone D (`Dec`, 40 digits, unless
 * told otherwise; assess() passes its 25-digit clone).
 */
export function validate(raw: unknown, D: DecimalClone = Dec): Validated {
	const errors = new ErrorList();
	if (!isRecord(raw)) {
		errors.add('', 'The assessment input must be an object with line, elements, points and limits.');
		return { ok: false, errors };
	}
	const interner = new Interner();
	const line = validateLine(raw.line, errors, D);
	const elements = validateList(raw.elements, 'elements', false, errors, (e, i) => validateElement(e, i, errors, D));
	const points = validateList(raw.points, 'points', true, errors, (p, i) => validatePoint(p, i, errors, interner, D));
	const limits = validateList(raw.limits, 'limits', true, errors, (l, i) => validateLimit(l, i, errors, D));

	let nohdExposureDuration: Decimal | null | undefined = null;
	if (!isMissing(raw.nohd)) {
		if (!isRecord(raw.nohd)) errors.add('nohd', 'This must be an object with exposureDuration.');
		else nohdExposureDuration = optionalNumber(errors, 'nohd.exposureDuration', raw.nohd.exposureDuration, POSITIVE, 'The NOHD exposure duration', D, true);
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
		let length = numbersFor(D).ZERO;
		// The running sum is kept on each element (its end along the path) for the path walk.
		for (const e of elements) if (e.kind === 'propagate' || e.kind === 'enclosure') e.end = length = length.plus(e.length);
		for (const p of points) {
			if (compare(p.position, length) > 0) {
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
