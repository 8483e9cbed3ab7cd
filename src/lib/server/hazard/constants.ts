/**
 * Numeric context and physical constants for the hazard engine.
 *
 * All hazard arithmetic runs on one decimal.js clone (`Dec`, 40 significant digits) so that results
 * do not depend on binary floating point and a saved snapshot recomputes digit for digit.
 * Precision policy (see fastmath.ts): + − × ÷ at 40 digits; square roots ≥ 30 digits; the few
 * transcendental values (log₁₀ for the optical density, cos of a viewing angle, asin of a fibre NA)
 * from float64 on the exact decimal argument, ≥ 14 digits. Results are written with 12.
 */
import Decimal from 'decimal.js';

/** Version of the computation. Bump whenever a formula, a rule or the result shape changes. */
export const ENGINE_VERSION = 'beamwarden-hazard 1.0.0';

/** Significant digits carried by the arithmetic. */
export const WORKING_PRECISION = 40;

/** Significant digits written into results (decimal strings). */
export const OUTPUT_SIGNIFICANT_DIGITS = 12;

export const Dec = Decimal.clone({
	precision: WORKING_PRECISION,
	rounding: Decimal.ROUND_HALF_EVEN,
	toExpNeg: -7,
	toExpPos: 15
});
export type Dec = Decimal;

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
