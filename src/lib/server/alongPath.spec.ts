import { describe, expect, it } from 'vitest';
import { beamEnvelope, exposureProfile, samplingDuration } from './alongPath';
import { eyePoint, free, run, scenario } from './hazard/fixtures';
import { propagatedDiameter } from './hazard';

describe('the beam and the exposure along a path', () => {
	it('samples at the hazard-distance duration, else at the first eye point’s, else at none', () => {
		expect(samplingDuration(scenario({ nohd: '10' }).path)).toBe('10');
		expect(samplingDuration(scenario({ nohd: null, points: [eyePoint('p', 2, { exposureDuration: '3' })] }).path)).toBe('3');
		expect(samplingDuration(scenario({ nohd: null, points: [eyePoint('p', 2, { tissue: 'skin' })] }).path)).toBeNull();
	});

	it('draws the envelope even when no duration is given: the diameter does not depend on it', () => {
		const s = scenario({ nohd: null, points: [eyePoint('p', 2, { tissue: 'skin' })] }, [free(10)]);
		const samples = beamEnvelope(s.path, s.limits, 10, [10]);
		expect(samples).not.toBeNull();
		expect(samples!.at(0)!.position).toBe(0);
		expect(samples!.at(-1)!.position).toBe(10);
		// The widest line at 10 m is the engine's own propagated diameter (Gaussian beam, common practice).
		const line = s.path.lines[0];
		expect(samples!.at(-1)!.diameter).toBeCloseTo(propagatedDiameter(Number(line.beamDiameter), Number(line.divergence), 10), 12);
	});

	it('plots the exposure at the sampling duration against the assessment’s limits', () => {
		const s = scenario({ nohd: '0.25' });
		const profile = exposureProfile(s.path, s.limits, run(s, false));
		expect(profile?.exposureDuration).toBe(0.25);
		expect(profile?.samples).toHaveLength(81);
	});
});
