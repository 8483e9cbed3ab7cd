import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { assess } from './assess';
import { Dec, ENGINE_VERSION } from './constants';
import { requiredOpticalDensity } from './density';
import { DEMO_LIMITS, EYE_1064_PULSE, EYE_VISIBLE, EYE_VISIBLE_PULSE, SKIN_LONG, cwLine, eyePoint, scenario } from './fixtures';
import type { AssessmentInput, AssessmentResult, LimitInput } from './types';

function run(input: AssessmentInput): AssessmentResult {
	const out = assess(input);
	if (!out.ok) throw new Error(JSON.stringify(out.errors));
	return out.result;
}
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

/** Visible limit at 0.25 s as an irradiance: 18·0.25^0.75 / 0.25 W/m² (shape from ICNIRP 2013 / ANSI Z136.1; from memory). */
const EL_VIS_025 = (18 * 0.25 ** 0.75) / 0.25; // 25.4558 W/m² = 2.546 mW/cm²

describe('irradiance and averaging', () => {
	it('averages over max(D, D_f): the 7 mm eye aperture for a small beam (common practice, 400–1400 nm)', () => {
		// Common practice: 7 mm limiting aperture for the eye from 400 to 1400 nm; conservative averaging over max(D, D_f).
		const r = run(scenario({ points: [eyePoint('p', '0')] }));
		const c = r.points[0].checks[0].comparisons[0];
		expect(c.averagingDiameter).toBe('0.007');
		// E = P/(π·D_f²/4) = 0.1/(π·0.007²/4) = 2598.4 W/m²; H = E·T (hand arithmetic).
		const e = 0.1 / ((Math.PI * 0.007 ** 2) / 4);
		expect(rel(Number(c.exposure), e * 0.25)).toBeLessThan(1e-11);
		expect(rel(Number(c.limitValue), 18 * 0.25 ** 0.75)).toBeLessThan(1e-11);
		// Unaveraged beam irradiance uses the 1/e diameter: P/(π·D²/4) (= peak irradiance of a Gaussian).
		expect(rel(Number(r.points[0].irradiance), 0.1 / ((Math.PI * 0.001 ** 2) / 4))).toBeLessThan(1e-11);
	});

	it('averages over the beam itself when the beam is larger than D_f', () => {
		const r = run(scenario({ line: cwLine({ beamDiameter: '0.02' }), points: [eyePoint('p', '0')] }));
		expect(r.points[0].checks[0].comparisons[0].averagingDiameter).toBe('0.02');
	});

	it('reports photon flux density = irradiance / photon energy', () => {
		const r = run(scenario());
		const p = r.points[0];
		expect(rel(Number(p.photonFluxDensity), Number(p.irradiance) / Number(r.line.photonEnergy))).toBeLessThan(1e-11);
		expect(rel(Number(r.line.photonFlux), 0.1 / Number(r.line.photonEnergy))).toBeLessThan(1e-11);
	});
});

describe('NOHD', () => {
	it('follows the closed form √(4P/(π·EL) − D₀²)/φ; the linear handbook form is also given', () => {
		// Formula: OSHA Technical Manual Sec. III Ch. 6 gives the linear form NOHD = (1/φ)·[(4P/(π·MPE))^½ − a]
		// (from memory). Beam: 100 mW argon-ion, 1 mm at the aperture, as in Example 1 of the UK university
		// guidance "Guide to calculating nominal optical hazard distance (NOHD)"; that guide's divergence and
		// result were not retrieved, so φ = 1 mrad is assumed here and the figures are hand arithmetic.
		// EL at 0.25 s (aversion response, common practice). The example is near-field enough for the two
		// forms to differ by 1.4 %: closed form 70.72 m, linear form 69.72 m.
		const r = run(scenario());
		const dc = Math.sqrt((4 * 0.1) / (Math.PI * EL_VIS_025));
		expect(rel(Number(r.nohd.distance), Math.sqrt(dc * dc - 1e-6) / 1e-3)).toBeLessThan(1e-9); // ≈ 70.72 m
		expect(rel(Number(r.nohd.linearFormDistance), (dc - 1e-3) / 1e-3)).toBeLessThan(1e-9); // ≈ 69.72 m
		expect(Number(r.nohd.distance)).toBeCloseTo(70.72, 2);
		expect(r.nohd.status).toBe('finite');
		expect(r.nohd.decidingLimit).toEqual({ id: 'eye-vis', version: '3' });
	});

	it('is about 225 m for 1 W at 1 mrad in the visible (published figure)', () => {
		// Source: a public laser-display safety handbook page, "Nominal Ocular Hazard Distance – NOHD"
		// (online flipbook), states ≈ 225 m for a 1 W laser with 1 mrad divergence. Its MPE is not given there; with the 0.25 s
		// visible limit of 25.46 W/m² the closed form gives 223.6 m, and with 2.5 mW/cm² (common
		// practice rounding) 225.7 m. The published figure is rounded: tolerance 1 %.
		// The text gives no aperture diameter. With D₀ = 1 mm the closed form gives 223.6 m (−0.6 %) and
		// the linear form (D_c − D₀)/φ 222.6 m (−1.05 %); with D₀ → 0 both tend to D_c/φ = 223.7 m, so
		// the figure cannot tell the two forms apart: it is a far-field value.
		const r = run(scenario({ line: cwLine({ power: '1', beamDiameter: '1e-3' }) }));
		expect(rel(Number(r.nohd.distance), 225)).toBeLessThan(0.01);
		expect(rel(Number(r.nohd.linearFormDistance), 225)).toBeLessThan(0.015);
		const tiny = run(scenario({ line: cwLine({ power: '1', beamDiameter: '1e-6' }) }));
		expect(rel(Number(tiny.nohd.distance), Number(tiny.nohd.linearFormDistance))).toBeLessThan(1e-5);
	});

	it('is 0 when the beam is below the limit at the aperture', () => {
		const r = run(scenario({ line: cwLine({ power: '1e-4' }) }));
		expect(r.nohd.distance).toBe('0');
		expect(r.nohd.status).toBe('finite');
	});

	it('is unbounded for a collimated beam that exceeds the limit, and never divides by zero', () => {
		const r = run(scenario({ line: cwLine({ divergence: '0' }) }));
		expect(r.nohd.unbounded).toBe(true);
		expect(r.nohd.status).toBe('unbounded');
		expect(r.nohd.distance).toBeNull();
		expect(r.nohd.reason).toMatch(/unbounded/);
		// A collimated beam that is safe at the aperture is safe everywhere: 0, not unbounded.
		const weak = run(scenario({ line: cwLine({ divergence: '0', power: '1e-5' }) }));
		expect(weak.nohd.distance).toBe('0');
	});

	it('needs the exposure duration and says so (incomplete, never a distance)', () => {
		const r = run(scenario({ nohd: null }));
		expect(r.nohd.status).toBe('incomplete');
		expect(r.nohd.reason).toContain('nohd.exposureDuration');
		expect(r.nohd.distance).toBeNull();
	});

	it('has no applicable limit outside the entered wavelengths', () => {
		const r = run(scenario({ line: cwLine({ wavelength: '1550e-9' }) }));
		expect(r.nohd.status).toBe('no_applicable_limit');
		expect(r.nohd.distance).toBeNull();
	});

	it('uses the worst of the applicable checks for a pulsed line (pulse energy with the single-pulse limit)', () => {
		const line = cwLine({ mode: 'repetitive', power: null, pulseEnergy: '1e-3', pulseDuration: '10e-9', repetitionRate: '1000' });
		const r = run(scenario({ line }));
		const kinds = r.nohd.candidates.map((c) => c.check).sort();
		expect(kinds).toEqual(['average_power', 'pulse_train', 'single_pulse']);
		const max = Math.max(...r.nohd.candidates.map((c) => Number(c.distance)));
		expect(Number(r.nohd.distance)).toBe(max);
		// Single pulse by hand: D_c = √(4Q/(π·H_lim)) with H_lim = 5e-3 J/m²; pulse train H_lim × 250^−0.25.
		const sp = r.nohd.candidates.find((c) => c.check === 'single_pulse')!;
		expect(rel(Number(sp.criticalDiameter), Math.sqrt((4 * 1e-3) / (Math.PI * 5e-3)))).toBeLessThan(1e-11);
		const train = r.nohd.candidates.find((c) => c.check === 'pulse_train')!;
		expect(rel(Number(train.criticalDiameter), Math.sqrt((4 * 1e-3) / (Math.PI * 5e-3 * 250 ** -0.25)))).toBeLessThan(1e-11);
		expect(r.nohd.decidingCheck).toBe('pulse_train');
	});

	it('at the NOHD the exposure equals the limit within 0.1 % (property)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0.01, max: 10, noNaN: true }),
				fc.double({ min: 0.5e-3, max: 5e-3, noNaN: true }),
				fc.double({ min: 0.2e-3, max: 5e-3, noNaN: true }),
				(power, d0, phi) => {
					const line = cwLine({ power: String(power), beamDiameter: String(d0), divergence: String(phi) });
					const first = run(scenario({ line, limits: [EYE_VISIBLE] }));
					const nohd = first.nohd.distance!;
					if (Number(nohd) === 0) return true;
					const at = run(scenario({ line, limits: [EYE_VISIBLE], points: [eyePoint('edge', nohd)] }, [{ kind: 'propagate', length: nohd }]));
					return Math.abs(Number(at.points[0].worstRatio) - 1) < 1e-3;
				}
			),
			{ numRuns: 200 }
		);
	});

	it('after a lens is measured from the focus with the post-focus divergence', () => {
		// ANSI Z136.1 lens-on-laser form (from memory): r = (f/b)·√(4P/(π·MPE)), b the beam diameter at the lens;
		// the closed form here also keeps the diffraction-limited spot: √(D_c² − d₀²)/(D_lens/f).
		const elements = [{ kind: 'lens' as const, focalLength: '0.2' }, { kind: 'propagate' as const, length: '10' }];
		const r = run(scenario({ line: cwLine({ power: '1', beamDiameter: '5e-3', divergence: '0.5e-3' }) }, elements));
		const lens = r.lensNohd[0];
		const dc = Math.sqrt((4 * 1) / (Math.PI * EL_VIS_025));
		expect(rel(Number(lens.handbookFormDistance), (0.2 / 5e-3) * dc)).toBeLessThan(1e-9); // ≈ 8.94 m
		const d0 = Number(lens.focalSpotDiameter);
		expect(rel(Number(lens.distance), Math.sqrt(dc * dc - d0 * d0) / (5e-3 / 0.2))).toBeLessThan(1e-9);
		expect(lens.focusPosition).toBe('0.2');
		expect(lens.divergenceAfterFocus).toBe('0.025');
	});
});

describe('diffuse reflection', () => {
	it('irradiance ρ·P·cosθ/(π·r²) and hazard distance √(ρ·P·cosθ/(π·EL))', () => {
		// Formulas: OSHA Technical Manual Sec. III Ch. 6 / ANSI Z136.1 diffuse-reflection NHZ (from memory).
		const p = { ...eyePoint('wall', '5'), kind: 'diffuse' as const, reflectance: '0.9', viewingAngle: '0.5', viewingDistance: '0.3' };
		const r = run(scenario({ line: cwLine({ power: '5' }), points: [p] }));
		const pt = r.points[0];
		const e = (0.9 * 5 * Math.cos(0.5)) / (Math.PI * 0.3 ** 2);
		expect(rel(Number(pt.irradiance), e)).toBeLessThan(1e-11);
		const rh = Math.sqrt((0.9 * 5 * Math.cos(0.5)) / (Math.PI * EL_VIS_025));
		expect(rel(Number(pt.diffuseHazardDistance!.distance), rh)).toBeLessThan(1e-11); // ≈ 0.207 m
		// Consistency: at r the exposure ratio is (r_h/r)².
		expect(rel(Number(pt.worstRatio), (rh / 0.3) ** 2)).toBeLessThan(1e-10);
		// No aperture averaging for a diffuse reflection.
		expect(pt.checks[0].comparisons[0].averagingDiameter).toBeNull();
	});

	it('is incomplete without reflectance or viewing distance', () => {
		const p = { ...eyePoint('wall', '5'), kind: 'diffuse' as const };
		const r = run(scenario({ points: [p] }));
		expect(r.points[0].verdict).toBe('incomplete');
		expect(r.points[0].missing).toEqual(['points.0.reflectance', 'points.0.viewingDistance']);
		expect(r.verdict).toBe('incomplete');
	});
});

describe('optical density', () => {
	it('OD = log₁₀(H/MPE), rounded up to a tenth and to the next whole number', () => {
		// Formula OD = log₁₀(H₀/MPE): OSHA Technical Manual Sec. III Ch. 6 (from memory); common practice.
		// Hand arithmetic: Q-switched 1064 nm, 100 mJ, 10 ns, 3 mm beam at the aperture, 7 mm aperture,
		// single-pulse limit 0.05 J/m² (5 µJ/cm², from memory): H = 0.1/(π·0.007²/4) = 2598.4 J/m²,
		// ratio 51 969, OD 4.716 → 4.8 → 5.
		const line = cwLine({ wavelength: '1064e-9', mode: 'single_pulse', power: null, pulseEnergy: '0.1', pulseDuration: '10e-9', beamDiameter: '3e-3' });
		const r = run(scenario({ line, points: [eyePoint('exit', '0')] }));
		const h = 0.1 / ((Math.PI * 0.007 ** 2) / 4);
		expect(rel(Number(r.points[0].worstRatio), h / 0.05)).toBeLessThan(1e-11);
		expect(rel(Number(r.requiredOpticalDensity!.value), Math.log10(h / 0.05))).toBeLessThan(1e-11);
		expect(r.requiredOpticalDensity!.roundedUpTenth).toBe('4.8');
		expect(r.requiredOpticalDensity!.roundedUpWhole).toBe('5');
	});

	it('is 0 when within the limit, and an exact power of ten needs no extra OD', () => {
		const r = run(scenario({ line: cwLine({ power: '1e-6' }) }));
		expect(r.requiredOpticalDensity).toEqual({ value: '0', roundedUpTenth: '0', roundedUpWhole: '0' });
		// An exact power of ten needs exactly that OD, and anything above needs the next one.
		const at = (x: string) => requiredOpticalDensity(new Dec(x));
		expect(at('1000').roundedUpWhole.toString()).toBe('3');
		expect(at('1000').value.toString()).toBe('3');
		expect(at('1000.000001').roundedUpWhole.toString()).toBe('4');
		expect(at('1000.000001').roundedUpTenth.toString()).toBe('3.1');
		expect(at('1').roundedUpWhole.toString()).toBe('0');
	});
});

describe('verdicts', () => {
	it('reports every comparison; the most restrictive applicable limit decides', () => {
		const stricter: LimitInput = { ...EYE_VISIBLE, id: 'eye-vis-strict', k: '9' };
		const r = run(scenario({ limits: [EYE_VISIBLE, stricter] }));
		const check = r.points[0].checks[0];
		expect(check.comparisons).toHaveLength(2);
		expect(check.decidingLimit?.id).toBe('eye-vis-strict');
		expect(check.comparisons.filter((c) => c.deciding).map((c) => c.limit.id)).toEqual(['eye-vis-strict']);
		expect(r.limitsUsed.map((l) => l.id).sort()).toEqual(['eye-vis', 'eye-vis-strict']);
	});

	it('no applicable limit is never within limit', () => {
		const r = run(scenario({ line: cwLine({ wavelength: '1550e-9', power: '1e-9' }) }));
		expect(r.points[0].verdict).toBe('no_applicable_limit');
		expect(r.verdict).toBe('no_applicable_limit');
		expect(r.reason).toMatch(/Not shown as safe/);
		const none = run(scenario({ limits: [] }));
		expect(none.verdict).toBe('no_applicable_limit');
		expect(none.limitsUsed).toEqual([]);
		// A repetitive line whose single-pulse check has no limit cannot be within limit either.
		const rep = cwLine({ mode: 'repetitive', power: null, pulseEnergy: '1e-9', pulseDuration: '1e-3', repetitionRate: '10' });
		const partial = run(scenario({ line: rep, limits: [EYE_VISIBLE] }));
		expect(partial.points[0].checks.find((c) => c.kind === 'average_power')?.verdict).toBe('within_limit');
		expect(partial.points[0].verdict).toBe('no_applicable_limit');
	});

	it('points inside an enclosure are reported but excluded from the verdict, the worst point and the OD', () => {
		const elements = [{ kind: 'enclosure' as const, length: '2' }, { kind: 'transmission' as const, transmission: '1e-9' }, { kind: 'propagate' as const, length: '3' }];
		const r = run(scenario({ line: cwLine({ power: '5' }), points: [eyePoint('inside', '1'), eyePoint('outside', '4')] }, elements));
		const [inside, outside] = r.points;
		expect(inside.accessible).toBe(false);
		expect(inside.enclosedBy).toBe(0);
		expect(inside.verdict).toBe('exceeds_limit');
		expect(outside.verdict).toBe('within_limit');
		expect(r.verdict).toBe('within_limit');
		expect(r.worstPointId).toBe('outside');
		expect(r.requiredOpticalDensity?.roundedUpWhole).toBe('0');
		// With no accessible point at all the assessment is not within limit.
		const only = run(scenario({ line: cwLine({ power: '5' }), points: [eyePoint('inside', '1')] }, elements));
		expect(only.verdict).toBe('incomplete');
		expect(only.worstPointId).toBeNull();
	});

	it('missing exposure duration makes the point incomplete with the field named; precedence exceeds > incomplete > no limit > within', () => {
		const r = run(scenario({ points: [eyePoint('a', '5', { exposureDuration: null }), eyePoint('b', '5', { exposureDuration: '0.25', tissue: 'skin' })] }));
		expect(r.points[0].verdict).toBe('incomplete');
		expect(r.points[0].missing).toEqual(['points.0.exposureDuration']);
		expect(r.points[1].verdict).toBe('no_applicable_limit'); // skin limit starts at 10 s
		expect(r.verdict).toBe('incomplete');
		const withExceed = run(scenario({ points: [eyePoint('a', '5', { exposureDuration: null }), eyePoint('c', '0')] }));
		expect(withExceed.verdict).toBe('exceeds_limit');
		expect(withExceed.worstPointId).toBe('c');
	});

	it('repetitive lines get single-pulse, average-power and pulse-train checks; the worst ratio decides', () => {
		const line = cwLine({ mode: 'repetitive', power: null, pulseEnergy: '1e-6', pulseDuration: '10e-9', repetitionRate: '1000' });
		const r = run(scenario({ line, points: [eyePoint('p', '10')] }));
		const checks = r.points[0].checks;
		expect(checks.map((c) => c.kind)).toEqual(['single_pulse', 'average_power', 'pulse_train']);
		const train = checks[2].comparisons[0];
		expect(train.pulseCount).toBe('250'); // N = f·T = 1000 Hz × 0.25 s
		expect(rel(Number(train.trainFactor), 250 ** -0.25)).toBeLessThan(1e-11);
		expect(rel(Number(train.limitValue), 5e-3 * 250 ** -0.25)).toBeLessThan(1e-11);
		const worst = Math.max(...checks.map((c) => Number(c.ratio)));
		expect(Number(r.points[0].worstRatio)).toBe(worst);
		expect(r.line.averagePower).toBe('0.001');
		expect(r.line.peakPower).toBe('100');
		// Single-pulse check uses t = τ; average-power check uses t = T.
		expect(checks[0].duration).toBe('1e-8');
		expect(checks[1].duration).toBe('0.25');
	});

	it('a single pulse gets only the single-pulse check; a continuous line only the continuous check', () => {
		const sp = run(scenario({ line: cwLine({ mode: 'single_pulse', power: null, pulseEnergy: '1e-6', pulseDuration: '10e-9' }) }));
		expect(sp.points[0].checks.map((c) => c.kind)).toEqual(['single_pulse']);
		expect(sp.points[0].power).toBeNull();
		const cw = run(scenario());
		expect(cw.points[0].checks.map((c) => c.kind)).toEqual(['continuous']);
	});

	it('converts an irradiance limit for a pulse at t = τ (E = H/τ)', () => {
		const irr: LimitInput = { ...EYE_VISIBLE_PULSE, id: 'irr', quantity: 'irradiance', k: '5e5', pulseTrainExponent: null };
		const line = cwLine({ mode: 'single_pulse', power: null, pulseEnergy: '1e-6', pulseDuration: '10e-9' });
		const r = run(scenario({ line, limits: [irr], points: [eyePoint('p', '0')] }));
		const c = r.points[0].checks[0].comparisons[0];
		const h = 1e-6 / ((Math.PI * 0.007 ** 2) / 4);
		expect(c.unit).toBe('W/m²');
		expect(rel(Number(c.exposure), h / 10e-9)).toBeLessThan(1e-11);
	});

	it('uses skin limits for skin points', () => {
		const r = run(scenario({ line: cwLine({ power: '1' }), points: [eyePoint('hand', '1', { tissue: 'skin', exposureDuration: '100' })] }));
		expect(r.points[0].checks[0].decidingLimit?.id).toBe(SKIN_LONG.id);
		// 3.5 mm skin aperture (common practice, from memory): E = 1/(π·0.0035²/4) = 1.04e5 W/m² vs 2000 W/m².
		expect(rel(Number(r.points[0].worstRatio), 1 / ((Math.PI * 0.0035 ** 2) / 4) / 2000)).toBeLessThan(1e-11);
	});

	it('carries the engine version and the id and version of every limit used', () => {
		const r = run(scenario());
		expect(r.engineVersion).toBe(ENGINE_VERSION);
		expect(r.limitsUsed).toEqual([{ id: 'eye-vis', version: '3' }]);
		expect(r.limitsConsidered).toHaveLength(DEMO_LIMITS.length);
		expect(r.caution).toMatch(/LSO/);
	});
});

describe('properties', () => {
	it('exposure grows with power', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-4, max: 100, noNaN: true }), fc.double({ min: 1.001, max: 100, noNaN: true }), fc.double({ min: 0, max: 10, noNaN: true }), (p, factor, z) => {
				const at = (power: number) => run(scenario({ line: cwLine({ power: String(power) }), points: [eyePoint('p', z.toFixed(6))] })).points[0];
				const a = at(p);
				const b = at(p * factor);
				return Number(b.worstRatio) > Number(a.worstRatio) && Number(b.irradiance) > Number(a.irradiance);
			}),
			{ numRuns: 100 }
		);
	});

	it('exposure falls with distance for a diverging beam', () => {
		fc.assert(
			fc.property(fc.double({ min: 0, max: 50, noNaN: true }), fc.double({ min: 0.01, max: 50, noNaN: true }), fc.double({ min: 1e-5, max: 1e-2, noNaN: true }), (z, dz, phi) => {
				const r = run(scenario({ line: cwLine({ divergence: String(phi) }), points: [eyePoint('near', z.toFixed(6)), eyePoint('far', (z + dz).toFixed(6))] }, [{ kind: 'propagate', length: '200' }]));
				const [near, far] = r.points;
				return Number(far.irradiance) < Number(near.irradiance) && Number(far.worstRatio) <= Number(near.worstRatio);
			}),
			{ numRuns: 100 }
		);
	});

	it('never throws and never returns NaN or Infinity, whatever the input', () => {
		fc.assert(
			fc.property(fc.anything(), (junk) => {
				const out = assess(junk as AssessmentInput);
				return out.ok === false && out.errors.length > 0;
			}),
			{ numRuns: 200 }
		);
		const numberish = fc.oneof(fc.double(), fc.constantFrom('1e-3', '0', '-1', 'abc', '1e400', '', 'Infinity'), fc.constant(null));
		fc.assert(
			fc.property(numberish, numberish, numberish, numberish, numberish, (power, d, phi, z, t) => {
				const out = assess(scenario({ line: cwLine({ power: power as never, beamDiameter: d as never, divergence: phi as never }), points: [eyePoint('p', z as never, { exposureDuration: t as never })] }, [{ kind: 'propagate', length: '1e6' }]));
				const text = JSON.stringify(out);
				return !/NaN|Infinity/.test(text.replace(/"reason":"[^"]*"/g, '')) && (out.ok || out.errors.every((e) => e.field.length > 0));
			}),
			{ numRuns: 200 }
		);
	});

	it('results are plain JSON data (round-trip identical)', () => {
		const line = cwLine({ mode: 'repetitive', power: null, pulseEnergy: '1e-3', pulseDuration: '10e-9', repetitionRate: '1000' });
		const r = run(scenario({ line, points: [eyePoint('a', '1'), { ...eyePoint('b', '2'), kind: 'diffuse', reflectance: '0.5', viewingDistance: '1' }] }, [{ kind: 'propagate', length: '3' }, { kind: 'lens', focalLength: '0.1' }]));
		expect(JSON.parse(JSON.stringify(r))).toEqual(r);
	});
});

describe('extreme values', () => {
	it('handles very small and very large magnitudes without losing the verdict', () => {
		const r = run(scenario({ line: cwLine({ power: '1e-15', beamDiameter: '1e-6', divergence: '1e-9' }), limits: [EYE_VISIBLE, EYE_1064_PULSE] }));
		expect(r.points[0].verdict).toBe('within_limit');
		const big = run(scenario({ line: cwLine({ power: '1e9', wavelength: '1e-3', divergence: '1' }), points: [eyePoint('p', '1e9')] }, [{ kind: 'propagate', length: '1e9' }]));
		expect(big.points[0].verdict).toBe('no_applicable_limit');
	});
});
