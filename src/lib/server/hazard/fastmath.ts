/**
 * Elementary functions on decimals, fast enough for a campus register.
 *
 * decimal.js evaluates sqrt, ln, cos and asin to the full working precision by series, which costs
 * tens to hundreds of microseconds each. Here:
 *  • sqrt: a float64 seed (15–16 correct digits) refined by Newton steps x ← (x + a/x)/2, each of
 *    which doubles the correct digits: two steps reach the 40-digit working precision. Exact
 *    squares come out exact.
 *  • log₁₀ (optical density only): the decimal exponent is taken exactly from the decimal and only
 *    the mantissa m ∈ [1, 10) goes through float64: log₁₀(x) = e + log₁₀(m), absolute error
 *    below 1e-15 (reported with 12 significant digits); exact powers of ten give exact integers.
 *  • cos θ for 0 ≤ θ < π/2 (diffuse viewing): cos θ = sin(π/2 − θ) with π/2 − θ formed in decimal,
 *    so the relative error stays near 1e-16 even close to grazing angles.
 *  • asin (fibre NA): float64 up to 0.99, decimal.js beyond, where float64 loses digits.
 */
import type Decimal from 'decimal.js';
import { Dec, HALF_PI } from './constants';

const HALF = new Dec('0.5');

export function sqrt(a: Decimal): Decimal {
	if (a.isZero()) return a;
	if (a.isNegative()) return new Dec(NaN);
	const seed = Math.sqrt(a.toNumber());
	if (!Number.isFinite(seed) || seed === 0) return a.sqrt();
	let x = new Dec(seed);
	x = x.plus(a.div(x)).times(HALF);
	x = x.plus(a.div(x)).times(HALF);
	return x;
}

/** log₁₀ of a positive decimal, as a decimal with ≥ 15 correct decimal places for |x| in any range. */
export function log10(x: Decimal): Decimal {
	// x = m·10^e with 1 ≤ m < 10; decimal.js keeps e exactly.
	const e = x.e;
	const m = x.div(new Dec(10).pow(e)).toNumber();
	return new Dec(e).plus(new Dec(Math.log10(m)));
}

/** cos θ for 0 ≤ θ < π/2. */
export function cosAcute(theta: Decimal): Decimal {
	return new Dec(Math.sin(HALF_PI.minus(theta).toNumber()));
}

export function asin(x: Decimal): Decimal {
	return x.abs().lte('0.99') ? new Dec(Math.asin(x.toNumber())) : x.asin();
}
