import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { all, create } from 'mathjs';
import { DEFAULT_UNIT, QUANTITY_KINDS, UnitDecimal, asEntered, chooseUnit, formatQuantity, fromUnit, parseFraction, parseQuantity, toUnit, unitsFor, type QuantityKind } from './units';

const math = create(all);

function si(text: string, kind: QuantityKind, defaultUnit?: string): string {
	const r = parseQuantity(text, kind, { defaultUnit });
	if (!r.ok) throw new Error(r.reason);
	return r.value.toString();
}

describe('parseQuantity', () => {
	it('reads the practical spellings', () => {
		expect(si('5 W', 'power')).toBe('5');
		expect(si('5000mW', 'power')).toBe('5');
		expect(si('250 µW', 'power')).toBe('0.00025');
		expect(si('250 uW', 'power')).toBe('0.00025');
		expect(si('250 μW', 'power')).toBe('0.00025'); // Greek mu
		expect(si('1.2e-3 J', 'energy')).toBe('0.0012');
		expect(si('532 nm', 'wavelength')).toBe('5.32e-7');
		expect(si('10.6 µm', 'wavelength')).toBe('0.0000106');
		expect(si('35 fs', 'time')).toBe('3.5e-14');
		expect(si('8 h', 'time')).toBe('28800');
		expect(si('2 min', 'time')).toBe('120');
		expect(si('3 cm', 'length')).toBe('0.03');
		expect(si('1.5 mrad', 'angle')).toBe('0.0015');
		expect(si('80 MHz', 'frequency')).toBe('80000000');
		expect(si('2.5 mW/cm²', 'irradiance')).toBe('25');
		expect(si('2.5 mW/cm^2', 'irradiance')).toBe('25');
		expect(si('2.5 mW / cm2', 'irradiance')).toBe('25');
		expect(si('5 µJ/cm²', 'radiant_exposure')).toBe('0.05');
		expect(si('0.2 W/cm²', 'irradiance')).toBe('2000');
		expect(si('−3 mrad', 'angle')).toBe('-0.003'); // Unicode minus
		expect(si('  7 mm ', 'length')).toBe('0.007');
	});

	it('reads degrees in both spellings', () => {
		const a = si('45°', 'angle');
		expect(si('45 deg', 'angle')).toBe(a);
		expect(Number(a)).toBeCloseTo(Math.PI / 4, 15);
	});

	it('applies a default unit when none is typed', () => {
		expect(DEFAULT_UNIT.wavelength).toBe('nm');
		expect(si('532', 'wavelength')).toBe('5.32e-7');
		expect(si('5', 'power')).toBe('5');
		expect(si('7', 'length', 'mm')).toBe('0.007');
	});

	it('refuses what it cannot read, with a reason', () => {
		const bad: [string, QuantityKind, RegExp][] = [
			['', 'power', /Enter a value/],
			['   ', 'power', /Enter a value/],
			['1,5 mW', 'power', /decimal separator/],
			['5,000 mW', 'power', /decimal separator/],
			['NaN', 'power', /finite/],
			['Infinity W', 'power', /finite/],
			['-inf', 'power', /finite/],
			['five W', 'power', /number/],
			['5 parsec', 'length', /not a unit/],
			['5 J', 'power', /not a unit/],
			['5 mw', 'power', /ambiguous/],
			['1e999999999999999999 W', 'power', /.+/]
		];
		for (const [text, kind, why] of bad) {
			const r = parseQuantity(text, kind);
			expect(r.ok, text).toBe(false);
			if (!r.ok) expect(r.reason).toMatch(why);
		}
	});

	it('is forgiving about letter case only where unambiguous', () => {
		expect(si('5 w', 'power')).toBe('5');
		expect(si('532 NM', 'wavelength')).toBe('5.32e-7');
		expect(si('5 MW', 'power')).toBe('5000000');
		expect(si('5 mW', 'power')).toBe('0.005');
	});
});

describe('conversions agree with mathjs units', () => {
	// Source: mathjs unit conversion (math.unit(value, unit).toNumber(target)).
	const cases: [string, QuantityKind, string, string][] = [
		['532 nm', 'wavelength', '532 nm', 'm'],
		['10.6 um', 'wavelength', '10.6 um', 'm'],
		['5 mW', 'power', '5 mW', 'W'],
		['3 kW', 'power', '3 kW', 'W'],
		['250 uJ', 'energy', '250 uJ', 'J'],
		['35 fs', 'time', '35 fs', 's'],
		['12 ns', 'time', '12 ns', 's'],
		['2 min', 'time', '2 min', 's'],
		['7 mm', 'length', '7 mm', 'm'],
		['3 cm', 'length', '3 cm', 'm'],
		['1.5 mrad', 'angle', '1.5 mrad', 'rad'],
		['30 deg', 'angle', '30 deg', 'rad'],
		['1 kHz', 'frequency', '1 kHz', 'Hz'],
		['2.5 mW/cm^2', 'irradiance', '2.5 mW/cm^2', 'W/m^2'],
		['0.2 W/cm^2', 'irradiance', '0.2 W/cm^2', 'W/m^2'],
		['5 uJ/cm^2', 'radiant_exposure', '5 uJ/cm^2', 'J/m^2'],
		['1 J/cm^2', 'radiant_exposure', '1 J/cm^2', 'J/m^2']
	];
	for (const [text, kind, mjs, target] of cases) {
		it(`${text} → ${target}`, () => {
			const ours = Number(si(text, kind));
			const theirs = math.unit(mjs).toNumber(target);
			expect(Math.abs(ours - theirs) / theirs).toBeLessThan(1e-15);
		});
	}
});

describe('formatQuantity and toUnit', () => {
	it('chooses a sensible unit', () => {
		expect(formatQuantity('5.32e-7', 'wavelength')).toBe('532 nm');
		expect(formatQuantity('1.064e-6', 'wavelength')).toBe('1064 nm');
		expect(formatQuantity('1.06e-5', 'wavelength')).toBe('10.6 µm');
		expect(formatQuantity('0.005', 'power')).toBe('5 mW');
		expect(formatQuantity('1e7', 'power')).toBe('10 MW');
		expect(formatQuantity('25.4558', 'irradiance')).toBe('2.546 mW/cm²');
		expect(formatQuantity('0.05', 'radiant_exposure')).toBe('5 µJ/cm²');
		expect(formatQuantity('1e-8', 'time')).toBe('10 ns');
		expect(formatQuantity('0.007', 'length')).toBe('7 mm');
		expect(formatQuantity('0.0015', 'angle')).toBe('1.5 mrad');
		expect(formatQuantity('0', 'power')).toBe('0 W');
	});

	it('writes in a requested unit', () => {
		expect(formatQuantity('2000', 'irradiance', { unit: 'W/cm²' })).toBe('0.2 W/cm²');
		expect(formatQuantity('2000', 'irradiance', { unit: 'W/m²' })).toBe('2000 W/m²');
		expect(formatQuantity(String(Math.PI / 4), 'angle', { unit: 'deg' })).toBe('45°');
		expect(toUnit('0.007', 'mm').toString()).toBe('7');
		expect(toUnit('25', 'mW/cm²', 'irradiance').toString()).toBe('2.5');
		expect(fromUnit('2.5', 'mW/cm^2', 'irradiance').toString()).toBe('25');
		expect(() => toUnit('1', 'furlong')).toThrow(RangeError);
	});

	it('round-trips parse ∘ format exactly for every kind and every unit', () => {
		const digits = fc.tuple(fc.integer({ min: 1, max: 999999999 }), fc.integer({ min: -20, max: 20 })).map(([m, e]) => new UnitDecimal(m).times(new UnitDecimal(10).pow(e)));
		fc.assert(
			fc.property(digits, fc.constantFrom(...QUANTITY_KINDS), (value, kind) => {
				// Automatic unit, full digits: exact.
				const text = formatQuantity(value, kind, { significantDigits: 30 });
				const back = parseQuantity(text, kind);
				if (!back.ok || !back.value.eq(value)) return false;
				// Every unit of the kind (degrees, minutes and hours have non-decimal factors: 1e-25 relative).
				for (const unit of unitsFor(kind)) {
					const t = formatQuantity(value, kind, { unit, significantDigits: 35 });
					const b = parseQuantity(t, kind);
					if (!b.ok || b.value.minus(value).abs().div(value).gt('1e-25')) return false;
				}
				return true;
			}),
			{ numRuns: 200 }
		);
	});

	it('round-trips format ∘ parse at the shown digits', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-12, max: 1e12, noNaN: true }), (x) => {
				const text = formatQuantity(x, 'power');
				const again = parseQuantity(text, 'power');
				return again.ok && formatQuantity(again.value, 'power') === text && chooseUnit(again.value, 'power') === again.unit;
			}),
			{ numRuns: 200 }
		);
	});
});

describe('parseFraction: a transmission typed as a fraction, a percentage or an optical density', () => {
	const value = (t: string) => {
		const r = parseFraction(t);
		return r.ok ? r.value.toString() : `refused: ${r.reason}`;
	};
	it('reads a plain fraction as it is', () => {
		expect(value('0.5')).toBe('0.5');
		expect(value(' 1e-4 ')).toBe('0.0001');
		expect(value('1')).toBe('1');
	});
	it('reads a percentage, with or without a space', () => {
		expect(value('1 %')).toBe('0.01');
		expect(value('45%')).toBe('0.45');
		expect(value('0.1 %')).toBe('0.001');
	});
	it('reads an optical density as 10 to the minus OD, exactly', () => {
		expect(value('OD 2')).toBe('0.01');
		expect(value('od4')).toBe('0.0001');
		expect(value('OD 0.3')).toBe(new UnitDecimal(10).pow(-0.3).toString());
		expect(value('OD 0')).toBe('1');
	});
	it('refuses what is none of the three, saying what it takes', () => {
		for (const t of ['', 'half', '0,5', 'OD', '5 W', '% 3', 'OD 2 %'])
			expect(value(t)).toMatch(/^refused: /);
		expect(value('half')).toContain('OD 2');
	});
	it('leaves the 0–1 rule to the engine (a reading outside 0–1 is still a reading)', () => {
		expect(value('150 %')).toBe('1.5');
		expect(value('OD -1')).toBe('10');
	});
});

describe('asEntered: a stored value written back as typed', () => {
	it('writes a readable unit when 12 digits say the value exactly, else every digit in SI', () => {
		expect(asEntered('0.0125', 'power')).toBe('12.5 mW');
		expect(asEntered('5.32e-7', 'wavelength')).toBe('532 nm');
		expect(asEntered(null, 'power')).toBe('');
		expect(asEntered('0.500', null)).toBe('0.5');
		// 0.5° stored in radians to 40 digits (the unit module's precision) comes back as 0.5°.
		expect(asEntered(fromUnit('0.5', '°', 'angle').toString(), 'angle', '°')).toBe('0.5°');
		expect(asEntered('0.000150000000000123', 'radiant_exposure')).toBe('0.000150000000000123 J/m²');
	});
	it('always reads back as the stored value (property)', () => {
		fc.assert(
			fc.property(fc.constantFrom<QuantityKind>('power', 'length', 'time', 'energy', 'wavelength', 'angle', 'irradiance'), fc.bigInt({ min: 1n, max: 10n ** 20n }), fc.integer({ min: -25, max: 3 }), (kind, digits, exp) => {
				const si = new UnitDecimal(digits.toString()).times(new UnitDecimal(10).pow(exp));
				const back = parseQuantity(asEntered(si, kind), kind);
				expect(back.ok && back.value.eq(si)).toBe(true);
			})
		);
	});
});
