import { describe, expect, it } from 'vitest';
import { evaluate } from './evaluate';
import { EYE_VISIBLE, EYE_VISIBLE_PULSE, cwLine, el, eyePoint, free, scenario, type Scenario } from './fixtures';
import { limitProblems, lineProblems } from './validate';

const withElements = (...elements: ReturnType<typeof el>[]) => scenario({}, [...elements, free(10)]);

describe('bad input returns typed errors naming the field', () => {
	const cases: [string, Scenario, string][] = [
		['zero power', scenario({ line: cwLine({ power: '0' }) }), 'lines.0.power'],
		['negative power', scenario({ line: cwLine({ power: '-1' }) }), 'lines.0.power'],
		['missing power', scenario({ line: cwLine({ power: null }) }), 'lines.0.power'],
		['non-positive pulse energy', scenario({ line: cwLine({ mode: 'single_pulse', pulseEnergy: '0', pulseDuration: '1e-9' }) }), 'lines.0.pulseEnergy'],
		['wavelength below 180 nm', scenario({ line: cwLine({ wavelength: '179e-9' }) }), 'lines.0.wavelength'],
		['wavelength above 1 mm', scenario({ line: cwLine({ wavelength: '1.0001e-3' }) }), 'lines.0.wavelength'],
		['NaN', scenario({ line: cwLine({ power: NaN as never }) }), 'lines.0.power'],
		['Infinity', scenario({ line: cwLine({ power: Infinity as never }) }), 'lines.0.power'],
		['"Infinity" text', scenario({ line: cwLine({ power: 'Infinity' }) }), 'lines.0.power'],
		['beyond 1e30', scenario({ line: cwLine({ power: '1e31' }) }), 'lines.0.power'],
		['below 1e-30', scenario({ line: cwLine({ power: '1e-31' }) }), 'lines.0.power'],
		['non-numeric string', scenario({ line: cwLine({ power: '5 W' }) }), 'lines.0.power'],
		['hex string', scenario({ line: cwLine({ power: '0x10' }) }), 'lines.0.power'],
		['negative divergence', scenario({ line: cwLine({ divergence: '-1e-3' }) }), 'lines.0.divergence'],
		['zero beam diameter', scenario({ line: cwLine({ beamDiameter: '0' }) }), 'lines.0.beamDiameter'],
		['unknown diameter definition', scenario({ line: cwLine({ beamDiameterDefinition: '86%' as never }) }), 'lines.0.beamDiameterDefinition'],
		['unknown profile', scenario({ line: cwLine({ beamProfile: 'donut' as never }) }), 'lines.0.beamProfile'],
		['M² below 1', scenario({ line: cwLine({ beamQuality: '0.9' }) }), 'lines.0.beamQuality'],
		['hot-spot factor below 1', scenario({ line: cwLine({ hotSpotFactor: '0.5' }) }), 'lines.0.hotSpotFactor'],
		['unknown mode', scenario({ line: cwLine({ mode: 'cw' as never }) }), 'lines.0.mode'],
		['pulse longer than its period', scenario({ line: cwLine({ mode: 'repetitive', pulseEnergy: '1e-3', pulseDuration: '2e-3', repetitionRate: '1000' }) }), 'lines.0.pulseDuration'],
		['tuning range below the wavelength', scenario({ line: cwLine({ wavelengthMax: '500e-9' }) }), 'lines.0.wavelengthMax'],
		['transmission above 1', withElements(el('transmission', { transmission: '1.2' })), 'elements.0.transmission'],
		['transmission below 0', withElements(el('transmission', { transmission: '-0.1' })), 'elements.0.transmission'],
		['reflectance above 1', withElements(el('mirror', { reflectance: '1.01' })), 'elements.0.reflectance'],
		['negative length', withElements(el('propagate', { length: '-1' })), 'elements.0.length'],
		['zero focal length', withElements(el('lens', { focalLength: '0' })), 'elements.0.focalLength'],
		['zero magnification', withElements(el('expander', { magnification: '0' })), 'elements.0.magnification'],
		['NA above 1', withElements(el('fibre', { coreDiameter: '5e-5', numericalAperture: '1.2' })), 'elements.0.numericalAperture'],
		['unknown element kind', withElements(el('prism' as never)), 'elements.0.kind'],
		['point past the end of the path', scenario({ points: [eyePoint('p', '11')] }), 'points.0.position'],
		['negative position', scenario({ points: [eyePoint('p', '-1')] }), 'points.0.position'],
		['zero exposure duration', scenario({ points: [eyePoint('p', '1', { exposureDuration: '0' })] }), 'points.0.exposureDuration'],
		['unknown tissue', scenario({ points: [eyePoint('p', '1', { tissue: 'retina' as never })] }), 'points.0.tissue'],
		['diffuse reflectance above 1', scenario({ points: [eyePoint('p', '1', { kind: 'diffuse', reflectance: '2', viewingDistance: '1' })] }), 'points.0.reflectance'],
		['viewing angle of 90°', scenario({ points: [eyePoint('p', '1', { kind: 'diffuse', reflectance: '0.5', viewingDistance: '1', viewingAngle: String(Math.PI / 2 + 1e-9) })] }), 'points.0.viewingAngle'],
		['zero viewing distance', scenario({ points: [eyePoint('p', '1', { kind: 'diffuse', reflectance: '0.5', viewingDistance: '0' })] }), 'points.0.viewingDistance'],
		['duplicate point id', scenario({ points: [eyePoint('p', '1'), eyePoint('p', '2')] }), 'points.1.id'],
		['limit with inverted wavelength range', scenario({ limits: [{ ...EYE_VISIBLE, wavelengthMin: '700e-9', wavelengthMax: '400e-9' }] }), 'limits.0.wavelengthMax'],
		['limit with zero k', scenario({ limits: [{ ...EYE_VISIBLE, k: '0' }] }), 'limits.0.k'],
		['limit exponent above 2', scenario({ limits: [{ ...EYE_VISIBLE, n: '3' }] }), 'limits.0.n'],
		['limit with unknown quantity', scenario({ limits: [{ ...EYE_VISIBLE, quantity: 'radiance' as never }] }), 'limits.0.quantity'],
		['limit without citation', scenario({ limits: [{ ...EYE_VISIBLE, citation: '' }] }), 'limits.0.citation'],
		['positive pulse-train exponent', scenario({ limits: [{ ...EYE_VISIBLE_PULSE, pulseTrainExponent: '0.25' }] }), 'limits.0.pulseTrainExponent'],
		['pulse-train exponent on a continuous limit', scenario({ limits: [{ ...EYE_VISIBLE, pulseTrainExponent: '-0.25' }] }), 'limits.0.pulseTrainExponent'],
		['an exponent and "no train correction" at once', scenario({ limits: [{ ...EYE_VISIBLE_PULSE, noTrainCorrection: true }] }), 'limits.0.noTrainCorrection'],
		['NOHD duration negative', scenario({ nohd: '-1' }), 'nohdExposureDuration']
	];
	for (const [what, s, field] of cases) {
		it(`${what} → ${field}`, () => {
			const out = evaluate(s.path, s.limits);
			expect(out.ok).toBe(false);
			if (out.ok) return;
			expect(out.errors.map((e) => e.field)).toContain(field);
			for (const e of out.errors) expect(e.reason.length).toBeGreaterThan(10);
		});
	}

	it('refuses a malformed shape with a field named', () => {
		const s = scenario();
		const fields = (path: unknown, limits: unknown = s.limits) => {
			const out = evaluate(path, limits);
			return out.ok ? [] : out.errors.map((e) => e.field);
		};
		expect(fields({ ...s.path, elements: 'none' })).toContain('elements');
		expect(fields({ ...s.path, points: {} })).toContain('points');
		expect(fields({ ...s.path, lines: [] })).toContain('lines');
		expect(fields(s.path, 'none')).toContain('limits');
		expect(fields(null)).toEqual(['']);
	});

	it('collects every error, not just the first', () => {
		const s = scenario({ line: cwLine({ power: '-1', wavelength: '1', divergence: '-1' }), points: [eyePoint('p', '-3', { tissue: 'lung' as never })] }, [el('transmission', { transmission: '7' })]);
		const out = evaluate(s.path, s.limits);
		expect(out.ok ? [] : out.errors.map((e) => e.field).sort()).toEqual(['elements.0.transmission', 'lines.0.divergence', 'lines.0.power', 'lines.0.wavelength', 'points.0.position', 'points.0.tissue'].sort());
	});

	it('accepts numbers and numeric strings alike', () => {
		const a = evaluate(scenario({ line: cwLine({ power: 0.1 as never }) }).path, scenario().limits);
		const b = evaluate(scenario({ line: cwLine({ power: ' 1e-1 ' }) }).path, scenario().limits);
		expect(a.ok && b.ok && a.result.points[0].worstRatio === b.result.points[0].worstRatio).toBe(true);
	});

	it('accepts the boundary values 180 nm and 1 mm, T = 0 and 1, R = 0, f = 1 mm, M = 0.01 and 1000', () => {
		const ok = (s: Scenario) => evaluate(s.path, s.limits).ok;
		expect(ok(scenario({ line: cwLine({ wavelength: '180e-9' }) }))).toBe(true);
		expect(ok(scenario({ line: cwLine({ wavelength: '1e-3' }) }))).toBe(true);
		expect(ok(withElements(el('transmission', { transmission: '0' }), el('mirror', { reflectance: '1' }), el('lens', { focalLength: '1e-3' }), el('expander', { magnification: '0.01' }), el('expander', { magnification: '1000' })))).toBe(true);
	});

	it('offers the line and limit rules alone to the forms, named by their own fields', () => {
		expect(lineProblems(cwLine({ power: '-2' })).map((e) => e.field)).toEqual(['power']);
		expect(lineProblems(cwLine({ wavelength: '5e-9' })).map((e) => e.field)).toEqual(['wavelength']);
		expect(lineProblems(cwLine({ power: '0', beamDiameter: '0' })).map((e) => e.field).sort()).toEqual(['beamDiameter', 'power']);
		expect(lineProblems(cwLine())).toEqual([]);
		expect(limitProblems({ ...EYE_VISIBLE, n: '-5' }).map((e) => e.field)).toEqual(['n']);
		expect(limitProblems(EYE_VISIBLE)).toEqual([]);
	});
});
