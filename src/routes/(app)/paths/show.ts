// Writing the engine's decimal strings for people: short, with units, never hiding a missing value.
import { formatQuantity, type QuantityKind } from '$lib/units';

/** '1.23456789e-19' → '1.235 × 10⁻¹⁹'; ordinary magnitudes stay plain ('0.25', '1234'). */
export function num(v: string | number | null | undefined, digits = 4): string {
	if (v === null || v === undefined || v === '') return '—';
	const n = Number(v);
	if (!Number.isFinite(n)) return '—';
	if (n === 0) return '0';
	const a = Math.abs(n);
	if (a >= 1e-3 && a < 1e5) return String(Number(n.toPrecision(digits)));
	const [mantissa, exponent] = n.toExponential(digits - 1).split('e');
	return `${Number(mantissa)} × 10${superscript(exponent)}`;
}

const SUP: Record<string, string> = { '-': '⁻', '+': '', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };
function superscript(e: string) {
	return [...e].map((c) => SUP[c] ?? c).join('');
}

/** A number with its unit, e.g. '3.734 × 10⁻¹⁹ J'. */
export function withUnit(v: string | number | null | undefined, unit: string, digits = 4): string {
	const s = num(v, digits);
	return s === '—' ? s : unit ? `${s} ${unit}` : s;
}

/** formatQuantity, or '—' for a missing value. */
export function qty(v: string | null | undefined, kind: QuantityKind, unit?: string): string {
	if (v === null || v === undefined || v === '') return '—';
	try {
		return formatQuantity(v, kind, unit ? { unit } : {});
	} catch {
		return withUnit(v, unit ?? '');
	}
}

/** An exposure in SI and in the trade's per-cm² unit. */
export function exposure(v: string | number | null | undefined, unit: string | null): { si: string; customary: string } {
	if (v === null || v === undefined || v === '' || !unit) return { si: '—', customary: '—' };
	const kind: QuantityKind = unit.startsWith('W') ? 'irradiance' : 'radiant_exposure';
	const per = kind === 'irradiance' ? 'W/cm²' : 'J/cm²';
	const written = qty(String(v), kind, per);
	const space = written.indexOf(' ');
	return { si: withUnit(v, unit), customary: space > 0 ? `${num(written.slice(0, space))}${written.slice(space)}` : written };
}

export const tissueWords: Record<string, string> = { eye: 'eye', skin: 'skin' };
export const pointKindWords: Record<string, string> = { intrabeam: 'intrabeam', diffuse: 'diffuse reflection' };
export const checkWords: Record<string, string> = { single_pulse: 'single pulse', average_power: 'average power', pulse_train: 'pulse train', continuous: 'continuous' };
export const causeWords: Record<string, string> = { save: 'saved', reassess: 're-evaluated after a limit changed' };
