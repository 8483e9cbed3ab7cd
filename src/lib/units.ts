/**
 * Practical units ⇄ SI, shared by the browser and the server (pure TypeScript, decimal.js only).
 *
 * The UI accepts values such as "5 W", "5000mW", "1.2e-3 J", "532 nm" and stores SI values; results
 * are shown back in a sensible unit. Only '.' is a decimal separator: "1,5" is refused with a reason,
 * so that a comma is never silently read as a thousands separator or as a decimal point.
 */
import Decimal from 'decimal.js';

export const UnitDecimal = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN, toExpNeg: -7, toExpPos: 21 });

export type QuantityKind = 'wavelength' | 'power' | 'energy' | 'time' | 'length' | 'angle' | 'frequency' | 'irradiance' | 'radiant_exposure';

export const QUANTITY_KINDS: readonly QuantityKind[] = ['wavelength', 'power', 'energy', 'time', 'length', 'angle', 'frequency', 'irradiance', 'radiant_exposure'];

interface UnitDef {
	symbol: string;
	/** SI value of one of this unit. */
	factor: Decimal;
	/** Other spellings accepted when parsing. */
	aliases: readonly string[];
	/** Candidate for automatic choice when formatting. */
	auto: boolean;
}

const D = (v: Decimal.Value) => new UnitDecimal(v);
const PI = UnitDecimal.acos(-1);

function u(symbol: string, factor: Decimal.Value | Decimal, aliases: readonly string[] = [], auto = true): UnitDef {
	return { symbol, factor: factor instanceof Decimal ? factor : D(factor), aliases, auto };
}

/** Micro: the micro sign U+00B5 is canonical; Greek mu U+03BC and a plain 'u' are accepted. */
const UNIT_TABLE: Record<QuantityKind, readonly UnitDef[]> = {
	wavelength: [u('nm', '1e-9'), u('µm', '1e-6', ['um']), u('mm', '1e-3'), u('m', 1, [], false)],
	power: [u('nW', '1e-9'), u('µW', '1e-6', ['uW']), u('mW', '1e-3'), u('W', 1), u('kW', '1e3'), u('MW', '1e6'), u('GW', '1e9'), u('TW', '1e12'), u('PW', '1e15')],
	energy: [u('nJ', '1e-9'), u('µJ', '1e-6', ['uJ']), u('mJ', '1e-3'), u('J', 1), u('kJ', '1e3')],
	time: [u('fs', '1e-15'), u('ps', '1e-12'), u('ns', '1e-9'), u('µs', '1e-6', ['us']), u('ms', '1e-3'), u('s', 1, ['sec']), u('min', 60, [], false), u('h', 3600, ['hr'], false)],
	length: [u('µm', '1e-6', ['um']), u('mm', '1e-3'), u('cm', '1e-2', [], false), u('m', 1), u('km', '1e3', [], false)],
	angle: [u('µrad', '1e-6', ['urad']), u('mrad', '1e-3'), u('rad', 1), u('°', PI.div(180), ['deg', 'degree', 'degrees'], false)],
	frequency: [u('Hz', 1), u('kHz', '1e3'), u('MHz', '1e6'), u('GHz', '1e9')],
	irradiance: [
		u('W/m²', 1, [], false),
		u('µW/cm²', '1e-2', ['uW/cm²']),
		u('mW/cm²', '10'),
		u('W/cm²', '1e4'),
		u('kW/cm²', '1e7'),
		u('MW/cm²', '1e10'),
		u('GW/cm²', '1e13'),
		u('TW/cm²', '1e16'),
		u('mW/m²', '1e-3', [], false),
		u('kW/m²', '1e3', [], false)
	],
	radiant_exposure: [
		u('J/m²', 1, [], false),
		u('nJ/cm²', '1e-5'),
		u('µJ/cm²', '1e-2', ['uJ/cm²']),
		u('mJ/cm²', '10'),
		u('J/cm²', '1e4'),
		u('kJ/cm²', '1e7'),
		u('mJ/m²', '1e-3', [], false),
		u('kJ/m²', '1e3', [], false)
	]
};

/** SI unit of each kind (what the database stores). */
export const SI_UNIT: Record<QuantityKind, string> = {
	wavelength: 'm',
	power: 'W',
	energy: 'J',
	time: 's',
	length: 'm',
	angle: 'rad',
	frequency: 'Hz',
	irradiance: 'W/m²',
	radiant_exposure: 'J/m²'
};

/** Unit assumed when a bare number is typed. SI, except the wavelength, which nobody types in metres. */
export const DEFAULT_UNIT: Record<QuantityKind, string> = { ...SI_UNIT, wavelength: 'nm' };

const KIND_WORDS: Record<QuantityKind, string> = {
	wavelength: 'a wavelength',
	power: 'a power',
	energy: 'an energy',
	time: 'a duration',
	length: 'a length',
	angle: 'an angle',
	frequency: 'a frequency',
	irradiance: 'an irradiance',
	radiant_exposure: 'a radiant exposure'
};

/** Canonical spelling: micro sign, superscript two, no spaces around '/'. */
function normaliseUnitText(text: string): string {
	return text
		.trim()
		.replace(/\u03bc/g, '\u00b5')
		.replace(/\s*\/\s*/g, '/')
		.replace(/\^2/g, '²')
		.replace(/([a-zA-Z])2$/, '$1²'); // 'cm2' → 'cm²' (no lookbehind: older browsers lack it)
}

function findUnit(kind: QuantityKind, text: string): UnitDef | 'ambiguous' | undefined {
	const t = normaliseUnitText(text);
	const list = UNIT_TABLE[kind];
	for (const def of list) if (def.symbol === t || def.aliases.includes(t)) return def;
	// Forgiving about case only where that cannot confuse milli with mega ('mw' vs 'MW').
	const lower = t.toLowerCase();
	const matches = list.filter((def) => def.symbol.toLowerCase() === lower || def.aliases.some((a) => a.toLowerCase() === lower));
	if (matches.length === 1) return matches[0];
	if (matches.length > 1) return 'ambiguous';
	return undefined;
}

/** Unit symbols accepted for a kind (canonical spellings). */
export function unitsFor(kind: QuantityKind): readonly string[] {
	return UNIT_TABLE[kind].map((d) => d.symbol);
}

export type ParsedQuantity = { ok: true; value: Decimal; unit: string } | { ok: false; reason: string };

const NUMBER_AND_UNIT = /^([+\-\u2212]?(?:\d+\.?\d*|\.\d+)(?:[eE][+\-\u2212]?\d+)?)\s*(.*)$/;

/**
 * Reads "5 W", "5000mW", "1.2e-3 J", "532 nm", "45°" into an SI value. A bare number takes
 * `defaultUnit` (else DEFAULT_UNIT[kind]). Never throws.
 */
export function parseQuantity(text: string, kind: QuantityKind, opts: { defaultUnit?: string } = {}): ParsedQuantity {
	if (typeof text !== 'string') return { ok: false, reason: 'Enter a value as text, for example “5 mW”.' };
	const t = text.trim();
	if (t === '') return { ok: false, reason: 'Enter a value.' };
	if (t.includes(',')) return { ok: false, reason: 'Use “.” as the decimal separator, without thousands separators (for example 1.5 or 1500).' };
	if (/^[+\-\u2212]?(nan|inf|infinity|∞)/i.test(t)) return { ok: false, reason: 'Enter a finite number.' };
	const m = NUMBER_AND_UNIT.exec(t);
	if (!m) return { ok: false, reason: `“${t.slice(0, 40)}” does not start with a number; write it like “5 mW” or “1.2e-3 J”.` };
	const number = m[1].replace(/\u2212/g, '-');
	const unitText = m[2].trim();
	const symbol = unitText === '' ? opts.defaultUnit ?? DEFAULT_UNIT[kind] : unitText;
	const def = findUnit(kind, symbol);
	if (def === 'ambiguous') return { ok: false, reason: `“${unitText}” is ambiguous in this letter case; write it as one of ${unitsFor(kind).join(', ')}.` };
	if (!def) return { ok: false, reason: `“${symbol.slice(0, 20)}” is not a unit for ${KIND_WORDS[kind]}; use one of ${unitsFor(kind).join(', ')}.` };
	const value = new UnitDecimal(number).times(def.factor);
	if (!value.isFinite()) return { ok: false, reason: 'Enter a finite number.' };
	return { ok: true, value, unit: def.symbol };
}

/**
 * A power fraction such as a transmission or a reflectance, typed as a fraction ("0.5"), a percentage
 * ("1 %") or an optical density ("OD 2", meaning 10⁻²). Reads the number only; whether it lies in
 * 0–1 is the engine's rule. Never throws.
 */
export function parseFraction(text: string): { ok: true; value: Decimal } | { ok: false; reason: string } {
	if (typeof text !== 'string') return { ok: false, reason: 'Enter a value as text, for example “0.5”, “1 %” or “OD 2”.' };
	const t = text.trim().replace(/\u2212/g, '-');
	if (t === '') return { ok: false, reason: 'Enter a value.' };
	if (t.includes(',')) return { ok: false, reason: 'Use “.” as the decimal separator (for example 0.5).' };
	const num = '([+-]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?)';
	const od = new RegExp(`^OD\\s*${num}$`, 'i').exec(t);
	if (od) return { ok: true, value: new UnitDecimal(10).pow(new UnitDecimal(od[1]).neg()) };
	const percent = new RegExp(`^${num}\\s*%$`).exec(t);
	if (percent) return { ok: true, value: new UnitDecimal(percent[1]).div(100) };
	const plain = new RegExp(`^${num}$`).exec(t);
	if (plain) return { ok: true, value: new UnitDecimal(plain[1]) };
	return { ok: false, reason: 'Enter a fraction from 0 to 1 (0.5), a percentage (1 %) or an optical density (OD 2).' };
}

function requireUnit(unit: string, kind?: QuantityKind): UnitDef {
	const kinds = kind ? [kind] : QUANTITY_KINDS;
	for (const k of kinds) {
		const def = findUnit(k, unit);
		if (def && def !== 'ambiguous') return def;
	}
	throw new RangeError(`Unknown unit “${unit}”${kind ? ` for ${KIND_WORDS[kind]}` : ''}.`);
}

/** SI value expressed in `unit` (throws RangeError for an unknown unit: a programming error). */
export function toUnit(valueSI: Decimal.Value, unit: string, kind?: QuantityKind): Decimal {
	return new UnitDecimal(valueSI).div(requireUnit(unit, kind).factor);
}

/** Value in `unit` expressed in SI (throws RangeError for an unknown unit). */
export function fromUnit(value: Decimal.Value, unit: string, kind?: QuantityKind): Decimal {
	return new UnitDecimal(value).times(requireUnit(unit, kind).factor);
}

/** The unit `formatQuantity` would choose for a value. */
export function chooseUnit(valueSI: Decimal.Value, kind: QuantityKind): string {
	const v = new UnitDecimal(valueSI).abs();
	if (kind === 'wavelength') {
		// Customary: nanometres up to the near infrared, micrometres beyond.
		if (v.isZero() || v.lt('3e-6')) return 'nm';
		if (v.lt('1e-3')) return 'µm';
		return 'mm';
	}
	const auto = UNIT_TABLE[kind].filter((d) => d.auto).sort((a, b) => a.factor.cmp(b.factor));
	if (v.isZero()) return DEFAULT_UNIT[kind] === SI_UNIT[kind] && auto.some((d) => d.symbol === SI_UNIT[kind]) ? SI_UNIT[kind] : auto[0].symbol;
	let pick = auto[0];
	for (const d of auto) if (d.factor.lte(v)) pick = d;
	return pick.symbol;
}

/** Rounding of a written value: to nearest, or toward the safe side of a comparison. */
export type Toward = 'nearest' | 'up' | 'down';
export const ROUNDING: Record<Toward, Decimal.Rounding> = { nearest: Decimal.ROUND_HALF_EVEN, up: Decimal.ROUND_CEIL, down: Decimal.ROUND_FLOOR };

/**
 * Writes an SI value in a sensible unit ("532 nm", "5 mW", "2.546 mW/cm²"), or in `opts.unit`.
 * `significantDigits` defaults to 4; `toward` rounds up or down where the written value is compared
 * with another (an exposure up, a limit down). Throws RangeError for an unknown `opts.unit`.
 */
export function formatQuantity(valueSI: Decimal.Value, kind: QuantityKind, opts: { unit?: string; significantDigits?: number; toward?: Toward } = {}): string {
	const si = new UnitDecimal(valueSI);
	if (!si.isFinite()) return '—';
	const sd = opts.significantDigits ?? 4;
	const rm = ROUNDING[opts.toward ?? 'nearest'];
	// Choose the unit on the rounded value, so that 999.95 GW is written 1 TW rather than 1000 GW.
	const def = requireUnit(opts.unit ?? chooseUnit(si.toSignificantDigits(sd, rm), kind), kind);
	const n = si.div(def.factor).toSignificantDigits(sd, rm).toString();
	return def.symbol === '°' ? `${n}°` : `${n} ${def.symbol}`;
}

/**
 * A stored SI value written back as a person types it: a form's starting value, a cell of an export.
 * In a readable unit (or `unit`) with up to 12 significant digits when that text reads back as the
 * stored value; otherwise every digit, in the SI unit, so that saving the form or importing the file
 * again never changes a value. A plain number (a fraction, an exponent) has no kind.
 */
export function asEntered(valueSI: Decimal.Value | null, kind: QuantityKind | null, unit?: string): string {
	if (valueSI === null) return '';
	const exact = new UnitDecimal(valueSI);
	if (kind === null) return exact.toString();
	const text = formatQuantity(exact, kind, { significantDigits: 12, unit });
	const back = parseQuantity(text, kind);
	return back.ok && back.value.eq(exact) ? text : `${exact.toString()} ${SI_UNIT[kind]}`;
}

/** The quantity each beam-path field holds (lines, elements, points), for writing its SI value with a unit. */
export const fieldQuantityKinds: Record<string, QuantityKind> = {
	wavelength: 'wavelength',
	wavelengthMax: 'wavelength',
	power: 'power',
	pulseEnergy: 'energy',
	pulseDuration: 'time',
	repetitionRate: 'frequency',
	beamDiameter: 'length',
	divergence: 'angle',
	length: 'length',
	focalLength: 'length',
	coreDiameter: 'length',
	position: 'length',
	exposureDuration: 'time',
	viewingAngle: 'angle',
	viewingDistance: 'length'
};
