import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { AssessmentResult, Step } from '$lib/assessmentResult';
import type { LimitSI } from '$lib/schemas/assessment';
import { DEMO_LIMITS, cwLine, el, eyePoint, free, pulsedLine, run, scenario, type Scenario } from './fixtures';

/**
 * Recomputes one step from the values the step itself lists. Every kind of step the engine writes
 * must be known here, so a new step cannot slip in without a way to check it.
 */
function recompute(step: Step): number {
	const v = Object.fromEntries(step.inputs.map((i) => [i.symbol, i.value]));
	const xs = step.inputs.map((i) => i.value);
	const h = v['h'] ?? 1;
	const kind = step.id.split('.').pop()!;
	if (step.id.startsWith('sum.')) return xs.reduce((a, b) => a + b, 0);
	switch (kind) {
		case 'apparent-source':
			return 2 * Math.atan(v['D'] / (2 * v['r']));
		case 'photon-energy':
			return (v['h'] * v['c']) / v['λ'];
		case 'photon-energy-ev':
			return v['E_ph'] / v['e'];
		case 'beam-diameter':
			return step.formula.includes('√2') ? xs[0] / Math.SQRT2 : xs[0] / Math.sqrt(Math.LN2);
		case 'divergence':
			if (step.id.includes('lens')) return 2 * Math.atan(v['D_lens'] / (2 * v['f']));
			return step.formula.includes('√2') ? xs[0] / Math.SQRT2 : xs[0] / Math.sqrt(Math.LN2);
		case 'flat-top':
			return v['W'];
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
			return Math.sqrt(v['D_w'] ** 2 + (v['φ'] * (v['z'] - v['z_w'])) ** 2);
		case 'power':
		case 'energy':
			return xs[0] * xs[1];
		case 'irradiance':
		case 'pulse-exposure':
		case 'exposure':
			if ('ρ' in v) return (v['ρ'] * xs[1] * Math.cos(v['θ'])) / (Math.PI * v['r'] ** 2);
			return (h * xs[0]) / ((Math.PI * xs[1] ** 2) / 4);
		case 'photon-flux-density':
		case 'photon-fluence':
			return xs[0] / xs[1];
		case 'averaging':
			return Math.max(v['D'], v['D_f']);
		case 'convert':
		case 'limit-measure':
			return step.formula.includes('/') ? xs[0] / xs[1] : xs[0] * xs[1];
		case 'limit':
			return v['k'] * (v['C(λ)'] ?? 1) * (v['C_E'] ?? 1) * v['t'] ** v['n'] * (v['N'] === undefined ? 1 : v['N'] ** v['x']);
		case 'ratio':
			return xs[0] / xs[1];
		case 'optical-density':
			return v['ratio'] > 1 ? Math.log10(v['ratio']) : 0;
		case 'diffuse-hazard-distance':
			return v['r'] * Math.sqrt(v['Σ ratio']);
		case 'critical-diameter':
			return Math.sqrt((4 * h * xs[0]) / (Math.PI * v['EL']));
		case 'distance':
			if (step.formula.startsWith('0')) return 0;
			// Lines summed: the distance is found numerically; its ratios must add up to 1 there.
			if (step.formula.includes('solved numerically')) {
				const total = step.inputs.filter((i) => i.symbol.startsWith('ratio')).reduce((a, i) => a + i.value, 0);
				if (Math.abs(total - 1) > 1e-9) throw new Error(`summed ratios at the distance: ${total}`);
				return step.value;
			}
			return v['z_w'] + Math.sqrt(v['D_c'] ** 2 - v['D_w'] ** 2) / v['φ'] - v['z₀'];
		case 'focal-spot':
			return (2 * v['M²'] * v['λ'] * v['f']) / (Math.PI * v['D_lens']);
	}
	throw new Error(`no recomputation for step ${step.id}`);
}

const allSteps = (r: AssessmentResult): Step[] => [...r.breakdown, ...r.points.flatMap((p) => p.breakdown)];

function expectReproduced(list: Step[]): void {
	expect(list.length).toBeGreaterThan(5);
	for (const s of list) {
		const got = recompute(s);
		if (!(Math.abs(got - s.value) <= 1e-12 * Math.max(Math.abs(s.value), 1e-300))) throw new Error(`step ${s.id} (${s.formula}): listed ${s.value}, recomputed ${got}`);
	}
}

const rich: Scenario = scenario(
	{
		line: cwLine({ power: '2', beamDiameterDefinition: '1/e2', divergenceDefinition: 'fwhm', beamQuality: '1.2', hotSpotFactor: '1.4' }),
		points: [
			eyePoint('a', '0.5'),
			eyePoint('b', '2'),
			eyePoint('c', '3.9', { exposureDuration: '100' }),
			{ ...eyePoint('d', '4'), kind: 'diffuse', reflectance: '0.8', viewingAngle: '0.3', viewingDistance: '0.5' },
			eyePoint('e', '4.5', { tissue: 'skin', exposureDuration: '100' })
		]
	},
	[free(1), el('transmission', { transmission: '0.5', label: 'ND filter' }), el('mirror', { reflectance: '0.99' }), el('expander', { magnification: '2' }), free(2), el('lens', { focalLength: '0.3' }), free(1), el('enclosure', { length: '1' })]
);

describe('the working reproduces the result from its own listed values', () => {
	it('for a continuous line through filter, mirror, expander, lens and enclosure, with diffuse and skin points and a hot spot', () => {
		expectReproduced(allSteps(run(rich)));
	});

	it('for repetitive and single-pulse lines with limit conversions and a pulse train, and a flat-top beam', () => {
		expectReproduced(allSteps(run({ ...rich, path: { ...rich.path, lines: [pulsedLine({ pulseEnergy: '2e-4', pulseDuration: '5e-9' })] } })));
		const irradianceLimit: LimitSI = { ...DEMO_LIMITS[2], id: 'irr', quantity: 'irradiance', k: '1e6', pulseTrainExponent: null };
		expectReproduced(allSteps(run({ path: { ...rich.path, lines: [cwLine({ mode: 'single_pulse', power: null, pulseEnergy: '2e-4', pulseDuration: '5e-9' })] }, limits: [...DEMO_LIMITS, irradianceLimit] })));
		expectReproduced(allSteps(run({ ...rich, path: { ...rich.path, lines: [cwLine({ beamProfile: 'flat_top', beamDiameter: '0.012' })] } })));
	});

	it('for random continuous set-ups (property)', () => {
		fc.assert(
			fc.property(fc.double({ min: 1e-3, max: 20, noNaN: true }), fc.double({ min: 0.3e-3, max: 8e-3, noNaN: true }), fc.double({ min: 1e-4, max: 5e-3, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.constantFrom('0.25', '5', '100'), (power, d0, phi, frac, T) => {
				const s = scenario({ line: cwLine({ power: String(power), beamDiameter: String(d0), divergence: String(phi) }), points: [eyePoint('p', (6 * frac).toFixed(4), { exposureDuration: T })], nohd: T }, [free(3), el('transmission', { transmission: '0.3' }), free(3)]);
				expectReproduced(allSteps(run(s)));
			}),
			{ numRuns: 100 }
		);
	});

	it('and the reported numbers are the values of their steps', () => {
		const r = run(rich);
		if (r.nohd.distance !== null) expect(r.breakdown.find((s) => s.id === 'nohd.distance')!.value).toBe(r.nohd.distance);
		for (const p of r.points) {
			const ratios = p.breakdown.filter((s) => s.id.endsWith('.ratio')).map((s) => s.value);
			if (p.worstRatio !== null) expect(Math.max(...ratios)).toBe(p.worstRatio);
			expect(p.breakdown.find((s) => s.id === 'line1.diameter')!.value).toBe(p.lines[0].beamDiameter);
			if (p.requiredOpticalDensity) expect(p.breakdown.find((s) => s.id === 'optical-density')!.value).toBe(p.requiredOpticalDensity.value);
			if (p.diffuseHazardDistance?.distance) expect(p.breakdown.find((s) => s.id === 'diffuse-hazard-distance')!.value).toBe(p.diffuseHazardDistance.distance);
		}
		expect(r.breakdown.find((s) => s.id === 'photon-energy')!.value).toBe(r.lines[0].photonEnergy);
	});

	it('is left out on request, with the same results', () => {
		const a = run(rich);
		const b = run(rich, false);
		expect(b.breakdown).toEqual([]);
		expect(b.points.every((p) => p.breakdown.length === 0)).toBe(true);
		expect(b.points.map((p) => p.worstRatio)).toEqual(a.points.map((p) => p.worstRatio));
		expect(b.nohd.distance).toEqual(a.nohd.distance);
		expect(b.stretches).toEqual(a.stretches);
	});
});
