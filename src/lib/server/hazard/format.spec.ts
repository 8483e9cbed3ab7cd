import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Dec, OUTPUT_SIGNIFICANT_DIGITS } from './constants';
import { fmt, NonFiniteResultError, toSignificantString } from './format';

describe('writing decimals', () => {
	it('writes exactly what decimal.js writes for toSignificantDigits(12).toString()', () => {
		const digitText = fc.stringMatching(/^[1-9][0-9]{0,44}$/);
		fc.assert(
			fc.property(digitText, fc.integer({ min: -40, max: 40 }), fc.boolean(), (digits, exp, negative) => {
				const d = new Dec(`${negative ? '-' : ''}${digits}e${exp}`);
				return toSignificantString(d, OUTPUT_SIGNIFICANT_DIGITS) === d.toSignificantDigits(OUTPUT_SIGNIFICANT_DIGITS).toString();
			}),
			{ numRuns: 200 }
		);
		// Ties and carries: half to even, carry into a new digit and across the exponent thresholds.
		for (const t of ['1.000000000005', '1.000000000015', '1.0000000000050001', '9.9999999999995', '999999999999.5', '9.9999999999999e14', '9.99999999999951e-8', '-2.5e-7', '1e15', '123456789012345', '0.1', '0']) {
			const d = new Dec(t);
			expect(toSignificantString(d, 12), t).toBe(d.toSignificantDigits(12).toString());
		}
	});

	it('refuses to write a non-finite value', () => {
		expect(() => fmt(new Dec(Infinity))).toThrow(NonFiniteResultError);
		expect(() => fmt(new Dec(NaN))).toThrow(NonFiniteResultError);
	});
});
