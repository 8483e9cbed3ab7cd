import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { requiredOpticalDensity } from './density';

describe('optical density rounding', () => {
	it('always rounds up: ⌈10·OD⌉/10 and ⌈OD⌉, never below the OD itself (less settling noise of 1e-9)', () => {
		fc.assert(
			fc.property(fc.double({ min: 1, max: 1e40, noNaN: true }), (x) => {
				const od = requiredOpticalDensity(x);
				return od.roundedUpTenth >= od.value - 1e-9 && od.roundedUpWhole >= od.value - 1e-9 && od.roundedUpTenth - od.value < 0.1 + 1e-9 && od.roundedUpWhole - od.value < 1 + 1e-9;
			}),
			{ numRuns: 1000 }
		);
	});

	it('keeps exact tenths and whole numbers, and adds a step for anything above them', () => {
		// OD = log₁₀(ratio): 10 → 1, 1000 → 3, 10^3.1 → 3.1; 1000.001 needs OD 4 (whole) and 3.1 (tenth).
		for (const [ratio, tenth, whole] of [[10, 1, 1], [1e3, 3, 3], [10 ** 3.1, 3.1, 4], [1000.001, 3.1, 4], [3.16227766016838, 0.5, 1]]) {
			const od = requiredOpticalDensity(ratio);
			expect([od.roundedUpTenth, od.roundedUpWhole]).toEqual([tenth, whole]);
		}
		expect(requiredOpticalDensity(1)).toEqual({ value: 0, roundedUpTenth: 0, roundedUpWhole: 0 });
		expect(requiredOpticalDensity(0.5)).toEqual({ value: 0, roundedUpTenth: 0, roundedUpWhole: 0 });
	});
});
