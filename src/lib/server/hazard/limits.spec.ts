import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Dec } from './constants';
import { limitApplies, limitInMeasure, limitValueAt, powPositive } from './limits';
import { EYE_VISIBLE, EYE_VISIBLE_PULSE } from './fixtures';
import { validate, type NormLimit } from './validate';
import type { LimitInput } from './types';

function norm(l: LimitInput): NormLimit {
	const v = validate({ line: { wavelength: '532e-9', mode: 'continuous', power: 1, beamDiameter: 1e-3, beamDiameterDefinition: '1/e', divergence: 0, divergenceDefinition: '1/e' }, points: [], limits: [l] });
	if (!v.ok) throw new Error(JSON.stringify(v.errors.items));
	return v.input.limits[0];
}

describe('exposure limits', () => {
	it('evaluates k·tⁿ; quarter exponents agree with the general power', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-13, max: 3e4, noNaN: true }), fc.integer({ min: -12, max: 12 }), (t, q) => {
				const x = new Dec(t);
				const y = new Dec(q).div(4);
				return powPositive(x, y).minus(x.pow(y)).abs().div(x.pow(y)).lt('1e-28');
			}),
			{ numRuns: 200 }
		);
		expect(powPositive(new Dec(2), new Dec('0.3')).minus(new Dec(2).pow('0.3')).abs().lt('1e-35')).toBe(true);
	});

	it('gives the visible 0.25 s value of 18·t^0.75 J/m² (common practice: ≈ 2.5 mW/cm² at the aversion response)', () => {
		// Limit shape 18·t^0.75 J/m² for 400–700 nm (ICNIRP 2013 guidelines / ANSI Z136.1; from memory).
		// At t = 0.25 s (aversion response, common practice): H = 6.364 J/m², E = H/t = 25.46 W/m² = 2.546 mW/cm².
		const l = norm(EYE_VISIBLE);
		const t = new Dec('0.25');
		expect(limitValueAt(l, t).toNumber()).toBeCloseTo(6.36396, 5);
		expect(limitInMeasure(l, t, 'irradiance').toNumber()).toBeCloseTo(25.4558, 4);
		expect(limitInMeasure(l, t, 'irradiance').div(10).toNumber()).toBeCloseTo(2.546, 3); // mW/cm²
		// Converting back at the same t: H = E·t.
		expect(limitInMeasure(l, t, 'radiant_exposure').eq(limitValueAt(l, t))).toBe(true);
	});

	it('applies on inclusive wavelength and duration ranges, by tissue and pulse basis', () => {
		const l = norm(EYE_VISIBLE);
		const q = { tissue: 'eye' as const, wavelength: new Dec('400e-9'), basis: 'continuous' as const, duration: new Dec('10') };
		expect(limitApplies(l, q)).toBe(true);
		expect(limitApplies(l, { ...q, wavelength: new Dec('700e-9'), duration: new Dec('18e-6') })).toBe(true);
		expect(limitApplies(l, { ...q, wavelength: new Dec('700.000001e-9') })).toBe(false);
		expect(limitApplies(l, { ...q, duration: new Dec('10.000001') })).toBe(false);
		expect(limitApplies(l, { ...q, tissue: 'skin' })).toBe(false);
		expect(limitApplies(l, { ...q, basis: 'single_pulse' })).toBe(false);
		const p = norm(EYE_VISIBLE_PULSE);
		expect(limitApplies(p, { ...q, basis: 'single_pulse', duration: new Dec('1e-8'), needsTrainExponent: true })).toBe(true);
		expect(limitApplies(norm({ ...EYE_VISIBLE_PULSE, pulseTrainExponent: null }), { ...q, basis: 'single_pulse', duration: new Dec('1e-8'), needsTrainExponent: true })).toBe(false);
	});
});
