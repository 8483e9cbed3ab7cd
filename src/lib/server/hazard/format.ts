/**
 * Writing decimals into results: decimal strings with 12 significant digits. Anything that is not
 * finite is an engine fault, never a result.
 */
import type Decimal from 'decimal.js';
import { Dec, OUTPUT_SIGNIFICANT_DIGITS } from './constants';

export class NonFiniteResultError extends Error {
	constructor(what: string) {
		super(`a non-finite value arose in ${what}`);
		this.name = 'NonFiniteResultError';
	}
}

// The same decimal is often written several times within a few lines (a step's value is the next
// step's input). A small ring of the last written instances, compared by identity, catches those
// repeats; a WeakMap costs more on a miss than the formatting it saves.
const RING = 32;
const ringKeys: (Decimal | null)[] = new Array(RING).fill(null);
const ringValues: string[] = new Array(RING).fill('');
let ringNext = 0;

export function fmt(d: Decimal, what = 'the computation'): string {
	for (let i = 0; i < RING; i++) if (ringKeys[i] === d) return ringValues[i];
	if (!d.isFinite()) throw new NonFiniteResultError(what);
	const s = toSignificantString(d, OUTPUT_SIGNIFICANT_DIGITS);
	ringKeys[ringNext] = d;
	ringValues[ringNext] = s;
	ringNext = (ringNext + 1) % RING;
	return s;
}

export function fmtOrNull(d: Decimal | null | undefined, what?: string): string | null {
	return d === null || d === undefined ? null : fmt(d, what);
}

/**
 * Same text as d.toSignificantDigits(sd).toString() under the engine's settings (round half to even,
 * exponent notation below 1e-7 and from 1e15), written straight from decimal.js's digit words
 * without building an intermediate decimal. Checked against decimal.js by a property test.
 */
export function toSignificantString(d: Decimal, sd: number): string {
	const words = (d as unknown as { d: number[] }).d;
	if (words[0] === 0) return '0';
	// Read only as many 7-digit words as rounding needs; the rest only matters for a tie.
	let digits = String(words[0]);
	let w = 1;
	while (digits.length <= sd && w < words.length) digits += ('000000' + words[w++]).slice(-7);
	let e = d.e;
	if (digits.length > sd) {
		const next = digits.charCodeAt(sd) - 48;
		let up = next > 5;
		if (next === 5) {
			let restNonZero = /[1-9]/.test(digits.slice(sd + 1));
			for (let j = w; !restNonZero && j < words.length; j++) restNonZero = words[j] !== 0;
			up = restNonZero || (digits.charCodeAt(sd - 1) - 48) % 2 === 1;
		}
		digits = digits.slice(0, sd);
		if (up) {
			let i = sd - 1;
			while (i >= 0 && digits[i] === '9') i--;
			if (i < 0) {
				digits = '1';
				e += 1;
			} else digits = digits.slice(0, i) + String.fromCharCode(digits.charCodeAt(i) + 1);
		}
	}
	let end = digits.length;
	while (end > 1 && digits.charCodeAt(end - 1) === 48) end--;
	digits = digits.slice(0, end);
	let out: string;
	if (e <= Dec.toExpNeg || e >= Dec.toExpPos) {
		out = (digits.length > 1 ? `${digits[0]}.${digits.slice(1)}` : digits) + (e < 0 ? 'e' : 'e+') + e;
	} else if (e < 0) {
		out = `0.${'0'.repeat(-e - 1)}${digits}`;
	} else if (e + 1 >= digits.length) {
		out = digits + '0'.repeat(e + 1 - digits.length);
	} else {
		out = `${digits.slice(0, e + 1)}.${digits.slice(e + 1)}`;
	}
	return d.isNegative() ? `-${out}` : out;
}
