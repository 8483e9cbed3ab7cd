import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { AssessmentDec, Dec } from './constants';
import { approxNumber, compare, decimalFromFloat, parseDecimalText } from './digits';

type Raw = { s: number; e: number; d: number[] };
const raw = (x: unknown) => x as Raw;

/** Decimal texts as the engine accepts them: sign, digits, point, exponent (leading and trailing zeros included). */
const decimalText = fc
	.tuple(fc.constantFrom('', '+', '-'), fc.stringMatching(/^[0-9]{0,30}$/), fc.boolean(), fc.stringMatching(/^[0-9]{0,30}$/), fc.option(fc.tuple(fc.constantFrom('e', 'E'), fc.constantFrom('', '+', '-'), fc.integer({ min: 0, max: 400 }))))
	.map(([sign, a, point, b, exp]) => sign + a + (point ? '.' : '') + b + (exp ? exp[0] + exp[1] + exp[2] : ''))
	.filter((t) => /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/.test(t));

describe('reading decimal.js words directly', () => {
	it('parses decimal text into exactly the words decimal.js builds', () => {
		fc.assert(
			fc.property(decimalText, (text) => {
				for (const D of [AssessmentDec, Dec]) {
					const mine = parseDecimalText(D, text);
					const theirs = new D(text);
					if (mine === null) {
						expect(theirs.isZero()).toBe(true);
						continue;
					}
					expect(mine.constructor).toBe(D);
					expect([raw(mine).s, raw(mine).e, raw(mine).d]).toEqual([raw(theirs).s, raw(theirs).e, raw(theirs).d]);
				}
			}),
			{ numRuns: 2000 }
		);
		for (const t of ['1', '10', '1234567', '12345678', '0.1', '0.0000001', '1e-7', '9.999e15', '-.5', '+00012.50e+3', '1e400', '0.00']) {
			const mine = parseDecimalText(AssessmentDec, t);
			if (mine) expect(mine.eq(new AssessmentDec(t))).toBe(true);
		}
	});

	it('compares as decimal.js does, without copying', () => {
		fc.assert(
			fc.property(decimalText, decimalText, (a, b) => {
				const x = new AssessmentDec(a);
				const y = new Dec(b);
				return compare(x, y) === x.cmp(y) && compare(y, x) === y.cmp(x) && compare(x, x) === 0;
			}),
			{ numRuns: 2000 }
		);
		expect(compare(new Dec(0), new Dec('-0'))).toBe(0);
		expect(compare(new Dec('1e-9'), new Dec(0))).toBe(1);
		expect(compare(new Dec('-1e-9'), new Dec(0))).toBe(-1);
	});

	it('reads a float64 within a few units in the last place (exactly for short decimals)', () => {
		fc.assert(
			fc.property(fc.double({ min: -1e300, max: 1e300, noNaN: true }), (v) => {
				const x = new AssessmentDec(v).times('1.000000000000000000123');
				const exact = x.toNumber();
				return Math.abs(approxNumber(x) - exact) <= Math.abs(exact) * 8e-16;
			}),
			{ numRuns: 2000 }
		);
		for (const t of ['0.25', '1e-6', '123.456', '-7.5e-12', '4.99999999e20']) expect(approxNumber(new AssessmentDec(t))).toBe(Number(t));
	});

	it('builds a well-formed 15-digit decimal from a float64', () => {
		fc.assert(
			fc.property(fc.double({ min: -1e250, max: 1e250, noNaN: true }).filter((v) => Math.abs(v) > 1e-250), (v) => {
				const x = decimalFromFloat(AssessmentDec, v);
				// Well formed: the same words as decimal.js gives for its text.
				const again = new AssessmentDec(x.toString());
				expect([raw(x).s, raw(x).e, raw(x).d]).toEqual([raw(again).s, raw(again).e, raw(again).d]);
				expect(x.sd()).toBeLessThanOrEqual(15);
				expect(Math.abs(x.toNumber() - v)).toBeLessThanOrEqual(Math.abs(v) * 5.1e-15);
			}),
			{ numRuns: 2000 }
		);
		expect(decimalFromFloat(AssessmentDec, 0.001).toString()).toBe('0.001');
		expect(decimalFromFloat(AssessmentDec, 2).toString()).toBe('2');
		expect(decimalFromFloat(AssessmentDec, -1.5e-20).toString()).toBe('-1.5e-20');
	});
});
