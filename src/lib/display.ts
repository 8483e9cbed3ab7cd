/**
 * Numbers for people: results keep full float64 values; screens, mails and reports write them with 3
 * significant figures (4 for wavelengths), rounding toward the safe side wherever the written number
 * is compared with another — an exposure and a required optical density round up, a limit rounds
 * down, and a ratio to a limit never reads as 1.00 or more while it is below the limit (nor below 1
 * once it is at the limit, from 1 − 1e-9). Decimal rounding, so a written digit is exactly right.
 */
import { ROUNDING, UnitDecimal, formatQuantity, type QuantityKind, type Toward } from './units';

export type { Toward };
export const DIGITS = 3;
export const WAVELENGTH_DIGITS = 4;
/** A ratio this close below 1 is at the limit (the engine's rule, repeated for display). */
const AT_LIMIT = 1 - 1e-9;

const SUP: Record<string, string> = { '-': '⁻', '+': '', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };
const superscript = (e: string) => [...e].map((c) => SUP[c] ?? c).join('');

type Value = string | number | null | undefined;
const missing = (v: Value): v is null | undefined | '' => v === null || v === undefined || v === '';

/** '1.23456789e-19' → '1.24 × 10⁻¹⁹'; ordinary magnitudes stay plain ('0.25', '1234'). */
export function num(v: Value, digits = DIGITS, toward: Toward = 'nearest'): string {
	if (missing(v)) return '—';
	const n = Number(v);
	if (!Number.isFinite(n)) return '—';
	if (n === 0) return '0';
	const d = new UnitDecimal(v).toSignificantDigits(digits, ROUNDING[toward]);
	const a = d.abs();
	if (a.gte('1e-3') && a.lt('1e5')) return d.toString().replace(/e\+?/, 'e');
	const [mantissa, exponent] = d.toExponential().split('e');
	return `${mantissa} × 10${superscript(exponent)}`;
}

/** A number with its unit, e.g. '3.73 × 10⁻¹⁹ J'. */
export function withUnit(v: Value, unit: string, digits = DIGITS, toward: Toward = 'nearest'): string {
	const s = num(v, digits, toward);
	return s === '—' ? s : unit ? `${s} ${unit}` : s;
}

/** A quantity in a practical unit ('532 nm', '5 mW'), or '—'. Wavelengths get 4 figures. */
export function qty(v: Value, kind: QuantityKind, opts: { unit?: string; toward?: Toward; digits?: number } = {}): string {
	if (missing(v)) return '—';
	const digits = opts.digits ?? (kind === 'wavelength' ? WAVELENGTH_DIGITS : DIGITS);
	try {
		return formatQuantity(String(v), kind, { unit: opts.unit, significantDigits: digits, toward: opts.toward });
	} catch {
		return withUnit(v, opts.unit ?? '', digits, opts.toward);
	}
}

/**
 * A ratio to a limit, rounded up; below the limit it keeps as many figures as it takes (up to 9) not
 * to read as 1.00, and at the limit (from 1 − 1e-9) it reads as at least 1.00.
 */
export function ratio(v: Value): string {
	if (missing(v)) return '—';
	const r = Number(v);
	if (!Number.isFinite(r)) return '—';
	if (r >= AT_LIMIT) return num(Math.max(r, 1), DIGITS, 'up');
	for (let digits = DIGITS; digits <= 9; digits++) {
		const written = num(r, digits, 'up');
		if (Number(written.split(' ')[0]) < 1 || written.includes('×')) return written;
	}
	return num(r, 9, 'down');
}

/** An optical density, rounded up (what eyewear must at least provide). */
export function od(v: Value): string {
	return num(v, DIGITS, 'up');
}

/** An exposure in SI and in the trade's per-cm² unit. */
export function exposure(v: Value, unit: string | null, toward: Toward = 'nearest'): { si: string; customary: string } {
	if (missing(v) || !unit) return { si: '—', customary: '—' };
	const kind: QuantityKind = unit.startsWith('W') ? 'irradiance' : 'radiant_exposure';
	const per = kind === 'irradiance' ? 'W/cm²' : 'J/cm²';
	const written = qty(v, kind, { unit: per, toward });
	const space = written.indexOf(' ');
	return { si: withUnit(v, unit, DIGITS, toward), customary: space > 0 ? `${num(written.slice(0, space), DIGITS, toward)}${written.slice(space)}` : written };
}
