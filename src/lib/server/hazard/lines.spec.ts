import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { LimitSI } from '$lib/schemas/assessment';
import { evaluate } from './evaluate';
import { EYE_VISIBLE, cwLine, el, eyePoint, free, run, scenario } from './fixtures';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
const area = (d: number) => (Math.PI * d * d) / 4;

/**
 * Demonstration limits for these tests, shaped like the published ones (ICNIRP 2013 guidelines on
 * laser radiation; IEC 60825-1; Directive 2006/25/EC, Annex II — forms and values from memory, not
 * checked against the texts): the retinal thermal limit for 10 s – 30 000 s, E = 10·C_A W/m² with
 * C_A = 10^(0.002·(λ − 700 nm)) from 700 to 1050 nm (and 5 above), entered ONCE for 400–1400 nm.
 */
const RETINA_LONG: LimitSI = {
	...EYE_VISIBLE,
	id: 'retina-long',
	version: '1',
	label: 'Eye, 400–1400 nm, 10 s – 30 000 s, 10·C_A W/m²',
	wavelengthMin: '400e-9',
	wavelengthMax: '1400e-9',
	durationMin: '10',
	durationMax: '30000',
	quantity: 'irradiance',
	k: '10',
	n: '0',
	wavelengthFactorKind: 'exponential',
	wavelengthFactorSlope: String(0.002 * 1e9),
	wavelengthFactorOrigin: '700e-9',
	wavelengthFactorFrom: '700e-9',
	wavelengthFactorTo: '1050e-9'
};
/** Cornea, far infrared, 10 s – 30 000 s: E = 1000 W/m² (from memory, demonstration). */
const CORNEA_LONG: LimitSI = { ...EYE_VISIBLE, id: 'cornea-long', version: '1', label: 'Eye, 1.4 µm – 1 mm, 10 s – 30 000 s', wavelengthMin: '1400e-9', wavelengthMax: '1e-3', durationMin: '10', durationMax: '30000', quantity: 'irradiance', k: '1000', n: '0', limitingAperture: '3.5e-3' };
/** Skin, all wavelengths, 10 s – 30 000 s: E = 2000 W/m² (from memory, demonstration). */
const SKIN_ALL: LimitSI = { ...EYE_VISIBLE, id: 'skin-all', version: '1', label: 'Skin, 10 s – 30 000 s', tissue: 'skin', wavelengthMin: '180e-9', wavelengthMax: '1e-3', durationMin: '10', durationMax: '30000', quantity: 'irradiance', k: '2000', n: '0', limitingAperture: '3.5e-3' };
const LIMITS = [RETINA_LONG, CORNEA_LONG, SKIN_ALL];

const green = (power: string) => cwLine({ id: 'g', label: '532 nm', wavelength: '532e-9', power, emissionGroup: 'doubled' });
const infrared = (power: string, wavelength = '1064e-9') => cwLine({ id: 'ir', label: 'residual 1064 nm', wavelength, power, emissionGroup: 'doubled' });
/** At the aperture, 1 mm beams: E = P/(π·0.007²/4) over the 7 mm aperture; EL = 10·C_A W/m². */
const ratio = (P: number, CA = 1) => P / area(0.007) / (10 * CA);
const CA_1064 = 10 ** (0.002 * 350); // C_A held at its 1050 nm value, 5.01 (the published 5; from memory)

function twoLines(g: string, ir: string, elements = [free(10)], points = [eyePoint('exit', '0', { exposureDuration: '10' })]) {
	return { path: { lines: [green(g), infrared(ir)], elements, points, nohdExposureDuration: '10' }, limits: LIMITS };
}

describe('lines emitted together', () => {
	it('add up where they act on the same tissue in the same way: each within its limit alone, together over it', () => {
		// Hand arithmetic: 532 nm at 0.6 × its limit, 1064 nm at 0.6 × its limit → 1.2 × together.
		const Pg = 0.6 * 10 * area(0.007);
		const Pir = 0.6 * 10 * CA_1064 * area(0.007);
		const r = run(twoLines(String(Pg), String(Pir)));
		const p = r.points[0];
		expect(p.lines.map((l) => l.verdict)).toEqual(['within_limit', 'within_limit']);
		expect(p.lines[0].worstRatio).toBeCloseTo(0.6, 12);
		expect(p.lines[1].worstRatio).toBeCloseTo(0.6, 12);
		const sum = p.sums.find((s) => s.group === 'eye-retina')!;
		expect(sum.lines.map((l) => l.line)).toEqual([0, 1]);
		expect(sum.ratio).toBeCloseTo(1.2, 12);
		expect(p.worstRatio).toBeCloseTo(1.2, 12);
		expect(p.verdict).toBe('exceeds_limit');
		expect(p.reason).toMatch(/together they do/);
		expect(p.breakdown.find((s) => s.id === 'sum.eye-retina')!.value).toBeCloseTo(1.2, 12);
		// Eyewear: every line needs the OD that brings the sum down, log₁₀ 1.2 = 0.079 → 0.1 → 1.
		expect(r.requiredOpticalDensities.map((o) => [o.line, o.od.roundedUpTenth, o.od.roundedUpWhole])).toEqual([
			[0, 0.1, 1],
			[1, 0.1, 1]
		]);
	});

	it('do not add for the eye across regions that act on different parts of it; on the skin they do', () => {
		// 532 nm (retina) with 10.6 µm (cornea): separate sums for the eye, one sum for the skin.
		const path = { lines: [green('0.01'), infrared('1', '10.6e-6')], elements: [free(10)], points: [eyePoint('eye', '0', { exposureDuration: '10' }), eyePoint('hand', '0', { tissue: 'skin', exposureDuration: '10' })], nohdExposureDuration: '10' };
		const r = run({ path, limits: LIMITS });
		const [eye, hand] = r.points;
		expect(eye.sums.map((s) => s.group).sort()).toEqual(['eye-ir', 'eye-retina']);
		expect(eye.sums.every((s) => s.lines.length === 1)).toBe(true);
		expect(hand.sums.map((s) => [s.group, s.lines.length])).toEqual([['skin', 2]]);
		// The skin: 0.01 W and 1 W over the 3.5 mm aperture against 2000 W/m².
		expect(hand.worstRatio).toBeCloseTo((0.01 + 1) / area(0.0035) / 2000, 12);
	});

	it('a dichroic that removes a line removes its contribution downstream, not upstream', () => {
		// A harmonic separator passes 532 nm and stops 1000–1100 nm (transmission 0 in that band).
		const separator = el('transmission', { label: 'harmonic separator', transmission: '1', bands: [{ wavelengthMin: '1000e-9', wavelengthMax: '1100e-9', transmission: '0' }] });
		const Pg = 0.6 * 10 * area(0.007);
		const Pir = 0.6 * 10 * CA_1064 * area(0.007);
		const r = run(twoLines(String(Pg), String(Pir), [free(1), separator, free(1)], [eyePoint('before', '0.5', { exposureDuration: '10' }), eyePoint('after', '1.5', { exposureDuration: '10' })]));
		const [before, after] = r.points;
		expect(before.verdict).toBe('exceeds_limit');
		expect(after.lines[1].power).toBe(0);
		expect(after.lines[0].power).toBeCloseTo(Pg, 15);
		expect(after.worstRatio!).toBeLessThan(1);
		expect(rel(after.worstRatio!, before.lines[0].worstRatio!)).toBeLessThan(1e-9);
		// The stretch after the separator carries the green line only.
		expect(r.stretches.at(-1)!.worstRatio!).toBeLessThan(1);
	});

	it('adding a line never lowers any ratio (property)', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-4, max: 1, noNaN: true }), fc.double({ min: 1e-4, max: 1, noNaN: true }), fc.constantFrom('532e-9', '810e-9', '1064e-9', '10.6e-6'), fc.double({ min: 0, max: 10, noNaN: true }), (p1, p2, lambda, z) => {
				const points = [eyePoint('p', z.toFixed(4), { exposureDuration: '10' }), eyePoint('s', z.toFixed(4), { tissue: 'skin', exposureDuration: '10' })];
				const one = run({ path: { lines: [green(String(p1))], elements: [free(10)], points, nohdExposureDuration: '10' }, limits: LIMITS }, false);
				const both = run({ path: { lines: [green(String(p1)), infrared(String(p2), lambda)], elements: [free(10)], points, nohdExposureDuration: '10' }, limits: LIMITS }, false);
				return both.points.every((p, i) => p.worstRatio! >= one.points[i].worstRatio! * (1 - 1e-12)) && (both.nohd.distance ?? Infinity) >= one.nohd.distance! * (1 - 1e-9) && both.worstRatio! >= one.worstRatio! * (1 - 1e-12);
			}),
			{ numRuns: 150 }
		);
	});

	it('the NOHD of lines acting alike is where their summed ratio falls to 1: two equal lines behave as one of twice the power', () => {
		const twin = (power: string) => ({ path: { lines: [green(power), { ...green(power), id: 'g2', label: 'second 532 nm' }], elements: [free(10)], points: [eyePoint('p', '1', { exposureDuration: '10' })], nohdExposureDuration: '10' }, limits: LIMITS });
		const single = (power: string) => ({ path: { lines: [green(power)], elements: [free(10)], points: [eyePoint('p', '1', { exposureDuration: '10' })], nohdExposureDuration: '10' }, limits: LIMITS });
		const two = run(twin('0.5'));
		const one = run(single('1'));
		expect(two.nohd.summedLines).toEqual([0, 1]);
		expect(rel(two.nohd.distance!, one.nohd.distance!)).toBeLessThan(1e-10);
		// The working shows the ratios at the distance found, adding up to 1.
		const step = two.breakdown.find((s) => s.id === 'nohd.distance')!;
		expect(step.inputs.filter((i) => i.symbol.startsWith('ratio')).reduce((a, i) => a + i.value, 0)).toBeCloseTo(1, 9);
		// And a diffuse reflection's distance: r·√(Σ ratios).
		const wall = { ...eyePoint('wall', '5', { exposureDuration: '10' }), kind: 'diffuse' as const, reflectance: '0.9', viewingDistance: '0.1' };
		const a = run({ ...twin('0.5'), path: { ...twin('0.5').path, points: [wall] } });
		const b = run({ ...single('1'), path: { ...single('1').path, points: [wall] } });
		expect(rel(a.points[0].diffuseHazardDistance!.distance!, b.points[0].diffuseHazardDistance!.distance!)).toBeLessThan(1e-12);
	});
});

describe('limits in the form the codes publish them', () => {
	it('C_A = 10^(0.002·(λ − 700 nm)) from one limit entered for 400–1400 nm: 1 below 700 nm, 1.585 at 800 nm, held at 5.01 from 1050 nm', () => {
		// ICNIRP 2013 / IEC 60825-1 / Directive 2006/25/EC Annex II (from memory): C_A = 1 for 400–700 nm,
		// 10^(0.002(λ−700)) for 700–1050 nm, 5 for 1050–1400 nm.
		const at = (lambda: string) => run(scenario({ line: cwLine({ wavelength: lambda, power: '1e-3' }), limits: [RETINA_LONG], points: [eyePoint('p', '0', { exposureDuration: '10' })], nohd: '10' }));
		const c = (lambda: string) => at(lambda).points[0].lines[0].checks[0].comparisons[0];
		expect(c('532e-9').wavelengthFactor).toBe(1);
		expect(c('800e-9').wavelengthFactor).toBeCloseTo(10 ** 0.2, 12);
		expect(c('800e-9').wavelengthFactor).toBeCloseTo(1.585, 3);
		expect(c('1064e-9').wavelengthFactor).toBeCloseTo(5.012, 3);
		expect(c('800e-9').limitValue).toBeCloseTo(10 * 10 ** 0.2, 10);
		// The breakdown shows the factor's value at the point.
		const step = at('800e-9').points[0].breakdown.find((s) => s.id.endsWith('.limit'))!;
		expect(step.formula).toBe('EL = k·C(λ)');
		expect(step.inputs.find((i) => i.symbol === 'C(λ)')!.value).toBeCloseTo(1.585, 3);
	});

	it('one factor for a whole 780–820 nm band (≈ 1.6) is not conservative below 800 nm; the published form is', () => {
		// At 780 nm C_A = 10^0.16 = 1.445: a flat 1.6 would allow 11 % more than the published form.
		const flat: LimitSI = { ...RETINA_LONG, id: 'flat', wavelengthMin: '780e-9', wavelengthMax: '820e-9', wavelengthFactorKind: 'constant', wavelengthFactorValue: '1.6', wavelengthFactorSlope: null, wavelengthFactorOrigin: null, wavelengthFactorFrom: null, wavelengthFactorTo: null };
		const ratioWith = (l: LimitSI) => run(scenario({ line: cwLine({ wavelength: '780e-9', power: '1e-3' }), limits: [l], points: [eyePoint('p', '0', { exposureDuration: '10' })], nohd: '10' })).points[0].worstRatio!;
		expect(ratioWith(RETINA_LONG) / ratioWith(flat)).toBeCloseTo(1.6 / 10 ** 0.16, 10);
		expect(ratioWith(RETINA_LONG)).toBeGreaterThan(ratioWith(flat));
	});

	it('C_B = 10^(0.02·(λ − 450 nm)) from 450 to 600 nm and C_C = 10^(0.018·(λ − 1150 nm)) from 1150 to 1200 nm take the same form', () => {
		// ICNIRP 2013 / IEC 60825-1 (from memory): C_B (photochemical retinal limits) 1 for 400–450 nm,
		// 10^(0.02(λ−450)) for 450–600 nm; C_C 1 below 1150 nm, 10^(0.018(λ−1150)) for 1150–1200 nm, 8 above.
		const CB: LimitSI = { ...RETINA_LONG, id: 'cb', wavelengthMin: '400e-9', wavelengthMax: '600e-9', wavelengthFactorSlope: String(0.02 * 1e9), wavelengthFactorOrigin: '450e-9', wavelengthFactorFrom: '450e-9', wavelengthFactorTo: '600e-9' };
		const CC: LimitSI = { ...RETINA_LONG, id: 'cc', wavelengthMin: '1150e-9', wavelengthMax: '1400e-9', wavelengthFactorSlope: String(0.018 * 1e9), wavelengthFactorOrigin: '1150e-9', wavelengthFactorFrom: '1150e-9', wavelengthFactorTo: '1200e-9' };
		const factor = (l: LimitSI, lambda: string) => run(scenario({ line: cwLine({ wavelength: lambda, power: '1e-3' }), limits: [l], points: [eyePoint('p', '0', { exposureDuration: '10' })], nohd: '10' })).points[0].lines[0].checks[0].comparisons[0].wavelengthFactor;
		expect(factor(CB, '420e-9')).toBe(1);
		expect(factor(CB, '500e-9')).toBeCloseTo(10, 10);
		expect(factor(CB, '600e-9')).toBeCloseTo(1000, 8);
		expect(factor(CC, '1175e-9')).toBeCloseTo(10 ** 0.45, 10);
		expect(factor(CC, '1300e-9')).toBeCloseTo(10 ** 0.9, 10); // 7.94, held; the published table rounds to 8
	});

	it('an exponential factor with s = 0 equals the constant form 1, and no factor at all (property)', () => {
		fc.assert(
			fc.property(fc.double({ min: 400e-9, max: 1400e-9, noNaN: true }), fc.double({ min: 1e-4, max: 1, noNaN: true }), (lambda, power) => {
				const line = cwLine({ wavelength: lambda.toPrecision(6), power: power.toPrecision(6) });
				const point = [eyePoint('p', '0', { exposureDuration: '10' })];
				const zeroSlope = run(scenario({ line, limits: [{ ...RETINA_LONG, wavelengthFactorSlope: '0' }], points: point, nohd: '10' }), false);
				const constant = run(scenario({ line, limits: [{ ...RETINA_LONG, wavelengthFactorKind: 'constant', wavelengthFactorValue: '1' }], points: point, nohd: '10' }), false);
				const none = run(scenario({ line, limits: [{ ...RETINA_LONG, wavelengthFactorKind: 'none' }], points: point, nohd: '10' }), false);
				return zeroSlope.worstRatio === constant.worstRatio && constant.worstRatio === none.worstRatio;
			}),
			{ numRuns: 100 }
		);
	});

	it('a diffuse point gets its apparent source α = 2·atan(D/2r) and C_E = α/α_min up to α_max; direct viewing stays a point source', () => {
		// ICNIRP 2013 / IEC 60825-1 (from memory): C_E = α/α_min for α_min < α ≤ α_max (thermal retinal
		// limits), α_min = 1.5 mrad, α_max = 100 mrad; C_E = 1 for a point source.
		const extended: LimitSI = { ...RETINA_LONG, extendedAlphaMin: '1.5e-3', extendedAlphaMax: '0.1', extendedExponent: '1' };
		// A 10 mm spot seen from 1 m: α = 2·atan(0.005) = 10.0 mrad → C_E = 6.67.
		const wall = { ...eyePoint('wall', '5', { exposureDuration: '10' }), kind: 'diffuse' as const, reflectance: '0.9', viewingDistance: '1' };
		const line = cwLine({ power: '1', beamDiameter: '0.01', divergence: '0' });
		const r = run(scenario({ line, limits: [extended], points: [wall, eyePoint('direct', '5', { exposureDuration: '10' })], nohd: '10' }));
		const [diffuse, direct] = r.points;
		const alpha = 2 * Math.atan(0.005);
		expect(diffuse.lines[0].apparentSource).toBeCloseTo(alpha, 15);
		const cmp = diffuse.lines[0].checks[0].comparisons[0];
		expect(cmp.extendedSourceFactor).toBeCloseTo(alpha / 1.5e-3, 12);
		expect(cmp.limitValue).toBeCloseTo(10 * (alpha / 1.5e-3), 10);
		expect(diffuse.breakdown.find((s) => s.id === 'line1.apparent-source')!.value).toBeCloseTo(alpha, 15);
		expect(direct.lines[0].checks[0].comparisons[0].extendedSourceFactor).toBe(1);
		// Held above α_max: a spot of 0.5 m at 1 m gives C_E = 100/1.5.
		const big = run(scenario({ line: cwLine({ power: '1', beamDiameter: '0.5', divergence: '0' }), limits: [extended], points: [wall], nohd: '10' }));
		expect(big.points[0].lines[0].checks[0].comparisons[0].extendedSourceFactor).toBeCloseTo(0.1 / 1.5e-3, 10);
		// The diffuse hazard distance is taken for a point source, never shortened by C_E.
		const asPoint = run(scenario({ line, limits: [RETINA_LONG], points: [wall], nohd: '10' }));
		expect(rel(diffuse.diffuseHazardDistance!.distance!, asPoint.points[0].diffuseHazardDistance!.distance!)).toBeLessThan(1e-12);
	});

	it('pulses closer together than T_i count as one: the group energy against the limit at T_i, N = T/T_i groups', () => {
		// IEC 60825-1 rule for repetitive pulses (from memory): pulses within T_i are one pulse of duration T_i.
		// 100 kHz, 10 ns, T_i = 18 µs → 1.8 pulses per group; single-pulse limit H = 5e-3·t^0 J/m² (demonstration).
		const pulse: LimitSI = { ...EYE_VISIBLE, id: 'sp', label: 'single pulse', durationMin: '1e-9', durationMax: '50e-6', k: '5e-3', n: '0', pulseBasis: 'single_pulse', pulseTrainExponent: '-0.25', pulseGroupingTime: '18e-6' };
		const line = cwLine({ mode: 'repetitive', power: null, pulseEnergy: '1e-9', pulseDuration: '10e-9', repetitionRate: '1e5' });
		const r = run(scenario({ line, limits: [pulse, RETINA_LONG], points: [eyePoint('p', '0', { exposureDuration: '10' })], nohd: '10' }));
		const [single, , train] = r.points[0].lines[0].checks;
		const c = single.comparisons[0];
		expect(c.groupedPulses).toBeCloseTo(1.8, 12);
		expect(c.duration).toBe(18e-6);
		expect(rel(c.exposure, (1.8 * 1e-9) / area(0.007))).toBeLessThan(1e-12);
		expect(train.comparisons[0].pulseCount).toBeCloseTo(10 / 18e-6, 6);
	});

	it('a limiting aperture of the form a·tᵇ is evaluated at the duration of the check', () => {
		// Form of the far-infrared corneal aperture (from memory: 1.5·t^0.375 mm between 0.35 s and 10 s).
		const cornea: LimitSI = { ...CORNEA_LONG, durationMin: '0.35', durationMax: '10', limitingAperture: '1.5e-3', limitingApertureExponent: '0.375' };
		const r = run(scenario({ line: cwLine({ wavelength: '10.6e-6', power: '1', beamDiameter: '1e-3' }), limits: [cornea], points: [eyePoint('p', '0', { exposureDuration: '5' })], nohd: '5' }));
		const c = r.points[0].lines[0].checks[0].comparisons[0];
		expect(c.limitingAperture).toBeCloseTo(1.5e-3 * 5 ** 0.375, 15);
		expect(c.averagingDiameter).toBeCloseTo(1.5e-3 * 5 ** 0.375, 15);
	});
});

describe('tunable lines', () => {
	it('are assessed at both ends and wherever a limit begins or ends inside the range, the worst wavelength deciding', () => {
		// 650–760 nm: the visible limit ends at 700 nm, so 700–760 nm has only the C_A limit.
		const tunable = cwLine({ wavelength: '650e-9', wavelengthMax: '760e-9', power: '1e-3' });
		const r = run(scenario({ line: tunable, limits: [{ ...EYE_VISIBLE, durationMax: '30000' }, RETINA_LONG], points: [eyePoint('p', '0', { exposureDuration: '10' })], nohd: '10' }));
		const l = r.points[0].lines[0];
		expect(l.tuning!.assessedAt).toEqual([650e-9, 700e-9, 760e-9]);
		expect(r.lines[0].wavelengthMax).toBe(760e-9);
		// The OD eyewear needs is asked for over the whole range.
		expect(r.requiredOpticalDensities[0]).toMatchObject({ wavelengthMin: 650e-9, wavelengthMax: 760e-9 });
	});

	it('a range that leaves every limit behind is not shown as safe', () => {
		const tunable = cwLine({ wavelength: '650e-9', wavelengthMax: '1500e-9', power: '1e-6' });
		const r = run(scenario({ line: tunable, limits: [{ ...RETINA_LONG, wavelengthMin: '400e-9', wavelengthMax: '1400e-9' }], points: [eyePoint('p', '0', { exposureDuration: '10' })], nohd: '10' }));
		expect(r.points[0].verdict).toBe('no_applicable_limit');
		expect(r.points[0].lines[0].tuning!.assessedAt).toContain(1400e-9);
	});

	it('refuses a tuning range that runs backwards, naming the field', () => {
		const s = scenario({ line: cwLine({ wavelength: '800e-9', wavelengthMax: '700e-9' }) });
		const out = evaluate(s.path, s.limits);
		expect(out.ok ? [] : out.errors.map((e) => e.field)).toEqual(['lines.0.wavelengthMax']);
	});
});
