import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { diameterAt, fromOneOverE, propagatedDiameter, toOneOverE } from './beam';
import type { BeamDefinition } from '$lib/enums';

const DEFS: BeamDefinition[] = ['1/e', '1/e2', 'fwhm'];
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('Gaussian beam definitions', () => {
	it('converts: D(1/e) = D(1/e²)/√2 and D(1/e) = FWHM/√(ln 2)', () => {
		expect(rel(toOneOverE(2e-3, '1/e2'), 2e-3 / Math.SQRT2)).toBeLessThan(1e-16);
		expect(rel(toOneOverE(2e-3, 'fwhm'), 2e-3 / Math.sqrt(Math.LN2))).toBeLessThan(1e-16);
		expect(toOneOverE(2e-3, '1/e')).toBe(2e-3);
	});

	it('matches the Gaussian profile itself: I(r) = exp(−(2r/D₁ₑ)²) is 1/e² at the 1/e² radius and ½ at the FWHM radius', () => {
		// Textbook Gaussian beam (from memory): I(r) = I₀·exp(−2r²/w²).
		const d1e = 1e-3;
		const at = (diameter: number) => Math.exp(-((diameter / d1e) ** 2));
		expect(at(fromOneOverE(d1e, '1/e2'))).toBeCloseTo(Math.exp(-2), 15);
		expect(at(fromOneOverE(d1e, 'fwhm'))).toBeCloseTo(0.5, 15);
		expect(at(d1e)).toBeCloseTo(Math.exp(-1), 15);
	});

	it('round-trips every pair of definitions', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-7, max: 1, noNaN: true }), fc.constantFrom(...DEFS), fc.constantFrom(...DEFS), (d, a, b) => rel(fromOneOverE(toOneOverE(fromOneOverE(toOneOverE(d, a), b), b), a), d) < 1e-15),
			{ numRuns: 300 }
		);
	});

	it('orders the diameters FWHM < 1/e < 1/e² for the same beam', () => {
		expect(fromOneOverE(1, 'fwhm')).toBeLessThan(1);
		expect(fromOneOverE(1, '1/e2')).toBeGreaterThan(1);
	});
});

describe('propagation D(r) = √(D₀² + (rφ)²)', () => {
	it('gives the textbook values', () => {
		// D₀ = 1 mm, φ = 1 mrad, r = 1 m → √2 mm (hand arithmetic); far field D ≈ r·φ; collimated: constant.
		expect(propagatedDiameter(1e-3, 1e-3, 1)).toBeCloseTo(Math.SQRT2 * 1e-3, 15);
		expect(rel(propagatedDiameter(1e-3, 1e-3, 1000), 1)).toBeLessThan(1e-6);
		expect(propagatedDiameter(2e-3, 0, 1e6)).toBe(2e-3);
	});

	it('agrees with the hyperbola of a beam state and grows with distance', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-4, max: 1e-2, noNaN: true }), fc.double({ min: 1e-5, max: 1e-2, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), fc.double({ min: 0.001, max: 10, noNaN: true }), (d0, phi, r, dr) => {
				const s = { waistDiameter: d0, waistPosition: 0, divergence: phi };
				return rel(diameterAt(s, r), propagatedDiameter(d0, phi, r)) < 1e-15 && diameterAt(s, r + dr) > diameterAt(s, r);
			}),
			{ numRuns: 200 }
		);
	});
});
