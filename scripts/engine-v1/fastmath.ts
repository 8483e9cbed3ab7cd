/**
 * Elementary functions on decimals, fast enough for a campus register. Each works in the clone of
 * its argument (see constants.ts).
 *
 * decimal.js evaluates sqrt, ln, cos and asin to the full working precision by series, which costs
 * tens to hundreds of microseconds each. Here:
 *  • sqrt: a float64 seed refined by one correction from the exact decimal residual a − s² (see
 *    sqrt below): ≥ 29 significant digits (≥ 30 in clones of 30 digits or more) or the clone's
 *    precision, whichever is lower — far beyond the 12 reported. Exact squares of short decimals
 *    come out exact. roughSqrt: the 15-digit float root alone, for a value that is only written
 *    and compared (the beam diameter at a point), where its written digits and comparisons are
 *    certain; the caller forms the full root otherwise.
 *  • log₁₀ (optical density only): the decimal exponent is taken exactly from the decimal and only
 *    the mantissa m ∈ [1, 10) goes through float64 (correctly rounded from all its digits):
 *    log₁₀(x) = e + log₁₀(m), absolute error below 1e-15 (reported with 12 significant digits);
 *    exact powers of ten give exact integers.
 *  • cos θ for 0 ≤ θ < π/2 (diffuse viewing): cos θ = sin(π/2 − θ) with π/2 − θ formed in decimal,
 *    so the relative error stays near 1e-16 even close to grazing angles.
 *  • asin (fibre NA): float64 up to 0.99, decimal.js beyond, where float64 loses digits.
 */
import type Decimal from 'decimal.js';
import { Dec, numbersOf } from './constants';
import { approxNumber, decimalFromFloat, parseDecimalText } from './digits';

type Words = { d: number[] | null; e: number; s: number };

/**
 * √a without decimal division. The float64 root, as a decimal s (relative error ε), is corrected
 * once with the exact decimal residual r = a − s²:
 *     √a = s·√(1 + r/s²) = s + r/(2s) − r²/(8s³) + O(ε³·s),
 * the correction c = r/(2s) − c²/(2s) being ~ε·s, so forming it in float64 (relative error ~1e-15)
 * costs only ~1e-15·ε of the root. Clones under 30 digits (assess()): s has 15 digits built
 * directly from the float (ε < 5e-15), s² (30 digits) is formed exactly in `Dec`; the root is good
 * to ~1e-29 relative before the final rounding. Wider clones: s is the float's shortest decimal
 * (up to 17 digits, ε ~ 3e-16) and the conversions are exact ones, for ~1e-31. The residual is
 * short (a and s² agree in their first ~15 digits), so it is exact in either clone. Exact squares
 * of short decimals (s exact, residual 0) come out exact.
 */
export function sqrt(a: Decimal): Decimal {
	if (a.isZero()) return a;
	const K = numbersOf(a);
	if (a.isNegative()) return new K.D(NaN);
	const seed = Math.sqrt(approxNumber(a));
	// Beyond float64's comfortable range: decimal.js's own square root.
	if (!(seed > 1e-150 && seed < 1e150)) return a.sqrt();
	const wide = K.precision >= 30;
	const s = wide ? new K.D(seed) : decimalFromFloat(K.D, seed);
	const forSquare = wide ? s : decimalFromFloat(Dec, seed);
	const residual = a.minus(forSquare.times(forSquare));
	if (residual.isZero()) return s;
	const twoS = 2 * approxNumber(s);
	const first = (wide ? residual.toNumber() : approxNumber(residual)) / twoS;
	const correction = first - (first * first) / twoS;
	return s.plus(wide ? new K.D(correction) : decimalFromFloat(K.D, correction));
}

/** Relative error bound of roughSqrt (≤ 5.6e-15: the float64 root, then 15 digits), with margin. */
export const ROUGH_SQRT_ERROR = 1e-14;

/**
 * √a to 15 significant digits (relative error below ROUGH_SQRT_ERROR), for a value that is only
 * written and compared, never computed with: the caller checks that its written digits and its
 * comparisons are the same for every value within the error (clearText, compareClear) and forms
 * the exact root otherwise. null in clones of 30 digits or more (a reference run forms every root
 * exactly) and outside float64's comfortable range.
 */
export function roughSqrt(a: Decimal): Decimal | null {
	const K = numbersOf(a);
	if (K.precision >= 30 || !a.isPositive() || a.isZero()) return null;
	const seed = Math.sqrt(approxNumber(a));
	return seed > 1e-150 && seed < 1e150 ? decimalFromFloat(K.D, seed) : null;
}

/**
 * Sign of a − b when it holds for every value within a relative distance `rel` of a (b exact);
 * 0 when that is not certain.
 */
export function compareClear(a: Decimal, b: Decimal, rel: number): number {
	const x = approxNumber(a);
	const y = approxNumber(b);
	// approxNumber itself is within ~1e-15 of each value.
	const margin = (rel + 4e-15) * Math.abs(x) + 4e-15 * Math.abs(y);
	return x - y > margin ? 1 : y - x > margin ? -1 : 0;
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
	if (m === 1) return new K.D(x.e);
	const lg = Math.log10(m);
	// e + log₁₀(m) exactly: for e ≥ 0 and 0 < lg < 1 that is e followed by the decimals of lg's own text.
	const text = String(lg);
	if (x.e >= 0 && text.startsWith('0.') && !text.includes('e')) return parseDecimalText(K.D, `${x.e}${text.slice(1)}`) ?? new K.D(x.e).plus(text);
	return new K.D(x.e).plus(new K.D(lg));
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
