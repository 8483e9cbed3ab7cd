import { describe, expect, it } from 'vitest';
import { assess } from './assess';
import { EYE_VISIBLE, cwLine, eyePoint, scenario } from './fixtures';
import type { AssessmentInput } from './types';

function fields(input: unknown): string[] {
	const out = assess(input as AssessmentInput);
	if (out.ok) return [];
	return out.errors.map((e) => e.field);
}

describe('bad input returns typed errors naming the field', () => {
	const cases: [string, AssessmentInput, string][] = [
		['zero power', scenario({ line: cwLine({ power: '0' }) }), 'line.power'],
		['negative power', scenario({ line: cwLine({ power: -1 }) }), 'line.power'],
		['missing power', scenario({ line: cwLine({ power: undefined }) }), 'line.power'],
		['non-positive pulse energy', scenario({ line: cwLine({ mode: 'single_pulse', pulseEnergy: '0', pulseDuration: '1e-9' }) }), 'line.pulseEnergy'],
		['wavelength below 180 nm', scenario({ line: cwLine({ wavelength: '179e-9' }) }), 'line.wavelength'],
		['wavelength above 1 mm', scenario({ line: cwLine({ wavelength: '1.0001e-3' }) }), 'line.wavelength'],
		['NaN', scenario({ line: cwLine({ power: NaN }) }), 'line.power'],
		['Infinity', scenario({ line: cwLine({ power: Infinity }) }), 'line.power'],
		['"Infinity" text', scenario({ line: cwLine({ power: 'Infinity' }) }), 'line.power'],
		['non-numeric string', scenario({ line: cwLine({ power: '5 W' }) }), 'line.power'],
		['hex string', scenario({ line: cwLine({ power: '0x10' }) }), 'line.power'],
		['negative divergence', scenario({ line: cwLine({ divergence: '-1e-3' }) }), 'line.divergence'],
		['zero beam diameter', scenario({ line: cwLine({ beamDiameter: '0' }) }), 'line.beamDiameter'],
		['unknown diameter definition', scenario({ line: cwLine({ beamDiameterDefinition: '86%' as never }) }), 'line.beamDiameterDefinition'],
		['M² below 1', scenario({ line: cwLine({ beamQuality: '0.9' }) }), 'line.beamQuality'],
		['unknown mode', scenario({ line: cwLine({ mode: 'cw' as never }) }), 'line.mode'],
		['pulse longer than its period', scenario({ line: cwLine({ mode: 'repetitive', pulseEnergy: '1e-3', pulseDuration: '2e-3', repetitionRate: '1000' }) }), 'line.pulseDuration'],
		['transmission above 1', scenario({}, [{ kind: 'transmission', transmission: '1.2' }, { kind: 'propagate', length: '10' }]), 'elements.0.transmission'],
		['transmission below 0', scenario({}, [{ kind: 'propagate', length: '10' }, { kind: 'transmission', transmission: '-0.1' }]), 'elements.1.transmission'],
		['reflectance above 1', scenario({}, [{ kind: 'mirror', reflectance: '1.01' }, { kind: 'propagate', length: '10' }]), 'elements.0.reflectance'],
		['negative length', scenario({}, [{ kind: 'propagate', length: '-1' }, { kind: 'propagate', length: '10' }]), 'elements.0.length'],
		['zero focal length', scenario({}, [{ kind: 'propagate', length: '10' }, { kind: 'lens', focalLength: '0' }]), 'elements.1.focalLength'],
		['zero magnification', scenario({}, [{ kind: 'expander', magnification: '0' }, { kind: 'propagate', length: '10' }]), 'elements.0.magnification'],
		['NA above 1', scenario({}, [{ kind: 'fibre', coreDiameter: '5e-5', numericalAperture: '1.2' }, { kind: 'propagate', length: '10' }]), 'elements.0.numericalAperture'],
		['unknown element kind', scenario({}, [{ kind: 'prism' } as never, { kind: 'propagate', length: '10' }]), 'elements.0.kind'],
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
		['limit with unknown quantity', scenario({ limits: [{ ...EYE_VISIBLE, quantity: 'radiance' as never }] }), 'limits.0.quantity'],
		['limit without citation', scenario({ limits: [{ ...EYE_VISIBLE, citation: '' }] }), 'limits.0.citation'],
		['positive pulse-train exponent', scenario({ limits: [{ ...EYE_VISIBLE, pulseBasis: 'single_pulse', pulseTrainExponent: '0.25' }] }), 'limits.0.pulseTrainExponent'],
		['pulse-train exponent on a continuous limit', scenario({ limits: [{ ...EYE_VISIBLE, pulseTrainExponent: '-0.25' }] }), 'limits.0.pulseTrainExponent'],
		['NOHD duration negative', scenario({ nohd: { exposureDuration: '-1' } }), 'nohd.exposureDuration'],
		['elements not a list', { ...scenario(), elements: 'none' as never }, 'elements'],
		['points missing', { ...scenario(), points: undefined as never }, 'points'],
		['line missing', { ...scenario(), line: undefined as never }, 'line']
	];
	for (const [what, input, field] of cases) {
		it(`${what} → ${field}`, () => {
			const out = assess(input);
			expect(out.ok).toBe(false);
			if (out.ok) return;
			expect(out.errors.map((e) => e.field)).toContain(field);
			for (const e of out.errors) expect(e.reason.length).toBeGreaterThan(10);
		});
	}

	it('collects every error, not just the first', () => {
		const input = scenario({ line: cwLine({ power: '-1', wavelength: '1', divergence: '-1' }), points: [eyePoint('p', '-3', { tissue: 'lung' as never })] }, [{ kind: 'transmission', transmission: '7' }]);
		expect(fields(input).sort()).toEqual(['elements.0.transmission', 'line.divergence', 'line.power', 'line.wavelength', 'points.0.position', 'points.0.tissue'].sort());
	});

	it('accepts numbers, numeric strings and decimals alike', () => {
		const a = assess(scenario({ line: cwLine({ power: 0.1 }) }));
		const b = assess(scenario({ line: cwLine({ power: '0.1' }) }));
		const c = assess(scenario({ line: cwLine({ power: ' 1e-1 ' }) }));
		expect(a.ok && b.ok && c.ok).toBe(true);
		if (a.ok && b.ok && c.ok) {
			expect(a.result.points[0].worstRatio).toBe(b.result.points[0].worstRatio);
			expect(c.result.points[0].worstRatio).toBe(b.result.points[0].worstRatio);
		}
	});

	it('accepts the boundary values 180 nm and 1 mm, T = 0 and 1, R = 0', () => {
		expect(assess(scenario({ line: cwLine({ wavelength: '180e-9' }) })).ok).toBe(true);
		expect(assess(scenario({ line: cwLine({ wavelength: '1e-3' }) })).ok).toBe(true);
		expect(assess(scenario({}, [{ kind: 'transmission', transmission: '0' }, { kind: 'mirror', reflectance: 1 }, { kind: 'propagate', length: '10' }])).ok).toBe(true);
	});
});
