/**
 * Constants of the hazard engine.
 *
 * Why plain float64 is enough here (the error budget)
 * ---------------------------------------------------
 * The inputs are known to two or three significant figures (a power meter, a beam profiler, a data
 * sheet) and divergences to tens of percent; limit values are published to two or three figures.
 * A float64 carries 15–16 significant digits. Every value the engine reports comes from a chain of
 * at most a few dozen operations (+ − × ÷, √, powers, log₁₀, atan, asin, cos), each correct to
 * within about one unit in the last place (2.2e-16 relative), so a result agrees with exact
 * arithmetic on the same inputs to about 1e-14 relative — twelve orders of magnitude below the
 * uncertainty of the inputs. Two places need care, and get it:
 *  • a difference of nearly equal values (√(D_c² − D₀²) near D_c = D₀) loses relative precision
 *    but not absolute precision: the distance it gives is then itself tiny (≤ 1e-8·D_c/φ);
 *  • decisions at a boundary: a ratio is "at the limit", which counts as exceeding it, from
 *    1 − 1e-9 upwards (RATIO_TOLERANCE), and positions along the path closer than 1e-9 m (relative
 *    to the path's scale) count as the same place, where the worse side decides. So rounding noise
 *    can only ever make a verdict more cautious, never less.
 * Decimal arithmetic stays where exactness is real: reading entered quantities and converting units
 * (src/lib/units.ts), PostgreSQL `numeric`, and rounding for display (src/lib/display.ts).
 */

/** Version of the computation. Bump whenever a formula, a rule or the result shape changes. */
export const ENGINE_VERSION = 'beamwarden-hazard 2.0.0';

// Exact defining constants of the SI (2019 redefinition). Each is exactly representable to the
// precision it is defined with; h·c is formed in float64 (relative error below 1e-16).
/** Planck constant h, J·s (exact). */
export const PLANCK_CONSTANT = 6.62607015e-34;
/** Speed of light in vacuum c, m/s (exact). */
export const SPEED_OF_LIGHT = 299792458;
/** Elementary charge e, C (exact); 1 eV = e × 1 V. */
export const ELEMENTARY_CHARGE = 1.602176634e-19;

/** Emission wavelength range accepted by the engine, m (inclusive). */
export const WAVELENGTH_MIN = 180e-9;
export const WAVELENGTH_MAX = 1e-3;

/** A ratio at least this close below 1 is shown and treated as at the limit, which exceeds it. */
export const RATIO_TOLERANCE = 1e-9;

/**
 * Common practice for the exposure duration of an unintended exposure: the aversion response
 * (0.25 s) inside 400–700 nm, and 10 s outside it, where no blink protects the eye. A shorter
 * duration gives a less restrictive limit, so the engine warns when one is used.
 */
export const VISIBLE_MIN = 400e-9;
export const VISIBLE_MAX = 700e-9;
export const AVERSION_DURATION = 0.25;
export const INVISIBLE_DEFAULT_DURATION = 10;

/** Caution attached to every result. */
export const RESULT_CAUTION =
	'Computed from the entered beam data and the exposure limits entered by the laser safety officer. ' +
	'It does not replace measurement; the LSO and the applicable local code decide.';
