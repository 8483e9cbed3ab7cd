/**
 * Beam diameter and divergence definitions, and free propagation.
 *
 * Gaussian profile and the three definitions
 * ------------------------------------------
 * For a Gaussian beam the irradiance at radius r is
 *     I(r) = I₀ · exp(−2r²/w²)          (w = 1/e² radius, D(1/e²) = 2w).
 * Writing it with the 1/e diameter d:   I(r) = I₀ · exp(−(2r/d)²).
 *   • 1/e  point: exp(−2r²/w²) = e⁻¹  ⇒ r = w/√2      ⇒ D(1/e) = D(1/e²)/√2.
 *   • FWHM:       exp(−(2r/d)²) = 1/2 ⇒ 2r = d·√(ln 2) ⇒ FWHM = D(1/e)·√(ln 2),
 *                                                        so D(1/e) = FWHM/√(ln 2).
 * The far-field angle of a Gaussian beam scales with the diameter, so the same factors convert a
 * full-angle divergence between definitions.
 *
 * Why hazard arithmetic uses 1/e: the power of the beam is
 *     P = ∫ I₀·exp(−(2r/d)²)·2πr dr = I₀·π·d²/4,
 * so P/(π·d²/4) with the 1/e diameter equals the peak irradiance I₀ exactly — the on-axis value,
 * which is what a limiting aperture small against the beam would see (common practice).
 */
import type Decimal from 'decimal.js';
import { numbersOf } from './constants';
import { compare } from './digits';
import { sqrt } from './fastmath';
import type { BeamDefinition } from './types';

/** Converts a diameter or full-angle divergence given in `definition` to the 1/e basis. */
export function toOneOverE(value: Decimal, definition: BeamDefinition): Decimal {
	switch (definition) {
		case '1/e':
			return value;
		case '1/e2':
			return value.times(numbersOf(value).INV_SQRT2);
		case 'fwhm':
			return value.times(numbersOf(value).INV_SQRT_LN2);
	}
}

/** Converts a 1/e diameter or divergence to `definition`. */
export function fromOneOverE(value: Decimal, definition: BeamDefinition): Decimal {
	switch (definition) {
		case '1/e':
			return value;
		case '1/e2':
			return value.times(numbersOf(value).SQRT2);
		case 'fwhm':
			return value.times(numbersOf(value).SQRT_LN2);
	}
}

/**
 * The beam on one stretch of the path, as a hyperbola in the 1/e basis:
 *     D(z) = √(D_w² + (φ·(z − z_w))²)
 * with D_w the waist diameter, z_w the waist position along the path (it may lie behind or ahead
 * of the stretch) and φ the full far-field divergence. At the aperture D_w = D₀ and z_w = 0, which
 * gives the usual D(r) = √(D₀² + (r·φ)²).
 */
export interface BeamState {
	waistDiameter: Decimal;
	waistPosition: Decimal;
	divergence: Decimal;
	/** D_w², when already known (the path walk stores it once per stretch). */
	waistSquared?: Decimal;
}

/** False where the beam is its waist: no divergence, or at the waist itself. */
export function spreadsAt(state: BeamState, z: Decimal): boolean {
	return !state.divergence.isZero() && compare(z, state.waistPosition) !== 0;
}

/** D(z)² = D_w² + (φ·(z − z_w))². */
export function diameterSquaredAt(state: BeamState, z: Decimal): Decimal {
	const w2 = state.waistSquared ?? state.waistDiameter.times(state.waistDiameter);
	if (!spreadsAt(state, z)) return w2;
	const spread = state.divergence.times(z.minus(state.waistPosition));
	return w2.plus(spread.times(spread));
}

export function diameterAt(state: BeamState, z: Decimal): Decimal {
	return diameterFromSquare(state, z, diameterSquaredAt(state, z));
}

/** D(z) from D(z)²: the waist diameter itself where the beam has not spread, else the square root. */
export function diameterFromSquare(state: BeamState, z: Decimal, d2: Decimal): Decimal {
	return spreadsAt(state, z) ? sqrt(d2) : state.waistDiameter;
}

/** D(r) = √(D₀² + (r·φ)²). */
export function propagatedDiameter(d0: Decimal, divergence: Decimal, distance: Decimal): Decimal {
	const spread = divergence.times(distance);
	return sqrt(d0.times(d0).plus(spread.times(spread)));
}
