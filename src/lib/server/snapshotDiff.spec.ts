import { describe, expect, it } from 'vitest';
import { diffInputs, diffResults, normaliseInputs } from './snapshotDiff';

const line = { id: 'L1', label: 'main', mode: 'continuous', wavelength: '5.32e-7', wavelengthMax: null, power: '5', pulseEnergy: null, pulseDuration: null, repetitionRate: null, beamProfile: 'gaussian', beamDiameter: '0.002', beamDiameterDefinition: '1/e2', divergence: '0.001', divergenceDefinition: '1/e2', beamQuality: null, hotSpotFactor: null };
const blank = { length: null, transmission: null, reflectance: null, magnification: null, focalLength: null, coreDiameter: null, numericalAperture: null, couplingTransmission: null };
const base = {
	path: {
		lines: [line],
		elements: [{ kind: 'propagate', label: '', ...blank, length: '1' }],
		points: [{ id: 'p1', label: 'Viewer', kind: 'intrabeam', tissue: 'eye', position: '1', exposureDuration: '0.25', reflectance: null, viewingAngle: null, viewingDistance: null }],
		nohdExposureDuration: '0.25'
	},
	limits: [{ id: 'L1', version: '1', label: 'Eye visible' }]
};

describe('snapshot diff', () => {
	it('finds nothing between equal inputs, even when numbers are written differently', () => {
		expect(diffInputs(base, structuredClone(base))).toEqual([]);
		const rewritten = structuredClone(base);
		rewritten.path.lines[0].power = '5.0';
		expect(diffInputs(base, rewritten)).toEqual([]);
	});

	it('names each change in the officer’s words and units', () => {
		const after = structuredClone(base) as typeof base & { path: { elements: Record<string, unknown>[] } };
		after.path.lines[0].power = '6';
		after.path.elements.push({ kind: 'lens', label: 'f = 100 mm', ...blank, focalLength: '0.1' });
		after.path.points[0].position = '1.5';
		after.limits[0].version = '2';
		expect(diffInputs(base, after)).toEqual([
			{ where: 'Line: Power', before: '5 W', after: '6 W' },
			{ where: 'Element 2 (lens, f = 100 mm)', before: 'not there', after: 'added' },
			{ where: 'Point “Viewer”: Distance along the path', before: '1 m', after: '1.5 m' },
			{ where: 'Limit “Eye visible”', before: 'version 1', after: 'version 2' }
		]);
	});

	it('reports removed points and withdrawn limits', () => {
		const after = { path: { ...structuredClone(base.path), points: [] }, limits: [] };
		expect(diffInputs(base, after)).toEqual([
			{ where: 'Point “Viewer”', before: 'present', after: 'removed' },
			{ where: 'Limit “Eye visible”', before: 'version 1', after: 'withdrawn' }
		]);
	});

	it('reads a snapshot of the 1.x engine ({ line, elements, points, limits, nohd }) as the same inputs', () => {
		const old = {
			line: { mode: 'continuous', wavelength: '5.32e-7', power: '5', beamDiameter: '0.002', beamDiameterDefinition: '1/e2', divergence: '0.001', divergenceDefinition: '1/e2', beamQuality: null },
			elements: [{ kind: 'propagate', length: '1', label: null }],
			points: [{ id: 'p1', label: 'Viewer', position: '1', tissue: 'eye', exposureDuration: '0.25', kind: 'intrabeam' }],
			limits: [{ id: 'L1', version: '1', label: 'Eye visible' }],
			nohd: { exposureDuration: '0.25' }
		};
		expect(normaliseInputs(old).path.nohdExposureDuration).toBe('0.25');
		expect(diffInputs(old, base)).toEqual([]);
		const profileChanged = structuredClone(base);
		profileChanged.path.lines[0].beamProfile = 'flat_top';
		expect(diffInputs(old, profileChanged)).toEqual([{ where: 'Line: Beam profile', before: 'gaussian', after: 'flat_top' }]);
	});

	it('names the changes of the answer: engine, verdict, worst ratio, whole OD', () => {
		const before = { engineVersion: 'beamwarden-hazard 1.0.0', verdict: 'within_limit', worstRatio: '0.9', requiredOpticalDensity: { roundedUpWhole: '0' } };
		const after = { engineVersion: 'beamwarden-hazard 2.0.0', verdict: 'exceeds_limit', worstRatio: 1.62, requiredOpticalDensity: { roundedUpWhole: 1 } };
		expect(diffResults(before, after)).toEqual([
			{ where: 'Hazard engine', before: 'beamwarden-hazard 1.0.0', after: 'beamwarden-hazard 2.0.0' },
			{ where: 'Verdict', before: 'within limit', after: 'exceeds limit' },
			{ where: 'Worst ratio (exposure ÷ limit)', before: '0.9', after: '1.62' },
			{ where: 'Optical density needed (whole)', before: '0', after: '1' }
		]);
		expect(diffResults(after, structuredClone(after))).toEqual([]);
	});
});
