import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { assess } from './assess';
import { DEMO_LIMITS, cwLine, eyePoint } from './fixtures';
import type { AssessmentInput, BreakdownStep, ElementInput, LineInput, PointInput } from './types';

/**
 * Recomputes one step from the values the step itself lists, in float64. Every kind of step the
 * engine writes must be known here, so a new step cannot slip in without a way to check it.
 */
function recompute(step: BreakdownStep): number {
	const v = Object.fromEntries(step.inputs.map((i) => [i.symbol, Number(i.value)]));
	const xs = step.inputs.map((i) => Number(i.value));
	const kind = step.id.split('.').pop()!;
	switch (kind) {
		case 'photon-energy':
			return (v['h'] * v['c']) / v['λ'];
		case 'photon-energy-ev':
			return v['E_ph'] / v['e'];
		case 'beam-diameter':
		case 'divergence':
			if (step.id.startsWith('lens')) return v['D_lens'] / v['f'];
			return step.formula.includes('√2') ? xs[0] / Math.SQRT2 : xs[0] / Math.sqrt(Math.LN2);
		case 'average-power':
			return v['Q'] * v['f'];
		case 'peak-power':
			return v['Q'] / v['τ'];
		case 'photon-flux':
			return v['P'] / v['E_ph'];
		case 'photons-per-pulse':
			return v['Q'] / v['E_ph'];
		case 'transmission':
			return xs.reduce((a, b) => a * b, 1);
		case 'diameter':
			return Math.hypot(v['D_w'], v['φ'] * (v['z'] - v['z_w']));
		case 'power':
		case 'energy':
			return xs[0] * xs[1];
		case 'irradiance':
		case 'pulse-exposure':
		case 'exposure':
			if (step.inputs.length === 4) return (v['ρ'] * xs[1] * Math.cos(v['θ'])) / (Math.PI * v['r'] ** 2);
			return xs[0] / ((Math.PI * xs[1] ** 2) / 4);
		case 'photon-flux-density':
		case 'photon-fluence':
			return xs[0] / xs[1];
		case 'averaging':
			return Math.max(v['D'], v['D_f']);
		case 'convert':
			return step.formula.includes('/') ? xs[0] / xs[1] : xs[0] * xs[1];
		case 'limit':
			return v['k'] * v['t'] ** v['n'] * (v['N'] === undefined ? 1 : v['N'] ** v['x']);
		case 'limit-measure':
			return step.formula.includes('/') ? xs[0] / xs[1] : xs[0] * xs[1];
		case 'ratio':
			return xs[0] / xs[1];
		case 'optical-density':
			return v['ratio'] > 1 ? Math.log10(v['ratio']) : 0;
		case 'diffuse-hazard-distance':
			return Math.sqrt((v['ρ'] * xs[1] * Math.cos(v['θ'])) / (Math.PI * v['EL']));
		case 'critical-diameter':
			return Math.sqrt((4 * xs[0]) / (Math.PI * v['EL']));
		case 'distance': {
			if (step.formula.startsWith('0')) return 0;
			const w = step.inputs[1].value;
			return Math.sqrt(v['D_c'] ** 2 - Number(w) ** 2) / v['φ'];
		}
		case 'focal-spot':
			return (2 * v['M²'] * v['λ'] * v['f']) / (Math.PI * v['D_lens']);
	}
	throw new Error(`no recomputation for step ${step.id}`);
}

function steps(input: AssessmentInput): BreakdownStep[] {
	const out = assess(input);
	if (!out.ok) throw new Error(JSON.stringify(out.errors));
	return [...out.result.breakdown, ...out.result.points.flatMap((p) => p.breakdown)];
}

function expectReproduced(list: BreakdownStep[]): void {
	expect(list.length).toBeGreaterThan(5);
	for (const s of list) {
		const want = Number(s.value);
		const got = recompute(s);
		// Listed values carry 12 significant digits; recomputing from them reproduces ~11.
		const tol = 1e-9 * Math.max(Math.abs(want), 1e-300);
		if (!(Math.abs(got - want) <= tol)) throw new Error(`step ${s.id} (${s.formula}): listed ${s.value}, recomputed ${got}`);
	}
}

const rich: AssessmentInput = {
	line: cwLine({ power: '2', beamDiameterDefinition: '1/e2', divergenceDefinition: 'fwhm', beamQuality: '1.2' }),
	elements: [
		{ kind: 'propagate', length: '1' },
		{ kind: 'transmission', transmission: '0.5', label: 'ND filter' },
		{ kind: 'mirror', reflectance: '0.99' },
		{ kind: 'expander', magnification: '2' },
		{ kind: 'propagate', length: '2' },
		{ kind: 'lens', focalLength: '0.3' },
		{ kind: 'propagate', length: '1' },
		{ kind: 'enclosure', length: '1' }
	],
	points: [
		eyePoint('a', '0.5'),
		eyePoint('b', '2'),
		eyePoint('c', '3.9', { exposureDuration: '100' }),
		{ id: 'd', position: '4', tissue: 'eye', kind: 'diffuse', reflectance: '0.8', viewingAngle: '0.3', viewingDistance: '0.5', exposureDuration: '0.25' },
		eyePoint('e', '4.5', { tissue: 'skin', exposureDuration: '100' })
	],
	limits: DEMO_LIMITS,
	nohd: { exposureDuration: '0.25' }
};

describe('the breakdown reproduces the result from its own listed values', () => {
	it('for a continuous line through filter, mirror, expander, lens and enclosure, with diffuse and skin points', () => {
		expectReproduced(steps(rich));
	});

	it('for repetitive and single-pulse lines with limit conversions and a pulse train', () => {
		const rep: LineInput = cwLine({ mode: 'repetitive', power: null, pulseEnergy: '2e-4', pulseDuration: '5e-9', repetitionRate: '1000' });
		expectReproduced(steps({ ...rich, line: rep }));
		const sp: LineInput = cwLine({ mode: 'single_pulse', power: null, pulseEnergy: '2e-4', pulseDuration: '5e-9' });
		const irradianceLimit = { ...DEMO_LIMITS[2], id: 'irr', quantity: 'irradiance' as const, k: '1e6', pulseTrainExponent: null };
		expectReproduced(steps({ ...rich, line: sp, limits: [...DEMO_LIMITS, irradianceLimit] }));
	});

	it('for random continuous set-ups (property)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 1e-3, max: 20, noNaN: true }),
				fc.double({ min: 0.3e-3, max: 8e-3, noNaN: true }),
				fc.double({ min: 1e-4, max: 5e-3, noNaN: true }),
				fc.double({ min: 0, max: 1, noNaN: true }),
				fc.constantFrom('0.25', '5', '100'),
				(power, d0, phi, frac, T) => {
					const elements: ElementInput[] = [{ kind: 'propagate', length: '3' }, { kind: 'transmission', transmission: '0.3' }, { kind: 'propagate', length: '3' }];
					const points: PointInput[] = [eyePoint('p', (6 * frac).toFixed(4), { exposureDuration: T })];
					expectReproduced(steps({ line: cwLine({ power: String(power), beamDiameter: String(d0), divergence: String(phi) }), elements, points, limits: DEMO_LIMITS, nohd: { exposureDuration: T } }));
				}
			),
			{ numRuns: 100 }
		);
	});

	it('and the reported numbers are the values of their steps', () => {
		const out = assess(rich);
		if (!out.ok) throw new Error('unexpected');
		const r = out.result;
		const nohdStep = r.breakdown.find((s) => s.id === 'nohd.distance')!;
		expect(nohdStep.value).toBe(r.nohd.distance);
		for (const p of r.points) {
			const ratios = p.breakdown.filter((s) => s.id.endsWith('.ratio')).map((s) => Number(s.value));
			if (p.worstRatio !== null) expect(Math.max(...ratios)).toBe(Number(p.worstRatio));
			expect(p.breakdown.find((s) => s.id === 'diameter')!.value).toBe(p.beamDiameter);
			if (p.requiredOpticalDensity) expect(p.breakdown.find((s) => s.id === 'optical-density')!.value).toBe(p.requiredOpticalDensity.value);
			if (p.diffuseHazardDistance) expect(p.breakdown.find((s) => s.id === 'diffuse-hazard-distance')!.value).toBe(p.diffuseHazardDistance.distance);
		}
		expect(r.breakdown.find((s) => s.id === 'photon-energy')!.value).toBe(r.line.photonEnergy);
	});

	it('is left out on request, with the same results', () => {
		const a = assess(rich);
		const b = assess({ ...rich, options: { breakdown: false } });
		if (!a.ok || !b.ok) throw new Error('unexpected');
		expect(b.result.breakdown).toEqual([]);
		expect(b.result.points.map((p) => p.worstRatio)).toEqual(a.result.points.map((p) => p.worstRatio));
		expect(b.result.nohd).toEqual(a.result.nohd);
	});
});
