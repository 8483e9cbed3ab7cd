/**
 * Elementary functions on decimals, fast enough for a campus register. Each works in the clone of
 * its argument (see constants.ts).
 *
 * decimal.js evaluates sqrt, ln, cos and asin to the full working precision by series, which costs
 * tens to hundreds of microseconds each. Here:
 *  • sqrt: a float64 seed (≈ 16 correct digits) refined by one Newton step x ← (x + a/x)/2, which
 *    doubles the correct digits: ≥ 30 significant digits (relative error < 1e-31) or the clone's
 *    precision, whichever is lower — far beyond the 12 reported. Exact squares of short decimals
 *    come out exact.
 *  • log₁₀ (optical density only): the decimal exponent is taken exactly from the decimal and only
 *    the mantissa m ∈ [1, 10) goes through float64 (correctly rounded from all its digits):
 *    log₁₀(x) = e + log₁₀(m), absolute error below 1e-15 (reported with 12 significant digits);
 *    exact powers of ten give exact integers.
 *  • cos θ for 0 ≤ θ < π/2 (diffuse viewing): cos θ = sin(π/2 − θ) with π/2 − θ formed in decimal,
 *    so the relative error stays near 1e-16 even close to grazing angles.
 *  • asin (fibre NA): float64 up to 0.99, decimal.js beyond, where float64 loses digits.
 */
import type Decimal from 'decimal.js';
import { numbersOf } from './constants';

type Words = { d: number[] | null; e: number; s: number };

/** 10^i as float64 for i = 0 … 308 (correctly rounded; exact up to 1e22). */
const POW10: number[] = Array.from({ length: 309 }, (_, i) => Number(`1e${i}`));

/** Number of decimal digits of a base-1e7 word (1 … 7). */
function wordDigits(w: number): number {
	return w >= 1e4 ? (w >= 1e6 ? 7 : w >= 1e5 ? 6 : 5) : w >= 100 ? (w >= 1e3 ? 4 : 3) : w >= 10 ? 2 : 1;
}

/**
 * A float64 close to x (within a few units in the last place), read from the first four digit
 * words; decimals of up to 14 significant digits convert with a single rounding. For seeds only:
 * the result is not always the correctly rounded value. 0 or ±Infinity outside float64's range.
 */
export function approxNumber(x: Decimal): number {
	const { d: w, e, s } = x as unknown as Words;
	if (!w) return NaN;
	const w0 = w[0];
	if (w0 === 0) return 0;
	const n = w.length;
	let m = n > 1 ? w0 * 1e7 + w[1] : w0;
	// A short first word leaves fewer than 16 digits in two words: the next two complete them.
	if (n > 2) m += n > 3 ? (w[2] + w[3] / 1e7) / 1e7 : w[2] / 1e7;
	// Exponent of the units of the last whole word read.
	const scale = e - wordDigits(w0) + 1 - (n > 1 ? 7 : 0);
	let v: number;
	if (scale >= 0) v = scale > 308 ? Infinity : m * POW10[scale];
	else if (scale >= -308) v = m / POW10[-scale];
	else v = m / POW10[308] / (-scale - 308 > 308 ? Infinity : POW10[-scale - 308]);
	return s < 0 ? -v : v;
}

export function sqrt(a: Decimal): Decimal {
	if (a.isZero()) return a;
	const K = numbersOf(a);
	if (a.isNegative()) return new K.D(NaN);
	const seed = Math.sqrt(approxNumber(a));
	if (!(seed > 0 && seed < Infinity)) return a.sqrt();
	const x = new K.D(seed);
	return x.plus(a.div(x)).times(K.HALF);
}

/** All significant digits of a finite non-zero decimal, as a string. */
function digitString(w: number[]): string {
	let out = String(w[0]);
	for (let i = 1; i < w.length; i++) {
		const s = String(w[i]);
		out += s.length === 7 ? s : '0000000'.slice(s.length) + s;
	}
	return out;
}

/** log₁₀ of a positive decimal, as a decimal with ≥ 15 correct decimal places for |x| in any range. */
export function log10(x: Decimal): Decimal {
	const K = numbersOf(x);
	// x = m·10^e with 1 ≤ m < 10: e exactly from the decimal, m correctly rounded to float64.
	const digits = digitString((x as unknown as Words).d!);
	const m = digits.length === 1 ? Number(digits) : Number(`${digits[0]}.${digits.slice(1)}`);
	const e = new K.D(x.e);
	if (m === 1) return e;
	return e.plus(new K.D(Math.log10(m)));
}

/** cos θ for 0 ≤ θ < π/2. */
export function cosAcute(theta: Decimal): Decimal {
	const K = numbersOf(theta);
	return new K.D(Math.sin(K.HALF_PI.minus(theta).toNumber()));
}

export function asin(x: Decimal): Decimal {
	const K = numbersOf(x);
	return x.abs().lte('0.99') ? new K.D(Math.asin(x.toNumber())) : x.asin();
}
