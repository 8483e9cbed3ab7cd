/**
 * Reading numeric input (SI units) into decimals, with range checks that report a named field.
 */
import type Decimal from 'decimal.js';
import { Dec, type DecimalClone } from './constants';
import { compare, parseDecimalText } from './digits';
import type { ErrorList } from './errors';

/** Plain decimal notation, optionally with an exponent: '5', '-0.25', '.5', '1.2e-3'. */
const DECIMAL_TEXT = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

export type NumberRead = { ok: true; value: Decimal } | { ok: false; reason: string; missing: boolean };

export function isMissing(value: unknown): boolean {
	return value === undefined || value === null || (typeof value === 'string' && value.trim() === '');
}

/**
 * Turns a JSON number, numeric string, bigint or Decimal into a finite Decimal of clone D (no
 * rounding: every digit given is kept).
 */
export function readDecimal(value: unknown, D: DecimalClone = Dec): NumberRead {
	if (typeof value === 'string') {
		const text = value.trim();
		if (DECIMAL_TEXT.test(text)) return { ok: true, value: parseDecimalText(D, text) ?? new D(text) };
		if (text === '') return { ok: false, reason: 'is required.', missing: true };
		if (/^[+-]?(?:nan|infinity|inf)$/i.test(text)) {
			return { ok: false, reason: `must be a finite number, not “${text}”.`, missing: false };
		}
		return { ok: false, reason: `“${text.slice(0, 40)}” is not a number in SI units (use digits, '.' and an optional exponent).`, missing: false };
	}
	if (value === undefined || value === null) return { ok: false, reason: 'is required.', missing: true };
	if (typeof value === 'number') {
		if (Number.isNaN(value)) return { ok: false, reason: 'is not a number (NaN).', missing: false };
		if (!Number.isFinite(value)) return { ok: false, reason: 'must be finite, not Infinity.', missing: false };
		// decimal.js reads a number through its shortest text, as here.
		return { ok: true, value: (value !== 0 && parseDecimalText(D, String(value))) || new D(value) };
	}
	if (typeof value === 'bigint') return { ok: true, value: new D(value.toString()) };
	if (value !== null && typeof value === 'object' && typeof (value as Decimal).isFinite === 'function' && typeof (value as Decimal).toString === 'function') {
		const d = value as Decimal;
		if (d.isNaN()) return { ok: false, reason: 'is not a number (NaN).', missing: false };
		if (!d.isFinite()) return { ok: false, reason: 'must be finite, not Infinity.', missing: false };
		return { ok: true, value: new D(d) };
	}
	return { ok: false, reason: 'must be a number.', missing: false };
}

/**
 * Decimals read from text or JSON numbers that recur across assessments (wavelengths, exposure
 * durations, limit fields), kept per clone so that they are parsed once and share one instance;
 * the memos keyed by instance (limit values, photon energies) then hit across assessments too.
 * Decimals are immutable, so sharing an instance is safe. Bounded: cleared when full.
 */
const READ_CACHE_MAX = 2048;
const readCaches = new Map<DecimalClone, Map<string | number, Decimal>>();

export function readDecimalCached(value: unknown, D: DecimalClone = Dec): NumberRead {
	if ((typeof value !== 'string' && typeof value !== 'number') || value === 0) return readDecimal(value, D);
	let cache = readCaches.get(D);
	if (!cache) {
		cache = new Map();
		readCaches.set(D, cache);
	}
	const hit = cache.get(value);
	if (hit) return { ok: true, value: hit };
	const read = readDecimal(value, D);
	if (read.ok) {
		if (cache.size >= READ_CACHE_MAX) cache.clear();
		cache.set(value, read.value);
	}
	return read;
}

export interface RangeRule {
	/** Lower bound; `minExclusive` makes it strict. */
	min?: Decimal;
	minExclusive?: boolean;
	max?: Decimal;
	maxExclusive?: boolean;
	/** Human description used in the error, e.g. 'greater than zero'. */
	describe: string;
}

/**
 * Reads a required number and checks its range; on failure records an error and returns undefined.
 * `cached`: the value is one that recurs across assessments (see readDecimalCached).
 */
export function requireNumber(errors: ErrorList, field: string, value: unknown, rule?: RangeRule, label = 'This value', D: DecimalClone = Dec, cached = false): Decimal | undefined {
	const read = cached ? readDecimalCached(value, D) : readDecimal(value, D);
	if (!read.ok) {
		errors.add(field, `${label} ${read.reason}`);
		return undefined;
	}
	if (rule && !inRange(read.value, rule)) {
		errors.add(field, `${label} must be ${rule.describe}; got ${read.value.toString()}.`);
		return undefined;
	}
	return read.value;
}

/**
 * Reads an optional number. Missing → `null` (no error). Present but bad → error, returns undefined.
 */
export function optionalNumber(errors: ErrorList, field: string, value: unknown, rule?: RangeRule, label = 'This value', D: DecimalClone = Dec, cached = false): Decimal | null | undefined {
	if (isMissing(value)) return null;
	return requireNumber(errors, field, value, rule, label, D, cached);
}

export function inRange(v: Decimal, rule: RangeRule): boolean {
	if (rule.min !== undefined) {
		const c = compare(v, rule.min);
		if (c < 0 || (c === 0 && rule.minExclusive)) return false;
	}
	if (rule.max !== undefined) {
		const c = compare(v, rule.max);
		if (c > 0 || (c === 0 && rule.maxExclusive)) return false;
	}
	return true;
}

/** Reads one of a fixed set of words. */
export function requireEnum<T extends string>(errors: ErrorList, field: string, value: unknown, allowed: readonly T[], label = 'This value'): T | undefined {
	if (typeof value === 'string' && (allowed as readonly string[]).includes(value)) return value as T;
	if (isMissing(value)) errors.add(field, `${label} is required; choose one of: ${allowed.join(', ')}.`);
	else errors.add(field, `${label} “${String(value).slice(0, 40)}” is not one of: ${allowed.join(', ')}.`);
	return undefined;
}

/** Reads a non-empty string identifier or label. */
export function requireText(errors: ErrorList, field: string, value: unknown, label = 'This value', maxLength = 200): string | undefined {
	if (typeof value === 'number' && Number.isFinite(value)) return String(value);
	if (typeof value !== 'string' || value.trim() === '') {
		errors.add(field, `${label} is required.`);
		return undefined;
	}
	if (value.length > maxLength) {
		errors.add(field, `${label} is longer than ${maxLength} characters.`);
		return undefined;
	}
	return value;
}

export function optionalText(value: unknown, fallback: string): string {
	return typeof value === 'string' && value.trim() !== '' ? value : fallback;
}
