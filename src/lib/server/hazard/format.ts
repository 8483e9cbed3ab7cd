/**
 * Writing decimals into results: decimal strings with 12 significant digits. Anything that is not
 * finite is an engine fault, never a result.
 */
import type Decimal from 'decimal.js';
import { OUTPUT_SIGNIFICANT_DIGITS } from './constants';

export class NonFiniteResultError extends Error {
	constructor(what: string) {
		super(`a non-finite value arose in ${what}`);
		this.name = 'NonFiniteResultError';
	}
}

// The same decimal is often written several times (a step's value is the next step's input).
const written = new WeakMap<Decimal, string>();

export function fmt(d: Decimal, what = 'the computation'): string {
	const hit = written.get(d);
	if (hit !== undefined) return hit;
	if (!d.isFinite()) throw new NonFiniteResultError(what);
	const s = d.toSignificantDigits(OUTPUT_SIGNIFICANT_DIGITS).toString();
	written.set(d, s);
	return s;
}

export function fmtOrNull(d: Decimal | null | undefined, what?: string): string | null {
	return d === null || d === undefined ? null : fmt(d, what);
}
