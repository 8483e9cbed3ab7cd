/**
 * Direct use of decimal.js's representation on the hot paths: a finite decimal is sign `s` (±1),
 * decimal exponent `e` of its leading digit, and digit words `d` in base 1e7 (the first word holds
 * (e mod 7) + 1 digits, so words are aligned on powers of 1e7; no trailing zero words; zero is
 * [0]). decimal.js copies its argument into a new instance for every operation, comparisons
 * included, and converts to and from float64 through strings; these read (or, for a seed, build)
 * the words instead. Each is checked against decimal.js itself by property tests (digits.spec.ts).
 */
import type Decimal from 'decimal.js';

interface Words {
	d: number[] | null;
	e: number;
	s: number;
}
const words = (x: Decimal) => x as unknown as Words;

/** 10^i as float64 for i = 0 … 308 (correctly rounded; exact up to 1e22). */
const POW10: number[] = Array.from({ length: 309 }, (_, i) => Number(`1e${i}`));

/** Number of decimal digits of a base-1e7 word (1 … 7). */
export function wordDigits(w: number): number {
	return w >= 1e4 ? (w >= 1e6 ? 7 : w >= 1e5 ? 6 : 5) : w >= 100 ? (w >= 1e3 ? 4 : 3) : w >= 10 ? 2 : 1;
}

/** a.cmp(b) without copying b: −1, 0 or 1. */
export function compare(a: Decimal, b: Decimal): number {
	const x = words(a);
	const y = words(b);
	const xd = x.d;
	const yd = y.d;
	if (!xd || !yd || x.s !== x.s || y.s !== y.s) return a.cmp(b);
	const xz = xd[0] === 0;
	const yz = yd[0] === 0;
	if (xz || yz) return xz ? (yz ? 0 : -y.s) : x.s;
	if (x.s !== y.s) return x.s;
	const positive = x.s > 0;
	if (x.e !== y.e) return x.e > y.e === positive ? 1 : -1;
	const n = xd.length < yd.length ? xd.length : yd.length;
	for (let i = 0; i < n; i++) if (xd[i] !== yd[i]) return xd[i] > yd[i] === positive ? 1 : -1;
	return xd.length === yd.length ? 0 : xd.length > yd.length === positive ? 1 : -1;
}

/**
 * A float64 close to x (within a few units in the last place), read from the first four digit
 * words; decimals of up to 14 significant digits convert with a single rounding. For seeds and
 * corrections only: not always the correctly rounded value (that is x.toNumber()). 0 or ±Infinity
 * outside float64's range.
 */
export function approxNumber(x: Decimal): number {
	const { d: w, e, s } = words(x);
	if (!w) return NaN;
	const w0 = w[0];
	if (w0 === 0) return 0;
	const n = w.length;
	let m = n > 1 ? w0 * 1e7 + w[1] : w0;
	// A short first word leaves fewer than 16 digits in two words: the next two complete them.
	if (n > 2) m += n > 3 ? (w[2] + w[3] / 1e7) / 1e7 : w[2] / 1e7;
	// Exponent of the units of the last whole word read.
	const scale = e - wordDigits(w0) + 1 - (n > 1 ? 7 : 0);
	let v: number;
	if (scale >= 0) v = scale > 308 ? Infinity : m * POW10[scale];
	else if (scale >= -308) v = m / POW10[-scale];
	else v = m / POW10[308] / (-scale - 308 > 308 ? Infinity : POW10[-scale - 308]);
	return s < 0 ? -v : v;
}

type Clone = new (v: number) => Decimal;

/**
 * A decimal of clone D with 15 significant digits nearest to the finite non-zero float64 v
 * (relative difference below 5e-16): a seed for an iteration that corrects it. Built from the
 * words directly (15 digits stay below 2^53, so every step is exact integer arithmetic).
 */
export function decimalFromFloat(D: Clone, v: number): Decimal {
	const negative = v < 0;
	const a = negative ? -v : v;
	let e = Math.floor(Math.log10(a));
	// M = a·10^(14 − e), an integer of 15 digits (Math.log10 may be one off near a power of ten).
	let m = scaleBy(a, 14 - e);
	if (m < 1e14) {
		e -= 1;
		m = scaleBy(a, 14 - e);
	} else if (m >= 1e15) {
		e += 1;
		m = scaleBy(a, 14 - e);
	}
	m = Math.round(m);
	if (m >= 1e15) {
		m = 1e14;
		e += 1;
	}
	// Split into words aligned on powers of 1e7: k digits in the first word, then 7, then 8 − k.
	const k = (((e % 7) + 7) % 7) + 1;
	const p1 = POW10[15 - k];
	const w0 = Math.floor(m / p1);
	let rest = m - w0 * p1;
	const p2 = POW10[8 - k];
	const w1 = Math.floor(rest / p2);
	rest -= w1 * p2;
	const w2 = rest * POW10[k - 1];
	const d = w2 !== 0 ? [w0, w1, w2] : w1 !== 0 ? [w0, w1] : [w0];
	const x = new D(negative ? -1 : 1);
	const raw = x as unknown as Words;
	raw.e = e;
	raw.d = d;
	return x;
}

function scaleBy(a: number, k: number): number {
	if (k >= 0) return k > 308 ? a * POW10[308] * POW10[k - 308] : a * POW10[k];
	return -k > 308 ? a / POW10[308] / POW10[-k - 308] : a / POW10[-k];
}

type Signed = new (v: number) => Decimal;
interface CloneRange {
	maxE: number;
	minE: number;
}

/**
 * new D(text) for text of the form [+-]digits[.digits][e[+-]digits] (validated by the caller), read
 * in one pass into the words decimal.js would build. null for zero, for an exponent of more than
 * nine digits and outside the clone's exponent range: the caller then asks decimal.js.
 */
export function parseDecimalText(D: Signed & CloneRange, text: string): Decimal | null {
	const len = text.length;
	let i = 0;
	let sign = 1;
	let c = text.charCodeAt(0);
	if (c === 45) {
		sign = -1;
		i = 1;
	} else if (c === 43) i = 1;
	const start = i;
	let intDigits = 0;
	let seenPoint = false;
	let first = -1;
	let last = -1;
	let count = 0;
	for (; i < len; i++) {
		c = text.charCodeAt(i);
		if (c === 46) {
			seenPoint = true;
			continue;
		}
		if (c < 48 || c > 57) break;
		if (!seenPoint) intDigits++;
		if (c !== 48) {
			if (first < 0) first = count;
			last = count;
		}
		count++;
	}
	if (first < 0) return null;
	let exp = 0;
	if (i < len) {
		i++; // e or E
		let es = 1;
		c = text.charCodeAt(i);
		if (c === 45) {
			es = -1;
			i++;
		} else if (c === 43) i++;
		if (len - i > 9) return null;
		for (; i < len; i++) exp = exp * 10 + (text.charCodeAt(i) - 48);
		exp *= es;
	}
	const e = intDigits - first - 1 + exp;
	if (e > D.maxE || e < D.minE) return null;
	// Words aligned on powers of 1e7: (e mod 7) + 1 digits in the first, 7 in each further one.
	const d: number[] = [];
	let want = (((e % 7) + 7) % 7) + 1;
	let w = 0;
	let inWord = 0;
	let pos = 0;
	for (let j = start; pos <= last; j++) {
		c = text.charCodeAt(j);
		if (c === 46) continue;
		if (pos >= first) {
			w = w * 10 + (c - 48);
			if (++inWord === want) {
				d.push(w);
				w = 0;
				inWord = 0;
				want = 7;
			}
		}
		pos++;
	}
	if (inWord > 0) d.push(w * POW10[want - inWord]);
	const x = new D(sign);
	const raw = x as unknown as Words;
	raw.e = e;
	raw.d = d;
	return x;
}
