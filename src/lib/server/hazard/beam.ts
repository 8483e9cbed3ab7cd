/**
 * Beam profiles, diameter definitions and free propagation.
 *
 * Gaussian profile and the three definitions
 * ------------------------------------------
 * For a Gaussian beam the irradiance at radius r is I(r) = I₀·exp(−2r²/w²) (w the 1/e² radius,
 * D(1/e²) = 2w). Written with the 1/e diameter d: I(r) = I₀·exp(−(2r/d)²).
 *   • 1/e point: exp(−2r²/w²) = e⁻¹ ⇒ r = w/√2 ⇒ D(1/e) = D(1/e²)/√2.
 *   • FWHM: exp(−(2r/d)²) = 1/2 ⇒ 2r = d·√(ln 2) ⇒ D(1/e) = FWHM/√(ln 2).
 * The far-field angle scales with the diameter, so the same factors convert a full-angle divergence.
 * Why hazard arithmetic uses 1/e: P = ∫ I₀·exp(−(2r/d)²)·2πr dr = I₀·π·d²/4, so P/(π·d²/4) with
 * the 1/e diameter is the peak irradiance I₀ exactly (common practice).
 *
 * Flat-top profile
 * ----------------
 * Entered by its full width W (and the full angle of that width): the irradiance is even across the
 * beam, P/(π·W²/4), so W itself plays the part of the 1/e diameter. Reading a flat-top's full width
 * as a Gaussian FWHM would spread the power over W/√(ln 2) and give an irradiance ln 2 ≈ 0.69 of the
 * true one (31 % low), which is why the profile is asked for.
 *
 * Hot spots: a measured profile's peak ÷ average (≥ 1) multiplies the irradiance and radiant
 * exposure of the beam (not those of a diffuse reflection, which spreads the whole beam anyway).
 *
 * Propagation: on each stretch the beam is a hyperbola D(z) = √(D_w² + (φ·(z − z_w))²) with D_w
 * the waist diameter, z_w the waist position along the path and φ the full divergence; from the
 * aperture D(r) = √(D₀² + (r·φ)²) (quadrature spread, common practice).
 */
import type { BeamDefinition } from '$lib/enums';

/** A diameter or full-angle divergence given in `definition`, on the 1/e basis. */
export function toOneOverE(value: number, definition: BeamDefinition): number {
	return definition === '1/e' ? value : definition === '1/e2' ? value / Math.SQRT2 : value / Math.sqrt(Math.LN2);
}

/** A 1/e diameter or divergence in `definition`. */
export function fromOneOverE(value: number, definition: BeamDefinition): number {
	return definition === '1/e' ? value : definition === '1/e2' ? value * Math.SQRT2 : value * Math.sqrt(Math.LN2);
}

/** The beam on one stretch of the path. */
export interface BeamState {
	waistDiameter: number;
	waistPosition: number;
	divergence: number;
}

/** D(z) = √(D_w² + (φ·(z − z_w))²). */
export function diameterAt(s: BeamState, z: number): number {
	return Math.hypot(s.waistDiameter, s.divergence * (z - s.waistPosition));
}

/** D(r) = √(D₀² + (r·φ)²) from the aperture. */
export function propagatedDiameter(d0: number, divergence: number, distance: number): number {
	return Math.hypot(d0, divergence * distance);
}
