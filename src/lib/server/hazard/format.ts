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
	const s = d.toSignificantDigits(OUTPUT_SIGNIFICANT_DIGITS).toString();
	ringKeys[ringNext] = d;
	ringValues[ringNext] = s;
	ringNext = (ringNext + 1) % RING;
	return s;
}

export function fmtOrNull(d: Decimal | null | undefined, what?: string): string | null {
	return d === null || d === undefined ? null : fmt(d, what);
}
