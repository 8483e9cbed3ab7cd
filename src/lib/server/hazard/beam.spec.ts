import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Dec } from './constants';
import { diameterAt, fromOneOverE, propagatedDiameter, toOneOverE } from './beam';
import type { BeamDefinition } from './types';

const DEFS: BeamDefinition[] = ['1/e', '1/e2', 'fwhm'];
const relErr = (a: Dec, b: Dec) => a.minus(b).abs().div(b.abs());

describe('Gaussian beam definitions', () => {
	it('converts exactly: D(1/e) = D(1/e²)/√2 and D(1/e) = FWHM/√(ln 2)', () => {
		const d = new Dec('2e-3');
		expect(relErr(toOneOverE(d, '1/e2'), d.div(Dec.sqrt(2))).lt('1e-39')).toBe(true);
		expect(relErr(toOneOverE(d, 'fwhm'), d.div(Dec.ln(2).sqrt())).lt('1e-39')).toBe(true);
		expect(toOneOverE(d, '1/e')).toBe(d);
	});

	it('matches the Gaussian profile itself: I(r) = exp(−(2r/D₁ₑ)²) is 1/e² at the 1/e² radius and ½ at the FWHM radius', () => {
		const d1e = new Dec('1e-3');
		const at = (diameter: Dec) => Dec.exp(diameter.div(d1e).pow(2).neg()); // I(r = D/2)/I₀
		expect(at(fromOneOverE(d1e, '1/e2')).minus(Dec.exp(-2)).abs().lt('1e-38')).toBe(true);
		expect(at(fromOneOverE(d1e, 'fwhm')).minus('0.5').abs().lt('1e-38')).toBe(true);
		expect(at(d1e).minus(Dec.exp(-1)).abs().lt('1e-38')).toBe(true);
	});

	it('round-trips 1/e² → 1/e → FWHM → 1/e → 1/e²', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-7, max: 1, noNaN: true }), (x) => {
				const d = new Dec(x);
				const e = toOneOverE(d, '1/e2');
				const fwhm = fromOneOverE(e, 'fwhm');
				const back = fromOneOverE(toOneOverE(fwhm, 'fwhm'), '1/e2');
				return relErr(back, d).lt('1e-38');
			}),
			{ numRuns: 200 }
		);
	});

	it('round-trips every pair of definitions', () => {
		for (const a of DEFS)
			for (const b of DEFS) {
				const d = new Dec('3.3e-3');
				const there = fromOneOverE(toOneOverE(d, a), b);
				const back = fromOneOverE(toOneOverE(there, b), a);
				expect(relErr(back, d).lt('1e-38')).toBe(true);
			}
	});

	it('orders the diameters FWHM < 1/e < 1/e² for the same beam', () => {
		const d = new Dec(1);
		expect(fromOneOverE(d, 'fwhm').lt(d)).toBe(true);
		expect(fromOneOverE(d, '1/e2').gt(d)).toBe(true);
	});
});

describe('propagation D(r) = √(D₀² + (rφ)²)', () => {
	it('gives the textbook values', () => {
		// D₀ = 1 mm, φ = 1 mrad, r = 1 m → √2 mm (hand arithmetic).
		expect(propagatedDiameter(new Dec('1e-3'), new Dec('1e-3'), new Dec(1)).toNumber()).toBeCloseTo(Math.SQRT2 * 1e-3, 15);
		// Far field: D ≈ r·φ.
		expect(relErr(propagatedDiameter(new Dec('1e-3'), new Dec('1e-3'), new Dec(1000)), new Dec(1)).lt('1e-6')).toBe(true);
		// Collimated: constant.
		expect(propagatedDiameter(new Dec('2e-3'), new Dec(0), new Dec(1e6)).toString()).toBe('0.002');
	});

	it('agrees with the hyperbola form of a beam state and grows with distance', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-4, max: 1e-2, noNaN: true }), fc.double({ min: 1e-5, max: 1e-2, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), fc.double({ min: 0.001, max: 10, noNaN: true }), (d0, phi, r, dr) => {
				const s = { waistDiameter: new Dec(d0), waistPosition: new Dec(0), divergence: new Dec(phi) };
				const a = diameterAt(s, new Dec(r));
				const b = propagatedDiameter(new Dec(d0), new Dec(phi), new Dec(r));
				return relErr(a, b).lt('1e-30') && diameterAt(s, new Dec(r + dr)).gt(a);
			}),
			{ numRuns: 200 }
		);
	});
});
