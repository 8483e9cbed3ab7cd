import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { AssessmentDec, Dec } from './constants';
import { requiredOpticalDensity } from './density';

describe('optical density rounding', () => {
	it('rounds up to a tenth as ⌈10·OD⌉/10 and to a whole number as ⌈OD⌉, after settling to 12 decimal places', () => {
		fc.assert(
			fc.property(fc.double({ min: 1, max: 1e40, noNaN: true }), fc.constantFrom(AssessmentDec, Dec), (x, D) => {
				const od = requiredOpticalDensity(new D(x));
				const settled = od.value.toDecimalPlaces(12, Decimal.ROUND_HALF_EVEN);
				expect(od.roundedUpTenth.eq(settled.times(10).ceil().div(10))).toBe(true);
				expect(od.roundedUpWhole.eq(settled.ceil())).toBe(true);
				expect(od.roundedUpTenth.gte(od.value.toDecimalPlaces(12))).toBe(true);
			}),
			{ numRuns: 500 }
		);
		// Exact tenths and whole numbers stay as they are.
		for (const [ratio, tenth, whole] of [['10', '1', '1'], ['1e3', '3', '3'], ['1000.000001', '3.1', '4'], ['3.16227766016838', '0.5', '1']]) {
			const od = requiredOpticalDensity(new AssessmentDec(ratio));
			expect([od.roundedUpTenth.toString(), od.roundedUpWhole.toString()]).toEqual([tenth, whole]);
		}
	});
});
