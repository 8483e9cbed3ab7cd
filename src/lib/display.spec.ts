import { describe, expect, it } from 'vitest';
import { exposure, num, od, qty, ratio } from './display';

describe('numbers for people', () => {
	it('write 3 significant figures, 4 for wavelengths', () => {
		expect(num(0.123456)).toBe('0.123');
		expect(num(70.7184)).toBe('70.7');
		expect(num(3.7339e-19)).toBe('3.73 × 10⁻¹⁹');
		expect(num(2.678e18)).toBe('2.68 × 10¹⁸');
		expect(qty(5.32e-7, 'wavelength')).toBe('532 nm');
		expect(qty(1.0642e-6, 'wavelength')).toBe('1064 nm');
		expect(qty(0.0123456, 'power')).toBe('12.3 mW');
	});

	it('round toward the safe side where the written number is compared: exposure up, limit down, OD up', () => {
		expect(num(25.4558, 3, 'down')).toBe('25.4');
		expect(num(25.4111, 3, 'up')).toBe('25.5');
		expect(od(4.7157)).toBe('4.72');
		expect(od(3)).toBe('3');
		const e = exposure(25.4111, 'W/m²', 'up');
		expect(e.si).toBe('25.5 W/m²');
		expect(e.customary).toBe('0.00255 W/cm²');
		expect(qty(70.711, 'length', { toward: 'up' })).toBe('70.8 m');
	});

	it('never show a ratio below the limit as 1.00 or more, and a ratio at the limit (from 1 − 1e-9) as at least 1.00', () => {
		expect(ratio(0.9996)).toBe('0.9996');
		expect(ratio(0.99999)).toBe('0.99999');
		expect(ratio(0.5)).toBe('0.5');
		expect(ratio(0.12341)).toBe('0.124');
		expect(ratio(1 - 5e-10)).toBe('1');
		expect(ratio(1)).toBe('1');
		expect(ratio(1.0001)).toBe('1.01');
		expect(ratio(51969.3)).toBe('52000');
		expect(ratio(1.6e7)).toBe('1.6 × 10⁷');
		expect(ratio(null)).toBe('—');
	});

	it('write a missing or non-finite value as a dash, never as a number', () => {
		expect(num(null)).toBe('—');
		expect(num(Number.NaN)).toBe('—');
		expect(num(Number.POSITIVE_INFINITY)).toBe('—');
		expect(qty(null, 'length')).toBe('—');
	});
});
