import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Dec, PI } from './constants';
import { diameterAt } from './beam';
import { beamsAt, enclosureAt, FIBRE_MODEL_NOTE, focalSpotDiameter, walkPath } from './elements';
import { assess } from './assess';
import { cwLine, eyePoint, scenario } from './fixtures';
import { validate, type NormInput } from './validate';
import type { ElementInput } from './types';

function normalise(elements: ElementInput[], line = cwLine()): NormInput {
	const v = validate({ line, elements, points: [], limits: [] });
	if (!v.ok) throw new Error(JSON.stringify(v.errors.items));
	return v.input;
}

const fraction = fc.double({ min: 0, max: 1, noNaN: true }).map(String);
const positive = fc.double({ min: 1e-3, max: 10, noNaN: true }).map(String);
const element: fc.Arbitrary<ElementInput> = fc.oneof(
	fc.record({ kind: fc.constant('propagate' as const), length: fc.double({ min: 0, max: 5, noNaN: true }).map(String) }),
	fc.record({ kind: fc.constant('enclosure' as const), length: fc.double({ min: 0, max: 5, noNaN: true }).map(String) }),
	fc.record({ kind: fc.constant('transmission' as const), transmission: fraction }),
	fc.record({ kind: fc.constant('mirror' as const), reflectance: fraction }),
	fc.record({ kind: fc.constant('expander' as const), magnification: positive }),
	fc.record({ kind: fc.constant('lens' as const), focalLength: positive }),
	fc.record({ kind: fc.constant('fibre' as const), coreDiameter: fc.double({ min: 1e-6, max: 1e-3, noNaN: true }).map(String), numericalAperture: fc.double({ min: 0.01, max: 1, noNaN: true }).map(String), couplingTransmission: fraction })
);

describe('path elements', () => {
	it('never raise the power and never make it negative (any sequence)', () => {
		fc.assert(
			fc.property(fc.array(element, { maxLength: 12 }), (elements) => {
				const input = normalise(elements);
				const path = walkPath(input.line, input.elements);
				let previous = new Dec(1);
				for (const s of path.snapshots) {
					if (s.transmission.isNegative() || s.transmission.gt(previous)) return false;
					previous = s.transmission;
				}
				return true;
			}),
			{ numRuns: 200 }
		);
	});

	it('keep the power at every point between 0 and the emitted power (through assess)', () => {
		fc.assert(
			fc.property(fc.array(element, { maxLength: 8 }), fc.double({ min: 0, max: 1, noNaN: true }), (elements, where) => {
				const all: ElementInput[] = [...elements, { kind: 'propagate', length: '1' }];
				const length = all.reduce((a, e) => a + (e.kind === 'propagate' || e.kind === 'enclosure' ? Number(e.length) : 0), 0);
				const position = (Math.floor(where * (length - 1e-6) * 1e6) / 1e6).toFixed(6);
				const out = assess(scenario({ points: [eyePoint('p', position)] }, all));
				if (!out.ok) return false;
				const p = Number(out.result.points[0].power);
				return p >= 0 && p <= 0.1;
			}),
			{ numRuns: 200 }
		);
	});

	it('distance along the path is the running sum of propagation and enclosure lengths', () => {
		const path = walkPath(normalise([]).line, normalise([{ kind: 'propagate', length: '1.5' }, { kind: 'mirror' }, { kind: 'enclosure', length: '2' }, { kind: 'propagate', length: '0.25' }]).elements);
		expect(path.length.toString()).toBe('3.75');
		expect(enclosureAt(path, new Dec('2'))?.index).toBe(2);
		// The entry and exit planes of an enclosure are accessible (conservative).
		expect(enclosureAt(path, new Dec('1.5'))).toBeNull();
		expect(enclosureAt(path, new Dec('3.5'))).toBeNull();
	});

	it('an expander multiplies the diameter by M and divides the divergence by M at its position', () => {
		const input = normalise([{ kind: 'propagate', length: '2' }, { kind: 'expander', magnification: '3' }, { kind: 'propagate', length: '5' }]);
		const path = walkPath(input.line, input.elements);
		const z = new Dec(2);
		const [before, after] = beamsAt(path, z);
		expect(diameterAt(after.state, z).div(diameterAt(before.state, z)).minus(3).abs().lt('1e-30')).toBe(true);
		expect(after.state.divergence.times(3).minus(before.state.divergence).abs().lt('1e-40')).toBe(true);
		// Far beyond, the beam spreads at φ/M.
		const far = new Dec(1e6);
		expect(diameterAt(after.state, far).div(far).div(before.state.divergence.div(3)).minus(1).abs().lt('1e-4')).toBe(true);
	});

	it('a lens focuses at f with the Gaussian diffraction floor and then diverges at D_lens/f', () => {
		const input = normalise([{ kind: 'propagate', length: '1' }, { kind: 'lens', focalLength: '0.1' }, { kind: 'propagate', length: '1' }], cwLine({ beamQuality: '1.3' }));
		const path = walkPath(input.line, input.elements);
		const lens = path.lenses[0];
		const dLens = new Dec('1e-3').times(Dec.sqrt(2)); // √(D₀² + (1 m·1 mrad)²)
		expect(lens.lensDiameter.minus(dLens).abs().lt('1e-30')).toBe(true);
		expect(lens.focusPosition.toString()).toBe('1.1');
		expect(lens.divergenceAfter.minus(dLens.div('0.1')).abs().lt('1e-30')).toBe(true);
		// Gaussian waist (1/e²) 4·M²·λ·f/(π·D_lens,1/e²), both diameters ×√2 from 1/e (textbook Gaussian optics):
		const waist1e2 = new Dec(4).times('1.3').times('532e-9').times('0.1').div(PI.times(dLens.times(Dec.sqrt(2))));
		expect(lens.focalSpot.minus(waist1e2.div(Dec.sqrt(2))).abs().div(lens.focalSpot).lt('1e-30')).toBe(true);
		expect(focalSpotDiameter(new Dec('532e-9'), new Dec('0.1'), lens.lensDiameter, new Dec('1.3')).eq(lens.focalSpot)).toBe(true);
		// At the focus the beam is the focal spot.
		const atFocus = beamsAt(path, new Dec('1.1'));
		expect(diameterAt(atFocus[0].state, new Dec('1.1')).div(lens.focalSpot).minus(1).abs().lt('1e-30')).toBe(true);
	});

	it('a fibre output starts at the core diameter with full divergence 2·asin(NA) and its coupling loss', () => {
		const input = normalise([{ kind: 'fibre', coreDiameter: '50e-6', numericalAperture: '0.22', couplingTransmission: '0.8' }, { kind: 'propagate', length: '1' }]);
		const path = walkPath(input.line, input.elements);
		const out = path.snapshots[1];
		expect(diameterAt(out.state, new Dec(0)).toString()).toBe('0.00005');
		expect(out.state.divergence.minus(new Dec('0.22').asin().times(2)).abs().lt('1e-15')).toBe(true);
		expect(out.transmission.toString()).toBe('0.8');
	});

	it('every point fed by a fibre output says how the fibre was modelled, also past later elements', () => {
		const elements: ElementInput[] = [{ kind: 'propagate', length: '1' }, { kind: 'fibre', coreDiameter: '8e-6', numericalAperture: '0.14' }, { kind: 'propagate', length: '1' }, { kind: 'mirror' }, { kind: 'propagate', length: '1' }];
		const out = assess(scenario({ points: [eyePoint('before', '0.5'), eyePoint('after', '1.5'), eyePoint('past-mirror', '2.5')] }, elements));
		if (!out.ok) throw new Error(JSON.stringify(out.errors));
		const note = (id: string) => out.result.points.find((p) => p.id === id)!.breakdown.find((b) => b.id === 'diameter')!.note ?? '';
		expect(note('before')).not.toContain('single-mode');
		expect(note('after')).toContain(FIBRE_MODEL_NOTE);
		expect(note('past-mirror')).toContain(FIBRE_MODEL_NOTE);
	});

	it('offers both sides of a zero-length element to a point placed on it, and the worse side is used', () => {
		const elements: ElementInput[] = [{ kind: 'propagate', length: '1' }, { kind: 'transmission', transmission: '0.01' }, { kind: 'propagate', length: '1' }];
		const out = assess(scenario({ points: [eyePoint('on', '1'), eyePoint('after', '1.5')] }, elements));
		expect(out.ok).toBe(true);
		if (!out.ok) return;
		const [on, after] = out.result.points;
		expect(on.transmissionFactor).toBe('1');
		expect(on.beamAfterElement).toBeNull();
		expect(after.transmissionFactor).toBe('0.01');
		expect(after.beamAfterElement).toBe(1);
	});
});
