/**
 * Numeric context and physical constants for the hazard engine.
 *
 * All hazard arithmetic runs on decimal.js clones, so that results do not depend on binary floating
 * point and a saved snapshot recomputes digit for digit. Two clones share one set of settings
 * (round half to even, exponent notation below 1e-7 and from 1e15):
 *
 *  • `AssessmentDec`, ASSESSMENT_PRECISION = 25 significant digits: what assess() works in.
 *  • `Dec`, WORKING_PRECISION = 40 significant digits: the reference clone. validate() and the
 *    helper functions use it when called directly, and the engine can be run in it end to end
 *    (assessAtPrecision in assess.ts) to check the 25-digit results against a 40-digit run.
 *
 * Every function works in the clone of the decimals it is given: constants come from `numbersOf(x)`,
 * which returns them rounded to that clone's precision, so a 25-digit assessment never widens an
 * operation to 40 digits and a 40-digit one never narrows it.
 *
 * Why 25 digits (error budget). Results are written with 12 significant digits. The longest chain
 * behind a written value (1/e conversion, path walk, D² and its reciprocal, transmission, exposure,
 * limit and ratio, square roots of hazard distances) takes at most a few dozen correctly rounded
 * steps, each within half a unit of the 25th digit, so the value is within ~1e-22 relative of the
 * 40-digit one; a written 12th digit can only differ if the value lies that close to a rounding
 * boundary, ~1e-10 of the written numbers (boundaries are 1e-12 to 1e-11 apart, relative). Sums and
 * products of the short decimals that are entered (lengths, transmissions, powers) stay exact, so
 * exact ties round as in a 40-digit run, and choices between alternatives that are written alike
 * (two sides of a neutral element, equally restrictive limits) keep the first, so noise below the
 * written digits never decides.
 * Measured (scripts/bench-hazard.ts register, whole results with breakdown against the 40-digit
 * run): 3000 paths, 1 182 238 written numbers — 7090 differ at 14 digits, 54 at 16, 3 at 18, none
 * at 20, 22 or 25; 10 000 paths, 3 931 263 written numbers — none at 20 or 25. The rate falls tens
 * of times per two digits, so 20 digits would still change a written number now and then (~1e-7 of
 * them expected, a few per register), while 25 costs only ~8 % more time than 20 (decimal.js holds 7
 * digits per word: 4–5 words, against 3–4 at 20 and 6–7 at 40; the fixed cost of an operation
 * dominates). precision.spec.ts checks that whole results are identical
 * at 25 and 40 digits over many random assessments.
 * Square roots: ≥ 29 digits or the clone's precision, whichever is lower; log₁₀ (optical density),
 * cos of a viewing angle and asin of a fibre NA: float64 on the exact decimal argument, ≥ 14 digits
 * (see fastmath.ts).
 */
import Decimal from 'decimal.js';

/** Version of the computation. Bump whenever a formula, a rule or the result shape changes. */
export const ENGINE_VERSION = 'beamwarden-hazard 1.0.0';

/** Significant digits of `Dec`, the reference clone. */
export const WORKING_PRECISION = 40;

/** Significant digits carried by assess() (see the error budget above). */
export const ASSESSMENT_PRECISION = 25;

/** Significant digits written into results (decimal strings). */
export const OUTPUT_SIGNIFICANT_DIGITS = 12;

const SETTINGS = { rounding: Decimal.ROUND_HALF_EVEN, toExpNeg: -7, toExpPos: 15 } as const;

export const Dec = Decimal.clone({ precision: WORKING_PRECISION, ...SETTINGS });
export type Dec = Decimal;

/** The clone assess() works in. */
export const AssessmentDec = Decimal.clone({ precision: ASSESSMENT_PRECISION, ...SETTINGS });

// Exact defining constants of the SI (2019 redefinition).
/** Planck constant h, J·s (exact). */
export const PLANCK_CONSTANT = new Dec('6.62607015e-34');
/** Speed of light in vacuum c, m/s (exact). */
export const SPEED_OF_LIGHT = new Dec('299792458');
/** Elementary charge e, C (exact); 1 eV = e × 1 V. */
export const ELEMENTARY_CHARGE = new Dec('1.602176634e-19');
/** h·c, J·m (exact product of two exact constants). */
export const PLANCK_TIMES_C = PLANCK_CONSTANT.times(SPEED_OF_LIGHT);

export const ZERO = new Dec(0);
export const ONE = new Dec(1);
export const TWO = new Dec(2);
export const FOUR = new Dec(4);
export const TEN = new Dec(10);
export const PI = Dec.acos(-1);
/** π/4, the factor between a diameter squared and the area of its circle. */
export const PI_OVER_4 = PI.div(4);
export const HALF_PI = PI.div(2);
export const SQRT2 = TWO.sqrt();
export const LN2 = Dec.ln(2);
export const SQRT_LN2 = LN2.sqrt();
/** Reciprocals, so that conversions by constants are multiplications (decimal division is slow). */
export const INV_SQRT2 = ONE.div(SQRT2);
export const INV_SQRT_LN2 = ONE.div(SQRT_LN2);
export const INV_ELEMENTARY_CHARGE = ONE.div(ELEMENTARY_CHARGE);

/** Emission wavelength range accepted by the engine, m (inclusive). */
export const WAVELENGTH_MIN = new Dec('180e-9');
export const WAVELENGTH_MAX = new Dec('1e-3');

/** Caution attached to every result. */
export const RESULT_CAUTION =
	'Computed from the entered beam data and the exposure limits entered by the laser safety officer. ' +
	'It does not replace measurement; the LSO and the applicable local code decide.';

export type DecimalClone = typeof Dec;

/**
 * The constants of one clone, each rounded to its precision. Exact values (0, 1, h·c, …) are exact
 * in every clone; the irrational ones come from the 40-digit values (π, √2 and ln 2 to 40 digits
 * are correctly rounded by decimal.js) or, for clones wider than 40 digits, are computed afresh.
 */
export interface Numbers {
	readonly D: DecimalClone;
	readonly precision: number;
	readonly ZERO: Decimal;
	readonly ONE: Decimal;
	readonly TWO: Decimal;
	readonly THREE: Decimal;
	readonly FOUR: Decimal;
	readonly TEN: Decimal;
	readonly HALF: Decimal;
	readonly ONE_TENTH: Decimal;
	readonly PI: Decimal;
	readonly INV_PI: Decimal;
	readonly PI_OVER_4: Decimal;
	readonly FOUR_OVER_PI: Decimal;
	readonly HALF_PI: Decimal;
	readonly SQRT2: Decimal;
	readonly SQRT_LN2: Decimal;
	readonly INV_SQRT2: Decimal;
	readonly INV_SQRT_LN2: Decimal;
	readonly PLANCK_TIMES_C: Decimal;
	readonly INV_ELEMENTARY_CHARGE: Decimal;
}

function buildNumbers(D: DecimalClone): Numbers {
	const p = D.precision;
	// Irrational constants: from a clone with 10 guard digits, then rounded once to p digits.
	const W = p + 10 <= WORKING_PRECISION ? Dec : Decimal.clone({ precision: p + 10, ...SETTINGS });
	const round = (x: Decimal) => new D(x).toSignificantDigits(p);
	const pi = W.acos(-1);
	const sqrt2 = new W(2).sqrt();
	const sqrtLn2 = W.ln(2).sqrt();
	return {
		D,
		precision: p,
		ZERO: new D(0),
		ONE: new D(1),
		TWO: new D(2),
		THREE: new D(3),
		FOUR: new D(4),
		TEN: new D(10),
		HALF: new D('0.5'),
		ONE_TENTH: new D('0.1'),
		PI: round(pi),
		INV_PI: round(new W(1).div(pi)),
		PI_OVER_4: round(pi.div(4)),
		FOUR_OVER_PI: round(new W(4).div(pi)),
		HALF_PI: round(pi.div(2)),
		SQRT2: round(sqrt2),
		SQRT_LN2: round(sqrtLn2),
		INV_SQRT2: round(new W(1).div(sqrt2)),
		INV_SQRT_LN2: round(new W(1).div(sqrtLn2)),
		PLANCK_TIMES_C: new D(PLANCK_TIMES_C),
		INV_ELEMENTARY_CHARGE: round(new W(1).div(ELEMENTARY_CHARGE))
	};
}

const byClone = new Map<DecimalClone, Numbers>();
export function numbersFor(D: DecimalClone): Numbers {
	let n = byClone.get(D);
	if (!n) {
		n = buildNumbers(D);
		byClone.set(D, n);
	}
	return n;
}

/** Constants of the 25-digit assessment clone. */
export const FAST: Numbers = numbersFor(AssessmentDec);
/** Constants of the 40-digit reference clone. */
export const REFERENCE: Numbers = numbersFor(Dec);

/** The constants matching the clone of `x`. */
export function numbersOf(x: Decimal): Numbers {
	const D = (x as unknown as { constructor: DecimalClone }).constructor;
	return D === AssessmentDec ? FAST : D === Dec ? REFERENCE : numbersFor(D);
}
