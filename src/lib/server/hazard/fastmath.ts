/**
 * Elementary functions on decimals, fast enough for a campus register.
 *
 * decimal.js evaluates sqrt, ln, cos and asin to the full working precision by series, which costs
 * tens to hundreds of microseconds each. Here:
 *  • sqrt: a float64 seed (≈ 16 correct digits) refined by one Newton step x ← (x + a/x)/2, which
 *    doubles the correct digits: ≥ 30 significant digits (relative error < 1e-31), far beyond the
 *    12 reported. Exact squares of short decimals come out exact.
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
	const x = new Dec(seed);
	return x.plus(a.div(x)).times(HALF);
}

/** log₁₀ of a positive decimal, as a decimal with ≥ 15 correct decimal places for |x| in any range. */
export function log10(x: Decimal): Decimal {
	// x = m·10^e with 1 ≤ m < 10, split exactly in decimal text form.
	const [m, e] = x.toExponential(20).split('e');
	return new Dec(Number(e)).plus(new Dec(Math.log10(Number(m))));
}

/** cos θ for 0 ≤ θ < π/2. */
export function cosAcute(theta: Decimal): Decimal {
	return new Dec(Math.sin(HALF_PI.minus(theta).toNumber()));
}

export function asin(x: Decimal): Decimal {
	return x.abs().lte('0.99') ? new Dec(Math.asin(x.toNumber())) : x.asin();
}
