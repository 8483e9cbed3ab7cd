import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { AssessmentDec, Dec, OUTPUT_SIGNIFICANT_DIGITS } from './constants';
import Decimal from 'decimal.js';
import { clearText, fmt, NonFiniteResultError, toSignificantString } from './format';

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

	it('writes any number of significant digits as decimal.js does, for both clones', () => {
		const digitText = fc.stringMatching(/^[1-9][0-9]{0,44}$/);
		fc.assert(
			fc.property(digitText, fc.integer({ min: -40, max: 40 }), fc.boolean(), fc.integer({ min: 1, max: 20 }), fc.constantFrom(Dec, AssessmentDec), (digits, exp, negative, sd, D) => {
				// Computed values (rounded to the clone's precision) as well as entered ones.
				const entered = new D(`${negative ? '-' : ''}${digits}e${exp}`);
				const computed = entered.div(7);
				for (const d of [entered, computed]) expect(toSignificantString(d, sd)).toBe(d.toSignificantDigits(sd).toString());
			}),
			{ numRuns: 2000 }
		);
		// Groups of zeros inside and at the end of the digits, and carries at every position.
		for (const t of ['100000000000', '1000000000001', '10203040506070', '99999999999949', '99999999999950', '0.000000123456789012', '120000000000000', '1.5', '25', '0.25', '7.000000000000500001']) {
			const d = new AssessmentDec(t);
			for (let sd = 1; sd <= 14; sd++) expect(toSignificantString(d, sd), `${t} @ ${sd}`).toBe(d.toSignificantDigits(sd).toString());
		}
	});

	it('gives a text only when every value within the stated relative distance writes it', () => {
		const Wide = Decimal.clone({ precision: 60 });
		const rel = 1e-14;
		let certain = 0;
		fc.assert(
			fc.property(fc.stringMatching(/^[1-9][0-9]{14}$/), fc.integer({ min: -30, max: 30 }), fc.integer({ min: -1000, max: 1000 }), (digits, exp, u) => {
				// 15-digit values, half of them placed next to a half-way point of the 12th digit.
				const x = new AssessmentDec(`${digits.slice(0, 12)}${u % 2 ? '50' + digits.slice(14) : digits.slice(12)}e${exp}`);
				const text = clearText(x, rel);
				if (text === null) return;
				certain++;
				expect(text).toBe(toSignificantString(x, 12));
				for (const t of [-1, -0.5, u / 1000, 0.5, 1]) {
					const v = new Wide(x).times(new Wide(1).plus(new Wide(rel).times(t)));
					expect(toSignificantString(v, 12)).toBe(text);
				}
			}),
			{ numRuns: 2000 }
		);
		expect(certain).toBeGreaterThan(900);
		// Next to a half-way point the text is uncertain.
		expect(clearText(new AssessmentDec('1.23456789012500'), rel)).toBeNull();
		expect(clearText(new AssessmentDec('1.23456789012400'), rel)).toBe('1.23456789012');
	});

	it('refuses to write a non-finite value', () => {
		expect(() => fmt(new Dec(Infinity))).toThrow(NonFiniteResultError);
		expect(() => fmt(new Dec(NaN))).toThrow(NonFiniteResultError);
	});
});
