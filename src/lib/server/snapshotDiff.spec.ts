import { describe, expect, it } from 'vitest';
import { diffInputs } from './snapshotDiff';

const base = {
	line: { mode: 'continuous', wavelength: '5.32e-7', power: '5', beamDiameter: '0.002', beamDiameterDefinition: '1/e2', divergence: '0.001', divergenceDefinition: '1/e2', beamQuality: null },
	elements: [{ kind: 'propagate', length: '1', label: null }],
	points: [{ id: 'p1', label: 'Viewer', position: '1', tissue: 'eye', exposureDuration: '0.25', kind: 'intrabeam' }],
	limits: [{ id: 'L1', version: '1', label: 'Eye visible' }],
	nohd: { exposureDuration: '0.25' }
};

describe('snapshot diff', () => {
	it('finds nothing between equal inputs, even when numbers are written differently', () => {
		expect(diffInputs(base, structuredClone(base))).toEqual([]);
		const rewritten = structuredClone(base);
		rewritten.line.power = '5.0';
		expect(diffInputs(base, rewritten)).toEqual([]);
	});

	it('names each change in the officer’s words and units', () => {
		const after = structuredClone(base) as typeof base & { elements: Record<string, unknown>[] };
		after.line.power = '6';
		after.elements.push({ kind: 'lens', focalLength: '0.1', label: 'f = 100 mm' });
		after.points[0].position = '1.5';
		after.limits[0].version = '2';
		const changes = diffInputs(base, after);
		expect(changes).toEqual([
			{ where: 'Line: Power', before: '5 W', after: '6 W' },
			{ where: 'Element 2 (lens, f = 100 mm)', before: 'not there', after: 'added' },
			{ where: 'Point “Viewer”: Distance along the path', before: '1 m', after: '1.5 m' },
			{ where: 'Limit “Eye visible”', before: 'version 1', after: 'version 2' }
		]);
	});

	it('reports removed points and withdrawn limits', () => {
		const after = { ...structuredClone(base), points: [], limits: [] };
		expect(diffInputs(base, after)).toEqual([
			{ where: 'Point “Viewer”', before: 'present', after: 'removed' },
			{ where: 'Limit “Eye visible”', before: 'version 1', after: 'withdrawn' }
		]);
	});
});
