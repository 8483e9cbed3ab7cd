import { describe, expect, it } from 'vitest';
import { all, create } from 'mathjs';
import { Dec, ELEMENTARY_CHARGE, ENGINE_VERSION, PLANCK_CONSTANT, PLANCK_TIMES_C, SPEED_OF_LIGHT, WORKING_PRECISION } from './constants';
import { joulesToElectronvolts, photonCount, photonEnergy } from './photon';

const math = create(all);

describe('SI 2019 defining constants', () => {
	it('are the exact defined values', () => {
		// Source: BIPM, The International System of Units (SI brochure, 9th edition, 2019), Table 1 — exact by definition.
		expect(PLANCK_CONSTANT.toString()).toBe('6.62607015e-34');
		expect(SPEED_OF_LIGHT.toString()).toBe('299792458');
		expect(ELEMENTARY_CHARGE.toString()).toBe('1.602176634e-19');
	});

	it('agree with the physical constants of mathjs', () => {
		// Source: mathjs physical constants (CODATA 2018, which carries the exact SI 2019 values).
		expect(math.planckConstant.toNumber('J s')).toBe(PLANCK_CONSTANT.toNumber());
		expect(math.speedOfLight.toNumber('m/s')).toBe(SPEED_OF_LIGHT.toNumber());
		expect(math.elementaryCharge.toNumber('C')).toBe(ELEMENTARY_CHARGE.toNumber());
	});

	it('works at a precision of at least 40 digits and carries a version', () => {
		expect(WORKING_PRECISION).toBeGreaterThanOrEqual(40);
		expect(Dec.precision).toBe(WORKING_PRECISION);
		expect(ENGINE_VERSION).toMatch(/\d+\.\d+\.\d+/);
	});
});

describe('photon energy E = h·c/λ', () => {
	const cases: [string, string, number][] = [
		// [wavelength, mathjs unit text, approximate eV (common practice figures)]
		['532e-9', '532 nm', 2.33],
		['1064e-9', '1064 nm', 1.165],
		['10.6e-6', '10.6 um', 0.117]
	];
	for (const [lambda, unitText, approxEv] of cases) {
		it(`at ${unitText} agrees with mathjs`, () => {
			const e = photonEnergy(new Dec(lambda));
			// Source: mathjs — h·c/λ with its constants and its unit conversion of the wavelength.
			const viaMathjs = math.evaluate(`planckConstant * speedOfLight / (${unitText})`).toNumber('J');
			expect(Math.abs(e.toNumber() - viaMathjs) / viaMathjs).toBeLessThan(1e-15);
			// eV via the exact elementary charge. (The mathjs 'eV' unit still uses 1.602176565e-19 J, a
			// CODATA 2010 value, so it is not used for this comparison.)
			const ev = joulesToElectronvolts(e).toNumber();
			expect(Math.abs(ev - viaMathjs / math.elementaryCharge.toNumber('C'))).toBeLessThan(1e-14);
			// Common practice: ≈ 2.33 eV at 532 nm, ≈ 1.165 eV at 1064 nm, ≈ 0.117 eV at 10.6 µm.
			expect(ev).toBeCloseTo(approxEv, approxEv > 2 ? 2 : 3);
		});
	}

	it('uses the exact product h·c', () => {
		// 6.62607015e-34 × 299792458 = 1.98644585714892870e-25 exactly (multiplied out independently).
		expect(PLANCK_TIMES_C.toString()).toBe('1.9864458571489287e-25');
		// λ·E recovers h·c to the working precision.
		const e = photonEnergy(new Dec('532e-9'));
		expect(e.times('532e-9').minus(PLANCK_TIMES_C).abs().div(PLANCK_TIMES_C).lt('1e-38')).toBe(true);
	});

	it('gives photon flux P/E and photons per pulse Q/E', () => {
		const e = photonEnergy(new Dec('532e-9'));
		// 1 W at 532 nm ≈ 2.678e18 photons/s (hand arithmetic: 1 / 3.7339e-19).
		expect(photonCount(new Dec(1), e).toNumber()).toBeCloseTo(2.678150e18, -13);
		expect(photonCount(new Dec('1e-3'), e).toNumber()).toBeCloseTo(2.678150e15, -10);
	});
});
