import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { assess } from './assess';
import { AssessmentDec } from './constants';
import { EYE_VISIBLE, EYE_VISIBLE_LONG, EYE_VISIBLE_PULSE, cwLine, eyePoint, scenario } from './fixtures';
import { validate } from './validate';
import type { AssessmentInput, AssessmentResult, LimitInput } from './types';

function run(input: AssessmentInput): AssessmentResult {
	const out = assess(input);
	if (!out.ok) throw new Error(JSON.stringify(out.errors));
	return out.result;
}

/**
 * Limits, wavelengths and exposure durations are normalised once and shared across assessments
 * (validate.ts, numbers.ts), and limit values are memoised on the shared limit. None of that may
 * change what an assessment returns.
 */
describe('caches shared across assessments', () => {
	it('an edited limit that keeps its id and version is read afresh', () => {
		const before = run(scenario({ limits: [EYE_VISIBLE] }));
		const edited: LimitInput = { ...EYE_VISIBLE, k: '9' };
		const after = run(scenario({ limits: [edited] }));
		expect(Math.abs(Number(after.points[0].worstRatio) / (2 * Number(before.points[0].worstRatio)) - 1)).toBeLessThan(1e-11);
		expect(after.points[0].checks[0].comparisons[0].limitValue).not.toBe(before.points[0].checks[0].comparisons[0].limitValue);
		// Every field takes part: the label and the citation are written into the result.
		const relabelled = run(scenario({ limits: [{ ...EYE_VISIBLE, label: 'renamed', citation: 'another code' }] }));
		expect(relabelled.points[0].checks[0].comparisons[0].limit).toMatchObject({ label: 'renamed', citation: 'another code' });
		// A number and the same value as text are distinct inputs but give the same result.
		const numeric = run(scenario({ limits: [{ ...EYE_VISIBLE, k: 18 }] }));
		expect(numeric.points[0].worstRatio).toBe(before.points[0].worstRatio);
	});

	it('a limit object changed between two assessments is read as it is now', () => {
		const limit: LimitInput = { ...EYE_VISIBLE };
		const first = run(scenario({ limits: [limit] }));
		limit.limitingAperture = '1e-3';
		const second = run(scenario({ limits: [limit] }));
		expect(second.points[0].checks[0].comparisons[0].limitingAperture).toBe('0.001');
		expect(first.points[0].checks[0].comparisons[0].limitingAperture).toBe('0.007');
	});

	it('an invalid limit is reported every time, also after a valid one with the same id', () => {
		run(scenario({ limits: [EYE_VISIBLE] }));
		for (let i = 0; i < 2; i++) {
			const out = assess(scenario({ limits: [{ ...EYE_VISIBLE, k: '-1' }] }));
			expect(out.ok).toBe(false);
			if (!out.ok) expect(out.errors.map((e) => e.field)).toEqual(['limits.0.k']);
		}
	});

	it('the same limit offered twice in one assessment keeps both entries and both indices', () => {
		const r = run(scenario({ limits: [EYE_VISIBLE, EYE_VISIBLE] }));
		expect(r.limitsConsidered).toHaveLength(2);
		expect(r.points[0].checks[0].comparisons).toHaveLength(2);
		const v = validate(scenario({ limits: [EYE_VISIBLE, EYE_VISIBLE] }), AssessmentDec);
		if (!v.ok) throw new Error('unexpected');
		expect(v.input.limits.map((l) => l.index)).toEqual([0, 1]);
		expect(v.input.limits[0]).not.toBe(v.input.limits[1]);
	});

	it('results do not depend on what was assessed before (any order of a set of assessments)', () => {
		const inputs: AssessmentInput[] = [
			scenario({ limits: [EYE_VISIBLE, EYE_VISIBLE_LONG] }),
			scenario({ line: cwLine({ power: 2 }), points: [eyePoint('p', '3', { exposureDuration: 10 }), eyePoint('q', '4', { exposureDuration: '10' })], limits: [EYE_VISIBLE, EYE_VISIBLE_LONG] }),
			scenario({ line: cwLine({ mode: 'repetitive', power: null, pulseEnergy: '1e-4', pulseDuration: '1e-8', repetitionRate: '1000' }), limits: [EYE_VISIBLE, EYE_VISIBLE_PULSE], nohd: { exposureDuration: '0.250' } }),
			scenario({ line: cwLine({ wavelength: 5.32e-7 }), limits: [{ ...EYE_VISIBLE, n: '0.5' }] })
		];
		const alone = inputs.map((i) => JSON.stringify(assess(i)));
		fc.assert(
			fc.property(fc.array(fc.integer({ min: 0, max: inputs.length - 1 }), { minLength: 1, maxLength: 12 }), (order) => {
				for (const i of order) expect(JSON.stringify(assess(inputs[i]))).toBe(alone[i]);
			}),
			{ numRuns: 50 }
		);
	});

	it('equal durations written differently are one duration within an assessment', () => {
		const r = run(scenario({ points: [eyePoint('a', '1', { exposureDuration: '0.25' }), eyePoint('b', '1', { exposureDuration: '.250' }), eyePoint('c', '1', { exposureDuration: 0.25 })] }));
		expect(new Set(r.points.map((p) => p.worstRatio)).size).toBe(1);
		expect(r.points.map((p) => p.checks[0].duration)).toEqual(['0.25', '0.25', '0.25']);
	});
});
