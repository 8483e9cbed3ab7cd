import { describe, expect, it } from 'vitest';
import { all, create } from 'mathjs';
import { ELEMENTARY_CHARGE, ENGINE_VERSION, PLANCK_CONSTANT, SPEED_OF_LIGHT } from './constants';
import { joulesToElectronvolts, photonEnergy } from './photon';

const math = create(all);

describe('SI 2019 defining constants', () => {
	it('are the exact defined values', () => {
		// Source: BIPM, The International System of Units (SI brochure, 9th edition, 2019), Table 1 — exact by definition.
		expect(PLANCK_CONSTANT).toBe(6.62607015e-34);
		expect(SPEED_OF_LIGHT).toBe(299792458);
		expect(ELEMENTARY_CHARGE).toBe(1.602176634e-19);
		expect(ENGINE_VERSION).toMatch(/\d+\.\d+\.\d+/);
	});

	it('agree with the physical constants of mathjs', () => {
		// Source: mathjs physical constants (CODATA 2018, which carries the exact SI 2019 values).
		expect(math.planckConstant.toNumber('J s')).toBe(PLANCK_CONSTANT);
		expect(math.speedOfLight.toNumber('m/s')).toBe(SPEED_OF_LIGHT);
		expect(math.elementaryCharge.toNumber('C')).toBe(ELEMENTARY_CHARGE);
	});
});

describe('photon energy E = ħω = h·c/λ', () => {
	const cases: [number, string, number][] = [
		// [wavelength, mathjs unit text, approximate eV (common practice figures)]
		[532e-9, '532 nm', 2.33],
		[1064e-9, '1064 nm', 1.165],
		[10.6e-6, '10.6 um', 0.117]
	];
	for (const [lambda, unitText, approxEv] of cases) {
		it(`at ${unitText} agrees with mathjs, and ħω with h·c/λ`, () => {
			const e = photonEnergy(lambda);
			// Source: mathjs — h·c/λ with its constants and its unit conversion of the wavelength.
			const viaMathjs = math.evaluate(`planckConstant * speedOfLight / (${unitText})`).toNumber('J');
			expect(Math.abs(e - viaMathjs) / viaMathjs).toBeLessThan(1e-15);
			// ħω with ω = 2πc/λ and mathjs's reduced Planck constant: the same energy.
			const hbarOmega = math.reducedPlanckConstant.toNumber('J s') * ((2 * Math.PI * SPEED_OF_LIGHT) / lambda);
			expect(Math.abs(e - hbarOmega) / e).toBeLessThan(1e-14);
			// eV via the exact elementary charge (mathjs's 'eV' unit still uses a CODATA 2010 value).
			const ev = joulesToElectronvolts(e);
			expect(Math.abs(ev - viaMathjs / ELEMENTARY_CHARGE) / ev).toBeLessThan(1e-15);
			// Common practice: ≈ 2.33 eV at 532 nm, ≈ 1.165 eV at 1064 nm, ≈ 0.117 eV at 10.6 µm.
			expect(ev).toBeCloseTo(approxEv, approxEv > 2 ? 2 : 3);
		});
	}

	it('gives photon flux P/E: 1 W at 532 nm is about 2.678e18 photons per second', () => {
		// Hand arithmetic: 1 / 3.7339e-19 J.
		expect(1 / photonEnergy(532e-9)).toBeCloseTo(2.67815e18, -14);
	});
});
