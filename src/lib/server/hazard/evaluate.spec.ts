import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from './evaluate';
import { ENGINE_VERSION } from './constants';
import { DEMO_LIMITS, EYE_1064_LONG, EYE_1064_PULSE, EYE_VISIBLE, EYE_VISIBLE_PULSE, SKIN_LONG, cwLine, el, eyePoint, free, pulsedLine, run, scenario } from './fixtures';
import type { LimitSI } from '$lib/schemas/assessment';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
const area = (d: number) => (Math.PI * d * d) / 4;

/** Visible limit at 0.25 s as an irradiance: 18·0.25^0.75 / 0.25 W/m² (shape from ICNIRP 2013 / ANSI Z136.1; from memory). */
const EL_VIS_025 = (18 * 0.25 ** 0.75) / 0.25; // 25.4558 W/m² = 2.546 mW/cm²

describe('irradiance and averaging', () => {
	it('averages over max(D, D_f): the 7 mm eye aperture for a small beam (common practice, 400–1400 nm)', () => {
		const r = run(scenario({ points: [eyePoint('p', '0')] }));
		const c = r.points[0].lines[0].checks[0].comparisons[0];
		expect(c.averagingDiameter).toBe(0.007);
		// E = P/(π·D_f²/4) = 0.1/(π·0.007²/4) = 2598.4 W/m²; H = E·T (hand arithmetic).
		expect(rel(c.exposure, (0.1 / area(0.007)) * 0.25)).toBeLessThan(1e-14);
		expect(rel(c.limitValue!, 18 * 0.25 ** 0.75)).toBeLessThan(1e-14);
		// Unaveraged beam irradiance uses the 1/e diameter: P/(π·D²/4) (= peak irradiance of a Gaussian).
		expect(rel(r.points[0].lines[0].irradiance!, 0.1 / area(0.001))).toBeLessThan(1e-14);
	});

	it('averages over the beam itself when the beam is larger than D_f', () => {
		const r = run(scenario({ line: cwLine({ beamDiameter: '0.02' }), points: [eyePoint('p', '0')] }));
		expect(r.points[0].lines[0].checks[0].comparisons[0].averagingDiameter).toBe(0.02);
	});

	it('reports photon flux density = irradiance / photon energy', () => {
		const r = run(scenario());
		const p = r.points[0].lines[0];
		expect(rel(p.photonFluxDensity!, p.irradiance! / r.lines[0].photonEnergy)).toBeLessThan(1e-15);
		expect(rel(r.lines[0].photonFlux!, 0.1 / r.lines[0].photonEnergy)).toBeLessThan(1e-15);
	});
});

describe('beam profile', () => {
	it('a flat-top beam entered by its full width W has the irradiance P/(π·W²/4) — read as a Gaussian FWHM it would be 31 % low', () => {
		// A uniform (top-hat) beam spreads P evenly over its full width: E = P/(π·W²/4) (textbook; from memory).
		// The same W read as a Gaussian FWHM gives a 1/e diameter W/√(ln 2), hence E × ln 2 = 0.693 E.
		const flat = cwLine({ power: '1', beamDiameter: '0.01', beamDiameterDefinition: 'fwhm', divergence: '1e-3', beamProfile: 'flat_top' });
		const r = run(scenario({ line: flat, points: [eyePoint('p', '0')] }));
		expect(rel(r.points[0].lines[0].irradiance!, 1 / area(0.01))).toBeLessThan(1e-14);
		expect(r.lines[0].beamDiameter).toBe(0.01);
		const asGaussian = run(scenario({ line: { ...flat, beamProfile: 'gaussian' }, points: [eyePoint('p', '0')] }));
		expect(rel(asGaussian.points[0].lines[0].irradiance! / r.points[0].lines[0].irradiance!, Math.LN2)).toBeLessThan(1e-14);
		expect(r.points[0].worstRatio! / asGaussian.points[0].worstRatio!).toBeCloseTo(1 / Math.LN2, 12);
	});

	it('a hot-spot factor h multiplies irradiance and radiant exposure, and widens the hazard distance by √h in the far field', () => {
		const line = cwLine({ power: '1', beamDiameter: '0.01' });
		const plain = run(scenario({ line, points: [eyePoint('p', '0')] }));
		const hot = run(scenario({ line: { ...line, hotSpotFactor: '2.5' }, points: [eyePoint('p', '0')] }));
		expect(rel(hot.points[0].lines[0].irradiance!, 2.5 * plain.points[0].lines[0].irradiance!)).toBeLessThan(1e-14);
		expect(rel(hot.points[0].worstRatio!, 2.5 * plain.points[0].worstRatio!)).toBeLessThan(1e-14);
		// D_c grows by √h, and √(D_c² − D₀²)/φ with it.
		const dc = (h: number) => Math.sqrt((4 * h * 1) / (Math.PI * EL_VIS_025));
		expect(rel(hot.nohd.distance!, Math.sqrt(dc(2.5) ** 2 - 0.01 ** 2) / 1e-3)).toBeLessThan(1e-12);
		// A diffuse reflection spreads the whole beam: no hot spot there.
		const wall = { ...eyePoint('wall', '5'), kind: 'diffuse' as const, reflectance: '0.9', viewingDistance: '0.5' };
		const a = run(scenario({ line, points: [wall] }));
		const b = run(scenario({ line: { ...line, hotSpotFactor: '2.5' }, points: [wall] }));
		expect(b.points[0].worstRatio).toBe(a.points[0].worstRatio);
	});
});

describe('hazard distances', () => {
	it('follow the closed form √(4P/(π·EL) − D₀²)/φ from the aperture; the linear handbook form is in the working', () => {
		// Formula: OSHA Technical Manual Sec. III Ch. 6 gives the linear form NOHD = (1/φ)·[(4P/(π·MPE))^½ − a]
		// (from memory). 100 mW, 1 mm, φ = 1 mrad assumed; EL at 0.25 s (aversion response, common practice).
		// Closed form 70.72 m, linear form 69.72 m (hand arithmetic).
		const r = run(scenario());
		const dc = Math.sqrt((4 * 0.1) / (Math.PI * EL_VIS_025));
		expect(rel(r.nohd.distance!, Math.sqrt(dc * dc - 1e-6) / 1e-3)).toBeLessThan(1e-12);
		expect(r.nohd.distance!).toBeCloseTo(70.72, 2);
		expect(r.nohd.status).toBe('finite');
		expect(r.nohd.afterElement).toBeNull();
		expect(r.nohd.decidingLimit).toEqual({ id: 'eye-vis', version: '3' });
		expect(r.breakdown.find((s) => s.id === 'nohd.distance')!.note).toContain('69.7');
	});

	it('is about 225 m for 1 W at 1 mrad in the visible (published figure)', () => {
		// Source: a public laser-display safety handbook page, "Nominal Ocular Hazard Distance – NOHD", states
		// ≈ 225 m for a 1 W laser with 1 mrad divergence (MPE not given there; with 25.46 W/m² the closed
		// form gives 223.6 m). The published figure is rounded: tolerance 1 %.
		const r = run(scenario({ line: cwLine({ power: '1' }) }));
		expect(rel(r.nohd.distance!, 225)).toBeLessThan(0.01);
	});

	it('is 0 when the beam is below the limit at the aperture', () => {
		const r = run(scenario({ line: cwLine({ power: '1e-4' }) }));
		expect(r.nohd.distance).toBe(0);
		expect(r.nohd.status).toBe('finite');
	});

	it('is unbounded for a collimated beam that exceeds the limit, and never divides by zero', () => {
		const r = run(scenario({ line: cwLine({ divergence: '0' }) }));
		expect(r.nohd.status).toBe('unbounded');
		expect(r.nohd.distance).toBeNull();
		expect(r.nohd.reason).toMatch(/unbounded/);
		expect(JSON.stringify(r)).not.toMatch(/null.*Infinity|NaN/);
		const weak = run(scenario({ line: cwLine({ divergence: '0', power: '1e-5' }) }));
		expect(weak.nohd.distance).toBe(0);
	});

	it('needs the exposure duration and says so (incomplete, never a distance)', () => {
		const r = run(scenario({ nohd: null }));
		expect(r.nohd.status).toBe('incomplete');
		expect(r.nohd.reason).toContain('nohdExposureDuration');
		expect(r.nohd.distance).toBeNull();
	});

	it('has no applicable limit outside the entered wavelengths', () => {
		const r = run(scenario({ line: cwLine({ wavelength: '1550e-9' }) }));
		expect(r.nohd.status).toBe('no_applicable_limit');
		expect(r.nohd.distance).toBeNull();
	});

	it('uses the worst of the applicable checks for a pulsed line', () => {
		const r = run(scenario({ line: pulsedLine() }));
		expect(r.nohd.candidates.map((c) => c.check).sort()).toEqual(['average_power', 'pulse_train', 'single_pulse']);
		expect(r.nohd.distance).toBe(Math.max(...r.nohd.candidates.map((c) => c.distance!)));
		// Single pulse by hand: D_c = √(4Q/(π·H_lim)), H_lim = 5e-3 J/m²; pulse train H_lim × 250^−0.25.
		const sp = r.nohd.candidates.find((c) => c.check === 'single_pulse')!;
		expect(rel(sp.criticalDiameter, Math.sqrt((4 * 1e-3) / (Math.PI * 5e-3)))).toBeLessThan(1e-14);
		const train = r.nohd.candidates.find((c) => c.check === 'pulse_train')!;
		expect(rel(train.criticalDiameter, Math.sqrt((4 * 1e-3) / (Math.PI * 5e-3 * 250 ** -0.25)))).toBeLessThan(1e-14);
		expect(r.nohd.decidingCheck).toBe('pulse_train');
	});

	it('at the NOHD the exposure equals the limit (property)', () => {
		fc.assert(
			fc.property(fc.double({ min: 0.01, max: 10, noNaN: true }), fc.double({ min: 0.5e-3, max: 5e-3, noNaN: true }), fc.double({ min: 0.2e-3, max: 5e-3, noNaN: true }), (power, d0, phi) => {
				const line = cwLine({ power: String(power), beamDiameter: String(d0), divergence: String(phi) });
				const nohd = run(scenario({ line, limits: [EYE_VISIBLE] }), false).nohd.distance!;
				if (nohd === 0) return true;
				const at = run(scenario({ line, limits: [EYE_VISIBLE], points: [eyePoint('edge', nohd)] }, [free(nohd)]), false);
				return Math.abs(at.points[0].worstRatio! - 1) < 1e-9;
			}),
			{ numRuns: 200 }
		);
	});

	it('after a lens is measured from the lens and from the focus, with the post-focus cone angle', () => {
		// ANSI Z136.1 lens-on-laser form (from memory): r = (f/b)·√(4P/(π·MPE)) from the focus, b the beam
		// diameter at the lens; the closed form also keeps the diffraction-limited spot and the exact cone.
		const r = run(scenario({ line: cwLine({ power: '1', beamDiameter: '5e-3', divergence: '0.5e-3' }) }, [el('lens', { focalLength: '0.2' }), free(10)]));
		const lens = r.hazardDistances.find((d) => d.afterElement === 0)!;
		const dc = Math.sqrt(4 / (Math.PI * EL_VIS_025));
		const phi = 2 * Math.atan(5e-3 / 0.4);
		const d0 = lens.candidates[0] && r.breakdown.find((s) => s.id === 'lens1.focal-spot')!.value;
		expect(lens.focusPosition).toBe(0.2);
		expect(rel(lens.distanceFromFocus!, Math.sqrt(dc * dc - d0 * d0) / phi)).toBeLessThan(1e-12);
		expect(rel(lens.distance!, 0.2 + lens.distanceFromFocus!)).toBeLessThan(1e-14);
		// Within 0.3 % of the handbook form (f/b)·D_c ≈ 8.94 m (small angle, no diffraction floor).
		expect(rel(lens.distanceFromFocus!, (0.2 / 5e-3) * dc)).toBeLessThan(3e-3);
	});
});

describe('the unsafe gaps of the 1.x engine, closed', () => {
	// 1064 nm, 100 Hz, 10 ns, 1 mm; limits: single pulse 0.05 J/m² (no pulse-train rule entered) and
	// 50 W/m² for 10 s – 30 000 s (both demonstration values from memory). At the aperture, T = 10 s:
	// single pulse H = Q/(π·0.007²/4) chosen at 0.90 × the limit; N = f·T = 1000 pulses.
	const Q = 0.9 * 0.05 * area(0.007);
	const line1064 = cwLine({ wavelength: '1064e-9', mode: 'repetitive', power: null, pulseEnergy: String(Q), pulseDuration: '10e-9', repetitionRate: '100' });
	const at = (limits: LimitSI[]) => run(scenario({ line: line1064, limits, points: [eyePoint('exit', '0', { exposureDuration: '10' })], nohd: '10' }));

	it('a repetitive line always gets the pulse-train check: a single-pulse limit without a rule makes it incomplete, never skipped', () => {
		const r = at([EYE_1064_PULSE, EYE_1064_LONG]);
		const checks = r.points[0].lines[0].checks;
		expect(checks.map((c) => c.kind)).toEqual(['single_pulse', 'average_power', 'pulse_train']);
		expect(checks[0].ratio).toBeCloseTo(0.9, 12);
		expect(checks[2].verdict).toBe('incomplete');
		expect(checks[2].comparisons[0].trainRule).toBe('missing');
		expect(checks[2].comparisons[0].reason).toMatch(/no pulse-train rule/);
		expect(r.points[0].verdict).toBe('incomplete');
		expect(r.verdict).toBe('incomplete');
		// The hazard distance names the missing check: a lower bound.
		expect(r.nohd.status).toBe('partial');
		expect(r.nohd.missingChecks).toContain('pulse_train');
	});

	it('with the rule entered the train check decides: 0.90 × 1000^0.25 = 5.06 × the limit', () => {
		const r = at([{ ...EYE_1064_PULSE, pulseTrainExponent: '-0.25' }, EYE_1064_LONG]);
		const train = r.points[0].lines[0].checks[2];
		expect(train.verdict).toBe('exceeds_limit');
		expect(train.ratio).toBeCloseTo(0.9 * 1000 ** 0.25, 10);
		expect(r.verdict).toBe('exceeds_limit');
	});

	it('only the officer\'s explicit "no train correction" compares the train with the single-pulse limit as it is', () => {
		const r = at([{ ...EYE_1064_PULSE, noTrainCorrection: true }, EYE_1064_LONG]);
		const train = r.points[0].lines[0].checks[2];
		expect(train.verdict).toBe('within_limit');
		expect(train.comparisons[0].trainRule).toBe('no_correction');
		expect(train.ratio).toBeCloseTo(0.9, 12);
		expect(r.verdict).toBe('within_limit');
	});

	it('the NOHD covers the beam after an expander: ×10 at the aperture takes 1 W at 1 mrad from 224 m to 2.23 km', () => {
		// Expanding by M divides the divergence by M, so the far-field NOHD grows about M-fold (ANSI Z136.1 /
		// OSHA manual remark on beam expanders; from memory). Hand arithmetic: D_c = √(4·1/(π·25.46)) = 0.2236 m,
		// after the expander D₀ = 10 mm, φ = 0.1 mrad: √(D_c² − D₀²)/φ = 2234 m.
		const r = run(scenario({ line: cwLine({ power: '1' }), points: [eyePoint('300m', '300'), eyePoint('2km', '2000')] }, [el('expander', { magnification: '10' }), free(3000)]));
		const dc = Math.sqrt(4 / (Math.PI * EL_VIS_025));
		expect(rel(r.hazardDistances[0].distance!, Math.sqrt(dc * dc - 1e-6) / 1e-3)).toBeLessThan(1e-12); // 223.6 m, the bare beam
		expect(r.nohd.afterElement).toBe(0);
		expect(rel(r.nohd.distance!, Math.sqrt(dc * dc - 1e-4) / 1e-4)).toBeLessThan(1e-12);
		expect(r.nohd.distance!).toBeGreaterThan(2000);
		expect(r.points.map((p) => p.verdict)).toEqual(['exceeds_limit', 'exceeds_limit']);
	});

	it('the NOHD covers the beam after a fibre: a fast source coupled into a slow output', () => {
		// Aperture: 1 W, 1 mm, φ = 0.1 rad → D_c/φ ≈ 2.24 m. After a 1 mm core, NA 5e-4 output (φ = 1 mrad):
		// ≈ 224 m, and a point at 100 m exceeds (hand arithmetic).
		const r = run(scenario({ line: cwLine({ power: '1', divergence: '0.1' }), points: [eyePoint('far', '100')] }, [free(1), el('fibre', { coreDiameter: '1e-3', numericalAperture: '5e-4' }), free(200)]));
		expect(r.hazardDistances[0].distance!).toBeCloseTo(2.24, 2);
		expect(r.nohd.afterElement).toBe(1);
		expect(r.nohd.distance!).toBeGreaterThan(100);
		expect(r.points[0].verdict).toBe('exceeds_limit');
	});

	it('the NOHD is partial, naming the check, when a check that applies has no limit', () => {
		const r = run(scenario({ line: pulsedLine({ pulseEnergy: '1e-6' }), limits: [EYE_VISIBLE] }));
		expect(r.nohd.status).toBe('partial');
		expect(r.nohd.missingChecks.sort()).toEqual(['pulse_train', 'single_pulse']);
		expect(r.nohd.distance).not.toBeNull();
		expect(r.nohd.reason).toMatch(/understated/);
	});

	it('a lens spreads the beam by the cone angle 2·atan(D/2f), not D/f: 14 % more irradiance downstream for f = D', () => {
		// Geometric optics: a beam of diameter D focused at f converges and diverges in a cone of full angle
		// 2·atan(D/(2f)) (textbook; from memory). For f = D: 0.9273 rad instead of 1 rad, so D(z) is 0.9273× and
		// the irradiance 1/0.9273² = 1.163× the small-angle value.
		const r = run(scenario({ line: cwLine({ power: '1', beamDiameter: '0.01', divergence: '0' }), points: [eyePoint('far', '1.01')] }, [el('lens', { focalLength: '0.01' }), free(2)]));
		const phi = r.points[0].lines[0].beamDivergence;
		expect(phi).toBeCloseTo(2 * Math.atan(0.5), 14);
		const D = r.points[0].lines[0].beamDiameter;
		expect(D).toBeCloseTo(Math.hypot(r.breakdown.find((s) => s.id === 'lens1.focal-spot')!.value, phi * 1), 14);
		expect((1 / phi) ** 2).toBeCloseTo(1.163, 3);
	});

	it('refuses a focal length below 1 mm, a magnification outside 0.01–1000, exponents outside ±2 and an NA above 1, naming the field', () => {
		const fields = (s: ReturnType<typeof scenario>) => {
			s.path.points = [eyePoint('p', '0.5')];
			const out = evaluate(s.path, s.limits);
			return out.ok ? [] : out.errors.map((e) => e.field);
		};
		expect(fields(scenario({}, [el('lens', { focalLength: '1e-9' }), free(1)]))).toEqual(['elements.0.focalLength']);
		expect(fields(scenario({}, [el('lens', { focalLength: '0.0009' }), free(1)]))).toEqual(['elements.0.focalLength']);
		expect(fields(scenario({}, [el('lens', { focalLength: '0.001' }), free(1)]))).toEqual([]);
		expect(fields(scenario({}, [el('expander', { magnification: '0.001' }), free(1)]))).toEqual(['elements.0.magnification']);
		expect(fields(scenario({}, [el('expander', { magnification: '2000' }), free(1)]))).toEqual(['elements.0.magnification']);
		expect(fields(scenario({ limits: [{ ...EYE_VISIBLE, n: '2.5' }] }))).toEqual(['limits.0.n']);
		expect(fields(scenario({ limits: [{ ...EYE_VISIBLE_PULSE, pulseTrainExponent: '-3' }] }))).toEqual(['limits.0.pulseTrainExponent']);
		expect(fields(scenario({}, [el('fibre', { coreDiameter: '5e-5', numericalAperture: '1.01' }), free(1)]))).toEqual(['elements.0.numericalAperture']);
	});

	it('warns when an exposure duration is below the usual default: 10 s outside 400–700 nm, 0.25 s inside', () => {
		const warnings = (line: ReturnType<typeof cwLine>, T: string) => run(scenario({ line, points: [eyePoint('p', '1', { exposureDuration: T })], nohd: T })).points[0].warnings;
		expect(warnings(cwLine({ wavelength: '1064e-9' }), '0.25')[0]).toMatch(/shorter than the 10 s usually assumed/);
		expect(warnings(cwLine({ wavelength: '1064e-9' }), '10')).toEqual([]);
		expect(warnings(cwLine(), '0.1')[0]).toMatch(/0\.25 s aversion response/);
		expect(warnings(cwLine(), '0.25')).toEqual([]);
		const r = run(scenario({ line: cwLine({ wavelength: '1064e-9' }), nohd: '0.25' }));
		expect(r.warnings[0]).toMatch(/hazard distances/);
	});

	it('skin points get a skin hazard distance like the eye\'s', () => {
		// 1 W at 532 nm, skin limit 2000 W/m² (from memory), 3.5 mm aperture: D_c = √(4/(π·2000)) = 25.2 mm,
		// distance √(D_c² − D₀²)/φ = 25.2 m (hand arithmetic).
		const r = run(scenario({ line: cwLine({ power: '1' }), points: [eyePoint('hand', '1', { tissue: 'skin', exposureDuration: '100' })] }));
		const skin = r.points[0].skinHazardDistance!;
		const dc = Math.sqrt(4 / (Math.PI * 2000));
		expect(skin.tissue).toBe('skin');
		expect(rel(skin.distance!, Math.sqrt(dc * dc - 1e-6) / 1e-3)).toBeLessThan(1e-12);
		expect(skin.decidingLimit?.id).toBe(SKIN_LONG.id);
	});

	it('each open stretch reports its worst exposure ratio, also between the named points', () => {
		// A 20 mm beam (wider than the 7 mm aperture) focused by f = 0.2 m: the focus is far worse than the lens.
		const line = cwLine({ power: '1', beamDiameter: '20e-3', divergence: '0.5e-3' });
		const r = run(scenario({ line, points: [eyePoint('start', '0')] }, [free(1), el('lens', { focalLength: '0.2' }), free(2), el('enclosure', { length: '1' }), free(1)]));
		const open = r.stretches.filter((s) => s.enclosedBy === null);
		expect(open.map((s) => [s.from, s.to])).toEqual([
			[0, 1],
			[1, 3],
			[4, 5]
		]);
		// After the lens the worst place is its focus, 0.2 m behind it, where no point was marked.
		expect(open[1].worstAt).toBeCloseTo(1.2, 12);
		expect(open[1].worstRatio!).toBeGreaterThan(open[0].worstRatio!);
		expect(open[1].verdict).toBe('exceeds_limit');
		const probe = run(scenario({ line, points: [eyePoint('focus', '1.2')] }, [free(1), el('lens', { focalLength: '0.2' }), free(2), el('enclosure', { length: '1' }), free(1)]));
		expect(rel(open[1].worstRatio!, probe.points[0].worstRatio!)).toBeLessThan(1e-12);
		expect(r.stretches.find((s) => s.enclosedBy !== null)!.worstRatio).toBeNull();
	});

	it('a ratio within 1e-9 of 1 is at the limit, which exceeds it', () => {
		// At the aperture, D < D_f: H = P·T/(π·D_f²/4); pick P for a ratio of 1 − 5e-10.
		const P = ((1 - 5e-10) * area(0.007) * 18 * 0.25 ** 0.75) / 0.25;
		const r = run(scenario({ line: cwLine({ power: String(P) }), points: [eyePoint('p', '0')], limits: [EYE_VISIBLE] }));
		expect(r.points[0].worstRatio!).toBeLessThan(1);
		expect(r.points[0].verdict).toBe('exceeds_limit');
		const below = run(scenario({ line: cwLine({ power: String(P * (1 - 1e-8)) }), points: [eyePoint('p', '0')], limits: [EYE_VISIBLE] }));
		expect(below.points[0].verdict).toBe('within_limit');
	});
});

describe('diffuse reflection', () => {
	it('irradiance ρ·P·cosθ/(π·r²) and hazard distance √(ρ·P·cosθ/(π·EL))', () => {
		// Formulas: OSHA Technical Manual Sec. III Ch. 6 / ANSI Z136.1 diffuse-reflection NHZ (from memory).
		const p = { ...eyePoint('wall', '5'), kind: 'diffuse' as const, reflectance: '0.9', viewingAngle: '0.5', viewingDistance: '0.3' };
		const r = run(scenario({ line: cwLine({ power: '5' }), points: [p] }));
		const pt = r.points[0];
		expect(rel(pt.lines[0].irradiance!, (0.9 * 5 * Math.cos(0.5)) / (Math.PI * 0.3 ** 2))).toBeLessThan(1e-14);
		const rh = Math.sqrt((0.9 * 5 * Math.cos(0.5)) / (Math.PI * EL_VIS_025));
		expect(rel(pt.diffuseHazardDistance!.distance!, rh)).toBeLessThan(1e-14); // ≈ 0.207 m
		expect(rel(pt.worstRatio!, (rh / 0.3) ** 2)).toBeLessThan(1e-13);
		expect(pt.lines[0].checks[0].comparisons[0].averagingDiameter).toBeNull();
	});

	it('is incomplete without reflectance or viewing distance', () => {
		const p = { ...eyePoint('wall', '5'), kind: 'diffuse' as const };
		const r = run(scenario({ points: [p] }));
		expect(r.points[0].verdict).toBe('incomplete');
		expect(r.points[0].missing).toEqual(['points.0.reflectance', 'points.0.viewingDistance']);
		expect(r.points[0].diffuseHazardDistance!.status).toBe('incomplete');
		expect(r.verdict).toBe('incomplete');
	});
});

describe('optical density', () => {
	it('OD = log₁₀(H/MPE), rounded up to a tenth and to the next whole number', () => {
		// Formula OD = log₁₀(H₀/MPE): OSHA Technical Manual Sec. III Ch. 6 (from memory); common practice.
		// Q-switched 1064 nm, 100 mJ, 10 ns, 3 mm beam, 7 mm aperture, 0.05 J/m² (from memory):
		// H = 2598.4 J/m², ratio 51 969, OD 4.716 → 4.8 → 5 (hand arithmetic).
		const line = cwLine({ wavelength: '1064e-9', mode: 'single_pulse', power: null, pulseEnergy: '0.1', pulseDuration: '10e-9', beamDiameter: '3e-3' });
		const r = run(scenario({ line, points: [eyePoint('exit', '0')] }));
		const h = 0.1 / area(0.007);
		expect(rel(r.points[0].worstRatio!, h / 0.05)).toBeLessThan(1e-14);
		expect(rel(r.requiredOpticalDensity!.value, Math.log10(h / 0.05))).toBeLessThan(1e-14);
		expect(r.requiredOpticalDensity!.roundedUpTenth).toBe(4.8);
		expect(r.requiredOpticalDensity!.roundedUpWhole).toBe(5);
	});

	it('is 0 when within the limit', () => {
		expect(run(scenario({ line: cwLine({ power: '1e-6' }) })).requiredOpticalDensity).toEqual({ value: 0, roundedUpTenth: 0, roundedUpWhole: 0 });
	});
});

describe('verdicts', () => {
	it('reports every comparison; the most restrictive applicable limit decides', () => {
		const stricter: LimitSI = { ...EYE_VISIBLE, id: 'eye-vis-strict', k: '9' };
		const r = run(scenario({ limits: [EYE_VISIBLE, stricter] }));
		const check = r.points[0].lines[0].checks[0];
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
		const partial = run(scenario({ line: pulsedLine({ pulseEnergy: '1e-9', pulseDuration: '1e-3', repetitionRate: '10' }), limits: [EYE_VISIBLE] }));
		expect(partial.points[0].lines[0].checks.find((c) => c.kind === 'average_power')?.verdict).toBe('within_limit');
		expect(partial.points[0].verdict).toBe('no_applicable_limit');
	});

	it('points inside an enclosure are reported but excluded from the verdict, the worst point and the OD', () => {
		const elements = [el('enclosure', { length: '2' }), el('transmission', { transmission: '1e-9' }), free(3)];
		const r = run(scenario({ line: cwLine({ power: '5' }), points: [eyePoint('inside', '1'), eyePoint('outside', '4')] }, elements));
		const [inside, outside] = r.points;
		expect(inside.accessible).toBe(false);
		expect(inside.enclosedBy).toBe(0);
		expect(inside.verdict).toBe('exceeds_limit');
		expect(outside.verdict).toBe('within_limit');
		expect(r.verdict).toBe('within_limit');
		expect(r.worstPointId).toBe('outside');
		expect(r.requiredOpticalDensity?.roundedUpWhole).toBe(0);
		const only = run(scenario({ line: cwLine({ power: '5' }), points: [eyePoint('inside', '1')] }, elements));
		expect(only.verdict).toBe('incomplete');
		expect(only.worstPointId).toBeNull();
	});

	it('missing exposure duration makes the point incomplete with the field named; precedence exceeds > incomplete > no limit > within', () => {
		const r = run(scenario({ points: [eyePoint('a', '5', { exposureDuration: null }), eyePoint('b', '5', { exposureDuration: '0.25', tissue: 'skin' })] }));
		expect(r.points[0].verdict).toBe('incomplete');
		expect(r.points[0].missing).toEqual(['points.0.exposureDuration']);
		expect(r.points[1].verdict).toBe('no_applicable_limit');
		expect(r.verdict).toBe('incomplete');
		const withExceed = run(scenario({ points: [eyePoint('a', '5', { exposureDuration: null }), eyePoint('c', '0')] }));
		expect(withExceed.verdict).toBe('exceeds_limit');
		expect(withExceed.worstPointId).toBe('c');
	});

	it('repetitive lines get single-pulse, average-power and pulse-train checks; the worst ratio decides', () => {
		const r = run(scenario({ line: pulsedLine({ pulseEnergy: '1e-6' }), points: [eyePoint('p', '10')] }));
		const checks = r.points[0].lines[0].checks;
		expect(checks.map((c) => c.kind)).toEqual(['single_pulse', 'average_power', 'pulse_train']);
		const train = checks[2].comparisons[0];
		expect(train.pulseCount).toBe(250); // N = f·T = 1000 Hz × 0.25 s
		expect(rel(train.trainFactor!, 250 ** -0.25)).toBeLessThan(1e-15);
		expect(rel(train.limitValue!, 5e-3 * 250 ** -0.25)).toBeLessThan(1e-15);
		expect(r.points[0].worstRatio).toBe(Math.max(...checks.map((c) => c.ratio!)));
		expect(r.lines[0].averagePower).toBeCloseTo(0.001, 15);
		expect(r.lines[0].peakPower).toBeCloseTo(100, 10);
		expect(checks[0].duration).toBe(1e-8);
		expect(checks[1].duration).toBe(0.25);
	});

	it('a single pulse gets only the single-pulse check; a continuous line only the continuous check', () => {
		const sp = run(scenario({ line: cwLine({ mode: 'single_pulse', power: null, pulseEnergy: '1e-6', pulseDuration: '10e-9' }) }));
		expect(sp.points[0].lines[0].checks.map((c) => c.kind)).toEqual(['single_pulse']);
		expect(sp.points[0].lines[0].power).toBeNull();
		expect(run(scenario()).points[0].lines[0].checks.map((c) => c.kind)).toEqual(['continuous']);
	});

	it('converts an irradiance limit for a pulse at t = τ (E = H/τ)', () => {
		const irr: LimitSI = { ...EYE_VISIBLE_PULSE, id: 'irr', quantity: 'irradiance', k: '5e5', pulseTrainExponent: null };
		const line = cwLine({ mode: 'single_pulse', power: null, pulseEnergy: '1e-6', pulseDuration: '10e-9' });
		const c = run(scenario({ line, limits: [irr], points: [eyePoint('p', '0')] })).points[0].lines[0].checks[0].comparisons[0];
		expect(c.unit).toBe('W/m²');
		expect(rel(c.exposure, 1e-6 / area(0.007) / 10e-9)).toBeLessThan(1e-14);
	});

	it('uses skin limits for skin points', () => {
		const r = run(scenario({ line: cwLine({ power: '1' }), points: [eyePoint('hand', '1', { tissue: 'skin', exposureDuration: '100' })] }));
		expect(r.points[0].lines[0].checks[0].decidingLimit?.id).toBe(SKIN_LONG.id);
		// 3.5 mm skin aperture (common practice, from memory): E = 1/(π·0.0035²/4) = 1.04e5 W/m² vs 2000 W/m².
		expect(rel(r.points[0].worstRatio!, 1 / area(0.0035) / 2000)).toBeLessThan(1e-14);
	});

	it('carries the engine version and the id and version of every limit used', () => {
		const r = run(scenario());
		expect(r.engineVersion).toBe(ENGINE_VERSION);
		expect(ENGINE_VERSION).toMatch(/2\.0\.0$/);
		expect(r.limitsUsed).toEqual([{ id: 'eye-vis', version: '3' }]);
		expect(r.limitsConsidered).toHaveLength(DEMO_LIMITS.length);
		expect(r.caution).toMatch(/LSO/);
	});
});

describe('properties', () => {
	it('exposure grows with power', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-4, max: 100, noNaN: true }), fc.double({ min: 1.001, max: 100, noNaN: true }), fc.double({ min: 0, max: 10, noNaN: true }), (p, factor, z) => {
				const at = (power: number) => run(scenario({ line: cwLine({ power: String(power) }), points: [eyePoint('p', z.toFixed(6))] }), false).points[0];
				const a = at(p);
				const b = at(p * factor);
				return b.worstRatio! > a.worstRatio! && b.lines[0].irradiance! > a.lines[0].irradiance!;
			}),
			{ numRuns: 100 }
		);
	});

	it('exposure falls with distance for a diverging beam', () => {
		fc.assert(
			fc.property(fc.double({ min: 0, max: 50, noNaN: true }), fc.double({ min: 0.01, max: 50, noNaN: true }), fc.double({ min: 1e-5, max: 1e-2, noNaN: true }), (z, dz, phi) => {
				const r = run(scenario({ line: cwLine({ divergence: String(phi) }), points: [eyePoint('near', z.toFixed(6)), eyePoint('far', (z + dz).toFixed(6))] }, [free(200)]), false);
				const [near, far] = r.points;
				return far.lines[0].irradiance! < near.lines[0].irradiance! && far.worstRatio! <= near.worstRatio!;
			}),
			{ numRuns: 100 }
		);
	});

	it('never throws and never returns NaN or Infinity, whatever the input', () => {
		fc.assert(
			fc.property(fc.anything(), fc.anything(), (junk, limits) => {
				const out = evaluate(junk, limits);
				return out.ok === false && out.errors.length > 0;
			}),
			{ numRuns: 200 }
		);
		const numberish = fc.oneof(fc.double(), fc.constantFrom('1e-3', '0', '-1', 'abc', '1e400', '', 'Infinity', '1e-300', '1e300'), fc.constant(null));
		fc.assert(
			fc.property(numberish, numberish, numberish, numberish, numberish, (power, d, phi, z, t) => {
				const s = scenario({ line: cwLine({ power: power as never, beamDiameter: d as never, divergence: phi as never }), points: [eyePoint('p', z as never, { exposureDuration: t as never })] }, [free('1e6')]);
				const out = evaluate(s.path, s.limits);
				const text = JSON.stringify(out);
				return !/NaN|Infinity/.test(text.replace(/"reason":"[^"]*"/g, '')) && (out.ok || out.errors.every((e) => e.field.length > 0));
			}),
			{ numRuns: 300 }
		);
	});

	it('results are plain JSON data (round-trip identical)', () => {
		const r = run(scenario({ line: pulsedLine(), points: [eyePoint('a', '1'), { ...eyePoint('b', '2'), kind: 'diffuse', reflectance: '0.5', viewingDistance: '1' }] }, [free(3), el('lens', { focalLength: '0.1' })]));
		expect(JSON.parse(JSON.stringify(r))).toEqual(r);
	});
});

describe('extreme values', () => {
	it('handles very small and very large magnitudes without losing the verdict', () => {
		const r = run(scenario({ line: cwLine({ power: '1e-15', beamDiameter: '1e-6', divergence: '1e-9' }), limits: [EYE_VISIBLE, EYE_1064_PULSE] }));
		expect(r.points[0].verdict).toBe('within_limit');
		const big = run(scenario({ line: cwLine({ power: '1e9', wavelength: '1e-3', divergence: '1' }), points: [eyePoint('p', '1e9')] }, [free('1e9')]));
		expect(big.points[0].verdict).toBe('no_applicable_limit');
	});
});
