import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { ElementSI } from '$lib/schemas/assessment';
import { diameterAt } from './beam';
import { cwLine, el, eyePoint, free, run, scenario } from './fixtures';
import { validate } from './validate';
import { enclosureAt, FIBRE_NOTE, focalSpotDiameter, originsAt, walkPath, type Walk } from './walk';

function walk(elements: ElementSI[], line = cwLine()): Walk {
	const v = validate({ lines: [line], elements, points: [], nohdExposureDuration: null }, []);
	if (!v.ok) throw new Error(JSON.stringify(v.errors));
	return walkPath(v.path.lines, v.path.elements, v.path.length);
}

// Entered values have a few decimals (subnormal doubles are outside what the engine accepts).
const fraction = fc.double({ min: 0, max: 1, noNaN: true }).map((x) => x.toFixed(4));
const element: fc.Arbitrary<ElementSI> = fc.oneof(
	fc.double({ min: 0, max: 5, noNaN: true }).map((L) => el('propagate', { length: L.toFixed(4) })),
	fc.double({ min: 0, max: 5, noNaN: true }).map((L) => el('enclosure', { length: L.toFixed(4) })),
	fraction.map((t) => el('transmission', { transmission: t })),
	fraction.map((r) => el('mirror', { reflectance: r })),
	fc.double({ min: 0.01, max: 100, noNaN: true }).map((m) => el('expander', { magnification: String(m) })),
	fc.double({ min: 1e-3, max: 10, noNaN: true }).map((f) => el('lens', { focalLength: String(f) })),
	fc.record({ c: fc.double({ min: 1e-6, max: 1e-3, noNaN: true }), na: fc.double({ min: 0.01, max: 1, noNaN: true }), t: fraction }).map(({ c, na, t }) => el('fibre', { coreDiameter: String(c), numericalAperture: String(na), couplingTransmission: t }))
);

describe('the path walk', () => {
	it('never raises the power and never makes it negative (any sequence of elements)', () => {
		fc.assert(
			fc.property(fc.array(element, { maxLength: 12 }), (elements) => {
				let previous = 1;
				for (const o of walk(elements).origins) {
					if (o.transmission[0] < 0 || o.transmission[0] > previous) return false;
					previous = o.transmission[0];
				}
				return true;
			}),
			{ numRuns: 300 }
		);
	});

	it('keeps the power at every point between 0 and the emitted power', () => {
		fc.assert(
			fc.property(fc.array(element, { maxLength: 8 }), fc.double({ min: 0, max: 1, noNaN: true }), (elements, where) => {
				const all = [...elements, free(1)];
				const length = all.reduce((a, e) => a + Number(e.length ?? 0), 0);
				const r = run(scenario({ points: [eyePoint('p', Math.min(length, Number((where * length).toFixed(6))))] }, all), false);
				const p = r.points[0].lines[0].power!;
				return p >= 0 && p <= 0.1;
			}),
			{ numRuns: 200 }
		);
	});

	it('measures distance along the path as the running sum of free-space and enclosure lengths', () => {
		const w = walk([free(1.5), el('mirror'), el('enclosure', { length: '2' }), free(0.25)]);
		expect(w.length).toBe(3.75);
		expect(enclosureAt(w, 2)).toBe(2);
		// The entry and exit planes of an enclosure are accessible (conservative).
		expect(enclosureAt(w, 1.5)).toBeNull();
		expect(enclosureAt(w, 3.5)).toBeNull();
		expect(w.stretches.map((s) => [s.from, s.to, s.enclosedBy])).toEqual([
			[0, 1.5, null],
			[1.5, 3.5, 2],
			[3.5, 3.75, null]
		]);
	});

	it('counts positions that differ by float rounding only as the same place', () => {
		// 0.1 + 0.2 = 0.30000000000000004 in float64: a point entered at 0.3 is at the element there.
		const w = walk([free(0.1), free(0.2), el('transmission', { transmission: '0.5' }), free(1)]);
		expect(originsAt(w, 0.3).map((o) => o.afterElement)).toEqual([null, 2]);
	});

	it('an expander multiplies the diameter by M and divides the divergence by M at its position', () => {
		const w = walk([free(2), el('expander', { magnification: '3' }), free(5)]);
		const [before, after] = originsAt(w, 2);
		expect(diameterAt(after.states[0], 2) / diameterAt(before.states[0], 2)).toBeCloseTo(3, 14);
		expect(after.states[0].divergence * 3).toBeCloseTo(before.states[0].divergence, 18);
		// Far beyond, the beam spreads at φ/M.
		expect(diameterAt(after.states[0], 1e6) / 1e6 / (before.states[0].divergence / 3)).toBeCloseTo(1, 4);
	});

	it('a lens focuses at f with the Gaussian diffraction floor and then opens in the cone 2·atan(D_lens/2f)', () => {
		const w = walk([free(1), el('lens', { focalLength: '0.1' }), free(1)], cwLine({ beamQuality: '1.3' }));
		const lens = w.origins[1].lens!;
		const dLens = 1e-3 * Math.SQRT2; // √(D₀² + (1 m·1 mrad)²)
		expect(lens.lensDiameters[0]).toBeCloseTo(dLens, 15);
		expect(lens.focusPosition).toBeCloseTo(1.1, 15);
		expect(lens.divergences[0]).toBeCloseTo(2 * Math.atan(dLens / 0.2), 15);
		// Gaussian waist (1/e²) 4·M²·λ·f/(π·D_lens,1/e²), both diameters ×√2 from 1/e (textbook Gaussian optics, from memory).
		const waist1e2 = (4 * 1.3 * 532e-9 * 0.1) / (Math.PI * dLens * Math.SQRT2);
		expect(lens.focalSpots[0] / (waist1e2 / Math.SQRT2)).toBeCloseTo(1, 14);
		expect(focalSpotDiameter(532e-9, 0.1, dLens, 1.3)).toBe(lens.focalSpots[0]);
		expect(diameterAt(w.origins[1].states[0], 1.1)).toBe(lens.focalSpots[0]);
	});

	it('a fibre output starts at the core diameter with full divergence 2·asin(NA) and its coupling loss', () => {
		const w = walk([el('fibre', { coreDiameter: '50e-6', numericalAperture: '0.22', couplingTransmission: '0.8' }), free(1)]);
		const out = w.origins[1];
		expect(diameterAt(out.states[0], 0)).toBe(5e-5);
		expect(out.states[0].divergence).toBeCloseTo(2 * Math.asin(0.22), 15);
		expect(out.transmission[0]).toBe(0.8);
	});

	it('every point fed by a fibre output says how the fibre was modelled, also past later elements', () => {
		const r = run(scenario({ points: [eyePoint('before', '0.5'), eyePoint('after', '1.5'), eyePoint('past-mirror', '2.5')] }, [free(1), el('fibre', { coreDiameter: '8e-6', numericalAperture: '0.14' }), free(1), el('mirror'), free(1)]));
		const point = (id: string) => r.points.find((p) => p.id === id)!;
		expect(point('before').warnings).not.toContain(FIBRE_NOTE);
		expect(point('after').warnings).toContain(FIBRE_NOTE);
		expect(point('past-mirror').warnings).toContain(FIBRE_NOTE);
		expect(point('after').breakdown.find((s) => s.id === 'line1.diameter')!.note).toContain('single-mode');
	});

	it('offers both sides of a zero-length element to a point placed on it; the worse side is used', () => {
		const r = run(scenario({ points: [eyePoint('on', '1'), eyePoint('after', '1.5')] }, [free(1), el('transmission', { transmission: '0.01' }), free(1)]));
		const [on, after] = r.points;
		expect(on.lines[0].transmissionFactor).toBe(1);
		expect(on.beamAfterElement).toBeNull();
		expect(after.lines[0].transmissionFactor).toBe(0.01);
		expect(after.beamAfterElement).toBe(1);
	});
});
