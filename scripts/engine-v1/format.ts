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

// The engine writes each value once and passes the text on wherever the value appears again (see
// StepValue in breakdown.ts). A ring of the last 8 written instances, compared by identity from the
// most recent, catches the remaining repeats; a WeakMap costs more on a miss than it saves.
const RING = 8;
const ringKeys: (Decimal | null)[] = new Array(RING).fill(null);
const ringValues: string[] = new Array(RING).fill('');
let ringNext = 0;

export function fmt(d: Decimal, what = 'the computation'): string {
	for (let i = ringNext - 1; i >= 0; i--) if (ringKeys[i] === d) return ringValues[i];
	for (let i = RING - 1; i >= ringNext; i--) if (ringKeys[i] === d) return ringValues[i];
	if (!d.isFinite()) throw new NonFiniteResultError(what);
	const s = toSignificantString(d, OUTPUT_SIGNIFICANT_DIGITS);
	ringKeys[ringNext] = d;
	ringValues[ringNext] = s;
	ringNext = (ringNext + 1) & (RING - 1);
	return s;
}

export function fmtOrNull(d: Decimal | null | undefined, what?: string): string | null {
	return d === null || d === undefined ? null : fmt(d, what);
}

/** 10^i for i = 0 … 15, exact in float64. */
const POW10 = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];
const ZEROS = '00000000000000000000000000000000000000000000000000';

// Digit groups 0 … 9999 as text: plain ('25'), padded to four ('0025'), and each with its trailing
// zeros removed ('25' → '25', '2500' → '25', '0250' → '025'). Writing an integer from 4-digit
// groups avoids float64 → string conversion, which dominates otherwise (q exceeds 2^31).
const GROUP: string[] = [];
const GROUP4: string[] = [];
const GROUP_TRIM: string[] = [];
const GROUP4_TRIM: string[] = [];
for (let i = 0; i < 10000; i++) {
	const plain = String(i);
	const padded = plain.padStart(4, '0');
	GROUP.push(plain);
	GROUP4.push(padded);
	GROUP_TRIM.push(i === 0 ? '0' : plain.replace(/0+$/, ''));
	GROUP4_TRIM.push(i === 0 ? '' : padded.replace(/0+$/, ''));
}

/** The decimal digits of a positive integer q < 1e14, without trailing zeros. */
function integerDigits(q: number): string {
	// Four groups of four digits (q < 1e14 keeps each quotient exact in float64).
	const a = Math.floor(q / 1e4);
	const g3 = q - a * 1e4;
	const b = Math.floor(a / 1e4);
	const g2 = a - b * 1e4;
	const g0 = Math.floor(b / 1e4);
	const g1 = b - g0 * 1e4;
	if (g0 !== 0) {
		if (g3 !== 0) return GROUP[g0] + GROUP4[g1] + GROUP4[g2] + GROUP4_TRIM[g3];
		if (g2 !== 0) return GROUP[g0] + GROUP4[g1] + GROUP4_TRIM[g2];
		if (g1 !== 0) return GROUP[g0] + GROUP4_TRIM[g1];
		return GROUP_TRIM[g0];
	}
	if (g1 !== 0) {
		if (g3 !== 0) return GROUP[g1] + GROUP4[g2] + GROUP4_TRIM[g3];
		if (g2 !== 0) return GROUP[g1] + GROUP4_TRIM[g2];
		return GROUP_TRIM[g1];
	}
	if (g2 !== 0) return g3 !== 0 ? GROUP[g2] + GROUP4_TRIM[g3] : GROUP_TRIM[g2];
	return GROUP_TRIM[g3];
}

/**
 * Same text as d.toSignificantDigits(sd).toString() under the engine's settings (round half to even,
 * exponent notation below 1e-7 and from 1e15), written straight from decimal.js's digit words
 * (base 1e7) without building an intermediate decimal. Up to 14 digits the leading digits and the
 * rounding remainder are read as integers below 2^53 (exact in float64); beyond, digit strings.
 * Checked against decimal.js by a property test.
 */
export function toSignificantString(d: Decimal, sd: number): string {
	const words = (d as unknown as { d: number[] }).d;
	const w0 = words[0];
	if (w0 === 0) return '0';
	if (sd > 14) return toSignificantStringLong(d, sd);
	const n = words.length;
	// k: number of digits of the first word (1 … 7).
	const k = w0 >= 1e4 ? (w0 >= 1e6 ? 7 : w0 >= 1e5 ? 6 : 5) : w0 >= 100 ? (w0 >= 1e3 ? 4 : 3) : w0 >= 10 ? 2 : 1;
	const w1 = n > 1 ? words[1] : 0;
	let q: number; // the leading sd digits, as an integer
	let r: number; // the digits after them (within the words read), as an integer …
	let p: number; // … out of p (r/p is the fraction of a unit in the last place)
	let rest: number; // index of the first word not read
	if (k + 7 >= sd) {
		const hi = w0 * 1e7 + w1;
		const drop = k + 7 - sd;
		if (drop === 0) {
			q = hi;
			r = n > 2 ? words[2] : 0;
			p = 1e7;
			rest = 3;
		} else {
			p = POW10[drop];
			q = Math.floor(hi / p);
			r = hi - q * p;
			rest = 2;
		}
	} else {
		const ext = sd - k - 7; // 1 … 6 digits taken from the third word
		const w2 = n > 2 ? words[2] : 0;
		p = POW10[7 - ext];
		const head = Math.floor(w2 / p);
		q = (w0 * 1e7 + w1) * POW10[ext] + head;
		r = w2 - head * p;
		rest = 3;
	}
	let e = d.e;
	const twice = 2 * r;
	let up = twice > p;
	if (!up && twice === p) {
		let tail = false;
		for (let j = rest; !tail && j < n; j++) tail = words[j] !== 0;
		up = tail || q % 2 === 1;
	}
	if (up) {
		q += 1;
		if (q === POW10[sd]) {
			q = POW10[sd - 1];
			e += 1;
		}
	}
	return place(integerDigits(q), e, (d as unknown as { s: number }).s < 0);
}

// '0.', '0.0', '0.00', … for values below 1 written without exponent; 'e-7', 'e+15', … otherwise.
const FRACTION_PREFIX = Array.from({ length: 16 }, (_, k) => '0.' + ZEROS.slice(0, k));
const EXPONENT_SUFFIX = new Map<number, string>();
function exponentSuffix(e: number): string {
	let s = EXPONENT_SUFFIX.get(e);
	if (s === undefined) {
		s = (e < 0 ? 'e' : 'e+') + e;
		EXPONENT_SUFFIX.set(e, s);
	}
	return s;
}

/**
 * The written text (12 digits) of every value within a relative distance `rel` of x, when that is
 * one text; else null. Rounding to nearest changes only across a half-way point, so the text is
 * certain unless the digits after the 12th lie within rel·x of one half of the 12th digit's unit.
 */
export function clearText(x: Decimal, rel: number): string | null {
	const words = (x as unknown as { d: number[] }).d;
	const w0 = words[0];
	if (w0 === 0) return '0';
	const n = words.length;
	const sd = OUTPUT_SIGNIFICANT_DIGITS;
	const k = w0 >= 1e4 ? (w0 >= 1e6 ? 7 : w0 >= 1e5 ? 6 : 5) : w0 >= 100 ? (w0 >= 1e3 ? 4 : 3) : w0 >= 10 ? 2 : 1;
	const w1 = n > 1 ? words[1] : 0;
	// f: the digits after the 12th as a fraction of its unit (to ~1e-7, ample here).
	let f: number;
	if (k + 7 >= sd) {
		const p = POW10[k + 7 - sd];
		const hi = w0 * 1e7 + w1;
		f = (hi - Math.floor(hi / p) * p) / p + (n > 2 ? words[2] / 1e7 / p : 0);
	} else {
		const p = POW10[7 - (sd - k - 7)];
		const w2 = n > 2 ? words[2] : 0;
		f = (w2 - Math.floor(w2 / p) * p) / p + (n > 3 ? words[3] / 1e7 / p : 0);
	}
	// x is below 10^12 units of its 12th digit, so rel·x is below rel·10^12 of them.
	return Math.abs(f - 0.5) > rel * 1e12 ? toSignificantString(x, sd) : null;
}

/** Lays out significant digits with decimal exponent e as decimal.js's toString does. */
function place(digits: string, e: number, negative: boolean): string {
	let out: string;
	const len = digits.length;
	if (e <= Dec.toExpNeg || e >= Dec.toExpPos) {
		out = (len > 1 ? digits[0] + '.' + digits.slice(1) : digits) + exponentSuffix(e);
	} else if (e < 0) {
		out = FRACTION_PREFIX[-e - 1] + digits;
	} else if (e + 1 >= len) {
		out = e + 1 === len ? digits : digits + ZEROS.slice(0, e + 1 - len);
	} else {
		out = digits.slice(0, e + 1) + '.' + digits.slice(e + 1);
	}
	return negative ? '-' + out : out;
}

/** The general case (more than 14 significant digits), from digit strings. */
function toSignificantStringLong(d: Decimal, sd: number): string {
	const words = (d as unknown as { d: number[] }).d;
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
	return place(digits.slice(0, end), e, d.isNegative());
}
