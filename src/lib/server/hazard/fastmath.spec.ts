import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { AssessmentDec, Dec, HALF_PI } from './constants';
import { asin, compareClear, cosAcute, log10, roughSqrt, ROUGH_SQRT_ERROR, sqrt } from './fastmath';

describe('fast elementary functions', () => {
	it('sqrt has at least 30 correct significant digits', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-30, max: 1e30, noNaN: true }), fc.integer({ min: 1, max: 999 }), (x, tail) => {
				const a = new Dec(x).times(`1.${tail}`);
				return sqrt(a).minus(a.sqrt()).abs().div(a.sqrt()).lt('1e-30');
			}),
			{ numRuns: 200 }
		);
		expect(sqrt(new Dec(4)).toString()).toBe('2');
		expect(sqrt(new Dec('1e-6')).toString()).toBe('0.001');
		expect(sqrt(new Dec(0)).toString()).toBe('0');
	});

	it('sqrt in the 25-digit assessment clone is within half a unit of the 25th digit (plus ~1e-29)', () => {
		const Wide = Decimal.clone({ precision: 60 });
		fc.assert(
			fc.property(fc.double({ min: 1e-30, max: 1e30, noNaN: true }), fc.integer({ min: 1, max: 999 }), (x, tail) => {
				const a = new AssessmentDec(x).times(`1.${tail}`).div(7);
				const r = sqrt(a);
				expect(r.constructor).toBe(AssessmentDec);
				const exact = new Wide(a).sqrt();
				// Half a unit in the 25th significant digit of r, relative to r, is at least 5e-26.
				const halfUlp = new Wide(10).pow(r.e - 24).div(2);
				return new Wide(r).minus(exact).abs().lte(halfUlp.plus(exact.times('1e-29')));
			}),
			{ numRuns: 500 }
		);
		for (const [x, root] of [['4', '2'], ['1e-6', '0.001'], ['2.25', '1.5'], ['0.000025', '0.005'], ['6.25e10', '250000']]) expect(sqrt(new AssessmentDec(x)).toString()).toBe(root);
	});

	it('roughSqrt is within its stated error; compareClear decides only when the error cannot change the order', () => {
		const Wide = Decimal.clone({ precision: 60 });
		fc.assert(
			fc.property(fc.double({ min: 1e-30, max: 1e30, noNaN: true }), fc.integer({ min: 1, max: 999 }), fc.double({ min: 0.98, max: 1.02, noNaN: true }), (x, tail, near) => {
				const a = new AssessmentDec(x).times(`1.${tail}`).div(7);
				const r = roughSqrt(a)!;
				const exact = new Wide(a).sqrt();
				expect(new Wide(r).minus(exact).abs().div(exact).lt(ROUGH_SQRT_ERROR)).toBe(true);
				// A limit close to the root: a decided comparison holds for the exact root.
				const b = new AssessmentDec(new Wide(r).times(near).toSignificantDigits(3).toString());
				const side = compareClear(r, b, ROUGH_SQRT_ERROR);
				if (side !== 0) expect(side).toBe(exact.cmp(b));
			}),
			{ numRuns: 1000 }
		);
		expect(compareClear(new AssessmentDec('0.007'), new AssessmentDec('0.007'), ROUGH_SQRT_ERROR)).toBe(0);
		expect(compareClear(new AssessmentDec('0.0070000000001'), new AssessmentDec('0.007'), ROUGH_SQRT_ERROR)).toBe(1);
		// The reference clone forms every root exactly.
		expect(roughSqrt(new Dec(2))).toBeNull();
	});

	it('log10 is within 1e-14 and exact on powers of ten', () => {
		fc.assert(
			fc.property(fc.double({ min: 1, max: 1e100, noNaN: true }), (x) => {
				const a = new Dec(x);
				return log10(a).minus(Dec.log10(a)).abs().lt('1e-14');
			}),
			{ numRuns: 200 }
		);
		for (const k of [0, 1, 5, 17, 40]) expect(log10(new Dec(10).pow(k)).toString()).toBe(String(k));
	});

	it('cos keeps its relative accuracy up to grazing angles', () => {
		fc.assert(
			fc.property(fc.double({ min: 0, max: 1.5707, noNaN: true }), (x) => {
				const t = new Dec(x);
				const exact = t.cos();
				return cosAcute(t).minus(exact).abs().div(exact).lt('1e-14');
			}),
			{ numRuns: 200 }
		);
		const nearGrazing = HALF_PI.minus('1e-9');
		expect(cosAcute(nearGrazing).minus(nearGrazing.cos()).abs().div(nearGrazing.cos()).lt('1e-14')).toBe(true);
	});

	it('asin is within 1e-14 over the whole range of numerical apertures', () => {
		for (const na of ['0.1', '0.22', '0.5', '0.99', '0.995', '0.9999', '1']) {
			const x = new Dec(na);
			expect(asin(x).minus(x.asin()).abs().div(x.asin()).lt('1e-14')).toBe(true);
		}
	});
});
