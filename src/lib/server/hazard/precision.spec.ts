import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { assess, assessAtPrecision } from './assess';
import { ASSESSMENT_PRECISION, AssessmentDec, Dec, OUTPUT_SIGNIFICANT_DIGITS, WORKING_PRECISION } from './constants';
import { DEMO_LIMITS } from './fixtures';
import type { AssessmentInput, ElementInput, LimitInput, LineInput, PointInput } from './types';

/** A decimal string with `digits` significant digits, log-uniform in [lo, hi]. */
const logUniform = (lo: number, hi: number, digits = 4) => fc.double({ min: Math.log(lo), max: Math.log(hi), noNaN: true }).map((l) => Math.exp(l).toPrecision(digits));
const fraction = fc.double({ min: 0, max: 1, noNaN: true }).map((x) => x.toFixed(3));

const limitArb: fc.Arbitrary<LimitInput> = fc
	.record({
		tissue: fc.constantFrom('eye' as const, 'skin' as const),
		quantity: fc.constantFrom('irradiance' as const, 'radiant_exposure' as const),
		k: logUniform(1e-3, 1e4, 3),
		n: fc.constantFrom('0', '0.25', '0.75', '-0.25', '0.3'),
		limitingAperture: fc.constantFrom('0', '1e-3', '3.5e-3', '7e-3'),
		pulseBasis: fc.constantFrom('single_pulse' as const, 'continuous' as const),
		train: fc.constantFrom(null, '-0.25', '-0.1'),
		durationMin: fc.constantFrom('1e-13', '1e-6', '10'),
		id: fc.integer({ min: 0, max: 1e6 })
	})
	.map((r) => ({
		id: `lim-${r.id}`,
		version: 1,
		label: `limit ${r.id}`,
		tissue: r.tissue,
		wavelengthMin: '1.8e-7',
		wavelengthMax: '1e-3',
		durationMin: r.durationMin,
		durationMax: '3e4',
		quantity: r.quantity,
		k: r.k,
		n: r.n,
		limitingAperture: r.limitingAperture,
		pulseBasis: r.pulseBasis,
		pulseTrainExponent: r.pulseBasis === 'single_pulse' ? r.train : null,
		citation: 'random test limit'
	}));

const elementArb: fc.Arbitrary<ElementInput> = fc.oneof(
	logUniform(0.05, 5).map((length) => ({ kind: 'propagate' as const, length })),
	logUniform(0.05, 2).map((length) => ({ kind: 'enclosure' as const, length })),
	fraction.map((transmission) => ({ kind: 'transmission' as const, transmission })),
	fraction.map((r) => ({ kind: 'mirror' as const, reflectance: (0.9 + Number(r) / 10).toFixed(4) })),
	fc.constantFrom('0.5', '2', '3.3').map((magnification) => ({ kind: 'expander' as const, magnification })),
	logUniform(0.02, 1, 3).map((focalLength) => ({ kind: 'lens' as const, focalLength })),
	fc.tuple(logUniform(5e-6, 1e-3, 3), fc.constantFrom('0.1', '0.22', '0.5'), fraction).map(([coreDiameter, numericalAperture, c]) => ({ kind: 'fibre' as const, coreDiameter, numericalAperture, couplingTransmission: c }))
);

const lineArb: fc.Arbitrary<LineInput> = fc
	.record({
		mode: fc.constantFrom('continuous' as const, 'single_pulse' as const, 'repetitive' as const),
		wavelength: fc.constantFrom('405e-9', '532e-9', '1064e-9', '1550e-9', '10.6e-6'),
		power: logUniform(1e-4, 100),
		pulseEnergy: logUniform(1e-7, 1),
		pulseDuration: logUniform(30e-15, 1e-6),
		repetitionRate: fc.constantFrom('10', '1000', '80e6'),
		beamDiameter: logUniform(0.3e-3, 10e-3),
		beamDiameterDefinition: fc.constantFrom('1/e' as const, '1/e2' as const, 'fwhm' as const),
		divergence: fc.oneof(fc.constant('0'), logUniform(0.1e-3, 5e-3)),
		divergenceDefinition: fc.constantFrom('1/e' as const, '1/e2' as const, 'fwhm' as const),
		beamQuality: fc.double({ min: 1, max: 2, noNaN: true }).map((x) => x.toFixed(2))
	})
	.map((r) => {
		const line: LineInput = { wavelength: r.wavelength, mode: r.mode, beamDiameter: r.beamDiameter, beamDiameterDefinition: r.beamDiameterDefinition, divergence: r.divergence, divergenceDefinition: r.divergenceDefinition, beamQuality: r.beamQuality };
		if (r.mode === 'continuous') line.power = r.power;
		else {
			line.pulseEnergy = r.pulseEnergy;
			line.pulseDuration = r.pulseDuration;
			if (r.mode === 'repetitive') line.repetitionRate = Number(r.pulseDuration) * Number(r.repetitionRate) < 0.5 ? r.repetitionRate : '10';
		}
		return line;
	});

const assessmentArb: fc.Arbitrary<AssessmentInput> = fc
	.record({
		line: lineArb,
		elements: fc.array(elementArb, { maxLength: 5 }),
		fractions: fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.constantFrom('eye' as const, 'skin' as const), fc.constantFrom('0.25', '10', '100', '30000', null), fc.boolean(), fraction, fc.double({ min: 0, max: 1.5, noNaN: true }), logUniform(0.1, 3)), { minLength: 1, maxLength: 4 }),
		limits: fc.array(limitArb, { maxLength: 3 }),
		nohdT: fc.constantFrom('0.25', '10', null)
	})
	.map(({ line, elements, fractions, limits, nohdT }) => {
		const all: ElementInput[] = [...elements, { kind: 'propagate', length: '2' }];
		// Positions are sums of the entered lengths (decimal arithmetic, so exact) times a fraction.
		const length = all.reduce((a, e) => a + (e.kind === 'propagate' || e.kind === 'enclosure' ? Number(e.length) : 0), 0);
		const points: PointInput[] = fractions.map(([f, tissue, T, diffuse, rho, angle, r], i) => ({
			id: `p${i}`,
			position: (Math.floor(f * length * 1000) / 1000).toFixed(3),
			tissue,
			exposureDuration: T,
			kind: diffuse ? 'diffuse' : 'intrabeam',
			...(diffuse ? { reflectance: rho, viewingAngle: angle.toFixed(3), viewingDistance: r } : {})
		}));
		return { line, elements: all, points, limits: [...DEMO_LIMITS, ...limits], nohd: { exposureDuration: nohdT } };
	});

describe('working precision', () => {
	it(`writes the same results at ${ASSESSMENT_PRECISION} digits as at ${WORKING_PRECISION} (every number, breakdown included)`, () => {
		expect(AssessmentDec.precision).toBe(ASSESSMENT_PRECISION);
		expect(Dec.precision).toBe(WORKING_PRECISION);
		let compared = 0;
		fc.assert(
			fc.property(assessmentArb, (input) => {
				const fast = assessAtPrecision(input, AssessmentDec);
				const reference = assessAtPrecision(input, Dec);
				expect(fast.ok).toBe(reference.ok);
				if (fast.ok) compared++;
				expect(JSON.stringify(fast)).toBe(JSON.stringify(reference));
			}),
			{ numRuns: 400 }
		);
		expect(compared).toBeGreaterThan(300);
	}, 120_000);

	it('a point on elements that leave the beam as it was takes the earlier beam, whatever the arithmetic noise', () => {
		// Expanders ×2 then ×0.5 at z = 0 give the aperture beam again (up to rounding in the last digit).
		const input: AssessmentInput = {
			line: { wavelength: '532e-9', mode: 'single_pulse', pulseEnergy: '1', pulseDuration: '1.959e-8', beamDiameter: '0.01', beamDiameterDefinition: '1/e2', divergence: '0.001332', divergenceDefinition: '1/e' },
			elements: [{ kind: 'expander', magnification: '2' }, { kind: 'expander', magnification: '0.5' }, { kind: 'propagate', length: '3' }],
			points: [{ id: 'p', position: '0', tissue: 'eye', kind: 'intrabeam' }],
			limits: DEMO_LIMITS
		};
		for (const D of [AssessmentDec, Dec]) {
			const out = assessAtPrecision(input, D);
			if (!out.ok) throw new Error('unexpected');
			expect(out.result.points[0].beamAfterElement).toBeNull();
		}
		expect(JSON.stringify(assessAtPrecision(input, AssessmentDec))).toBe(JSON.stringify(assessAtPrecision(input, Dec)));
	});

	it('equally restrictive limits (one written as H, one as E) tie: the first offered decides, at any precision', () => {
		// H = 18·t^0.75 J/m² and E = 18·t^-0.25 W/m² are the same limit; their ratios agree to the last digit or two.
		const asH: LimitInput = { ...DEMO_LIMITS[0], id: 'as-h', durationMin: '1e-6', durationMax: '3e4' };
		const asE: LimitInput = { ...asH, id: 'as-e', quantity: 'irradiance', n: '-0.25' };
		for (const limits of [[asH, asE], [asE, asH]]) {
			const input: AssessmentInput = { line: { wavelength: '532e-9', mode: 'continuous', power: '0.37', beamDiameter: '2.1e-3', beamDiameterDefinition: '1/e', divergence: '1.3e-3', divergenceDefinition: '1/e' }, elements: [{ kind: 'propagate', length: '5' }], points: [{ id: 'p', position: '1.7', tissue: 'eye', kind: 'intrabeam', exposureDuration: '0.25' }, { id: 'q', position: '1.7', tissue: 'eye', kind: 'diffuse', exposureDuration: '0.25', reflectance: '0.5', viewingDistance: '0.2' }], limits, nohd: { exposureDuration: '0.25' } };
			for (const D of [AssessmentDec, Dec]) {
				const out = assessAtPrecision(input, D);
				if (!out.ok) throw new Error('unexpected');
				const r = out.result;
				expect(r.points[0].checks[0].decidingLimit?.id).toBe(limits[0].id);
				expect(r.points[1].diffuseHazardDistance?.decidingLimit.id).toBe(limits[0].id);
				expect(r.nohd.decidingLimit?.id).toBe(limits[0].id);
			}
			expect(JSON.stringify(assessAtPrecision(input, AssessmentDec))).toBe(JSON.stringify(assessAtPrecision(input, Dec)));
		}
	});

	it('assess() is the 25-digit run', () => {
		fc.assert(
			fc.property(assessmentArb, (input) => {
				expect(assess(input)).toEqual(assessAtPrecision(input, AssessmentDec));
			}),
			{ numRuns: 30 }
		);
	});

	it(`keeps ${OUTPUT_SIGNIFICANT_DIGITS} significant digits in what it writes`, () => {
		const out = assess({ line: { wavelength: '532e-9', mode: 'continuous', power: '0.3', beamDiameter: '1.7e-3', beamDiameterDefinition: '1/e2', divergence: '0.9e-3', divergenceDefinition: 'fwhm' }, elements: [{ kind: 'propagate', length: '3' }], points: [{ id: 'p', position: '2.5', tissue: 'eye', kind: 'intrabeam', exposureDuration: '0.25' }], limits: DEMO_LIMITS, nohd: { exposureDuration: '0.25' } });
		if (!out.ok) throw new Error('unexpected');
		expect(out.result.points[0].beamDiameter.replace(/^0\.0*|\.|e.*$/g, '')).toHaveLength(OUTPUT_SIGNIFICANT_DIGITS);
	});
});
