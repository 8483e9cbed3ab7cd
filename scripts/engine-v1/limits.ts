/**
 * Exposure limits: selection and evaluation. Limits are always inputs (entered by the laser safety
 * officer from the local code); no limit value is built into the engine.
 */
import type Decimal from 'decimal.js';
import { numbersOf } from './constants';
import { compare } from './digits';
import { sqrt } from './fastmath';
import type { NormLimit } from './validate';
import type { LimitQuantity, LimitRef, PulseBasis, Tissue } from './types';

/**
 * x^y for x > 0. Exponents that are whole multiples of 1/4 (0.75, −0.25, 0.5, …, the usual shape of
 * exposure limits) go through square roots and an integer power, which is exact to the working
 * precision and much cheaper than exp/ln; anything else falls back to Decimal.pow.
 */
export function powPositive(x: Decimal, y: Decimal): Decimal {
	const { ONE } = numbersOf(x);
	if (y.isZero()) return ONE;
	const quarters = y.times(4);
	if (quarters.isInteger() && quarters.abs().lte(4000)) {
		const q = quarters.toNumber();
		const whole = Math.trunc(q / 4);
		const rest = q - whole * 4; // −3 … 3
		let result = whole === 0 ? ONE : x.pow(whole);
		if (rest !== 0) {
			const r2 = sqrt(x);
			const part = Math.abs(rest) === 2 ? r2 : Math.abs(rest) === 1 ? sqrt(r2) : r2.times(sqrt(r2));
			result = rest > 0 ? result.times(part) : result.div(part);
		}
		return result;
	}
	return x.pow(y);
}

// tⁿ depends only on t and n, and a register uses few durations, pulse counts and exponents:
// memoised across assessments (a pure function, so sharing is safe), keyed by instance (exponents
// belong to shared limits, durations are read through the cache, pulse counts are memoised too) and
// bounded. A 25-digit and a 40-digit run never share an instance, hence never a value.
const powers = new Map<Decimal, Map<Decimal, Decimal>>();
const POWERS_MAX = 256;

export function memoPow(t: Decimal, n: Decimal): Decimal {
	if (n.isZero()) return numbersOf(t).ONE;
	let byT = powers.get(n);
	if (!byT) {
		if (powers.size >= POWERS_MAX) powers.clear();
		byT = new Map();
		powers.set(n, byT);
	}
	let v = byT.get(t);
	if (v === undefined) {
		if (byT.size >= POWERS_MAX) byT.clear();
		v = powPositive(t, n);
		byT.set(t, v);
	}
	return v;
}

// N = f·T for the pulse-train check, by repetition-rate and duration instance (both read through the
// cache), so that N and its powers are shared across assessments; bounded.
const pulseCounts = new Map<Decimal, Map<Decimal, Decimal>>();

/** N = max(1, f·T). */
export function pulseCount(f: Decimal, T: Decimal): Decimal {
	let byT = pulseCounts.get(f);
	if (!byT) {
		if (pulseCounts.size >= POWERS_MAX) pulseCounts.clear();
		byT = new Map();
		pulseCounts.set(f, byT);
	}
	let n = byT.get(T);
	if (n === undefined) {
		if (byT.size >= POWERS_MAX) byT.clear();
		const one = numbersOf(T).ONE;
		n = f.times(T);
		if (compare(n, one) < 0) n = one;
		byT.set(T, n);
	}
	return n;
}

/**
 * The memos of a limit are shared by every assessment that offers the same limit (see the limit
 * cache in validate.ts) and keyed by duration instance (durations read through the cache share
 * instances); bounded, so that durations that never recur do not accumulate.
 */
const LIMIT_MEMO_MAX = 64;

/** Limit value k·tⁿ at duration t (W/m² or J/m² according to the limit's quantity). */
export function limitValueAt(limit: NormLimit, t: Decimal): Decimal {
	const hit = limit.memo.get(t);
	if (hit) return hit;
	const v = limit.k.times(memoPow(t, limit.n));
	if (limit.memo.size >= LIMIT_MEMO_MAX) limit.memo.clear();
	limit.memo.set(t, v);
	return v;
}

/** 1/(k·tⁿ), memoised beside the value: ratios are then products. */
export function limitReciprocal(limit: NormLimit, t: Decimal, value: Decimal): Decimal {
	let inv = limit.inverseMemo.get(t);
	if (inv === undefined) {
		inv = numbersOf(value).ONE.div(value);
		if (limit.inverseMemo.size >= LIMIT_MEMO_MAX) limit.inverseMemo.clear();
		limit.inverseMemo.set(t, inv);
	}
	return inv;
}

export interface LimitQuery {
	tissue: Tissue;
	wavelength: Decimal;
	basis: PulseBasis;
	duration: Decimal;
	/** Pulse-train check: only single-pulse limits that give an exponent. */
	needsTrainExponent?: boolean;
}

/** True when the limit covers the tissue, the wavelength and the duration (all ranges inclusive). */
export function limitApplies(limit: NormLimit, q: LimitQuery): boolean {
	return (
		limit.tissue === q.tissue &&
		limit.pulseBasis === q.basis &&
		(!q.needsTrainExponent || limit.pulseTrainExponent !== null) &&
		compare(limit.wavelengthMin, q.wavelength) <= 0 &&
		compare(q.wavelength, limit.wavelengthMax) <= 0 &&
		compare(limit.durationMin, q.duration) <= 0 &&
		compare(q.duration, limit.durationMax) <= 0
	);
}

export function applicableLimits(limits: NormLimit[], q: LimitQuery): NormLimit[] {
	return limits.filter((l) => limitApplies(l, q));
}

/**
 * Applicable limits for one assessment (one wavelength). The check plans of an assessment keep what
 * they found (see applicableLimits in exposure.ts), so each query is made once per plan and tissue.
 */
export class LimitIndex {
	private readonly atWavelength: NormLimit[];
	constructor(
		readonly all: NormLimit[],
		readonly wavelength: Decimal
	) {
		this.atWavelength = all.filter((l) => compare(l.wavelengthMin, wavelength) <= 0 && compare(wavelength, l.wavelengthMax) <= 0);
	}

	find(tissue: Tissue, basis: PulseBasis, duration: Decimal, needsTrainExponent: boolean): NormLimit[] {
		const q: LimitQuery = { tissue, basis, duration, wavelength: this.wavelength, needsTrainExponent };
		const out: NormLimit[] = [];
		for (const l of this.atWavelength) if (limitApplies(l, q)) out.push(l);
		return out;
	}
}

/**
 * Expresses a limit in the measure that matches the exposure being compared:
 *   'irradiance' (power-like exposure, W/m²)    E_lim = k·tⁿ, or H_lim / t for a radiant-exposure limit;
 *   'radiant_exposure' (energy-like, J/m²)      H_lim = k·tⁿ, or E_lim · t for an irradiance limit.
 * The conversion is H = E·t at the check's duration t.
 */
export function limitInMeasure(limit: NormLimit, t: Decimal, measure: LimitQuantity): Decimal {
	const v = limitValueAt(limit, t);
	if (limit.quantity === measure) return v;
	return measure === 'irradiance' ? v.div(t) : v.times(t);
}

export function limitRef(limit: NormLimit): LimitRef {
	return { id: limit.id, version: limit.version };
}

