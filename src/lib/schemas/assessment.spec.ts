import { describe, expect, it } from 'vitest';
import { assessmentPreviewSchema, toAssessmentInput, type AssessmentPreviewRequest } from './assessment';
import { assess } from '../server/hazard/index';

function body(): AssessmentPreviewRequest {
	return {
		line: { mode: 'continuous', wavelength: '532e-9', power: 0.1, beamDiameter: '1e-3', beamDiameterDefinition: '1/e2', divergence: 1e-3, divergenceDefinition: 'fwhm' },
		elements: [{ kind: 'propagate', length: '2' }, { kind: 'transmission', transmission: '0.5', label: 'ND 0.3' }, { kind: 'propagate', length: 3 }],
		points: [{ id: 'bench-edge', position: '4', tissue: 'eye', kind: 'intrabeam', exposureDuration: '0.25' }],
		limits: [
			{
				id: 'eye-vis',
				version: 2,
				label: 'Eye, visible (demo)',
				tissue: 'eye',
				wavelengthMin: '400e-9',
				wavelengthMax: '700e-9',
				durationMin: '18e-6',
				durationMax: '10',
				quantity: 'radiant_exposure',
				k: '18',
				n: '0.75',
				limitingAperture: '7e-3',
				pulseBasis: 'continuous',
				citation: 'Demonstration value'
			}
		],
		nohd: { exposureDuration: '0.25' }
	};
}

describe('assessment preview body', () => {
	it('bounds the work of one request: at most 100 points, 50 limits and 2000 point × limit pairs', () => {
		const b = body();
		const point = b.points[0];
		const limit = b.limits![0];
		const withCounts = (points: number, limits: number) => ({ ...b, points: Array.from({ length: points }, (_, i) => ({ ...point, id: `p${i}` })), limits: Array.from({ length: limits }, (_, i) => ({ ...limit, id: `l${i}` })) });
		expect(assessmentPreviewSchema.safeParse(withCounts(100, 20)).success).toBe(true);
		const tooMany = assessmentPreviewSchema.safeParse(withCounts(100, 21));
		expect(tooMany.success).toBe(false);
		expect(tooMany.error!.issues.map((x) => x.path.join('.'))).toContain('limits');
		expect(assessmentPreviewSchema.safeParse(withCounts(101, 1)).success).toBe(false);
		expect(assessmentPreviewSchema.safeParse(withCounts(1, 51)).success).toBe(false);
	});

	it('accepts numbers and numeric strings and keeps them as exact decimal strings', () => {
		const parsed = assessmentPreviewSchema.parse(body());
		expect(parsed.line.wavelength).toBe('532e-9');
		if (parsed.line.mode !== 'continuous') throw new Error('mode');
		expect(parsed.line.power).toBe('0.1');
		expect(parsed.limits?.[0].version).toBe('2');
		const out = assess(toAssessmentInput(parsed));
		expect(out.ok).toBe(true);
		if (out.ok) expect(out.result.points[0].id).toBe('bench-edge');
	});

	it('defaults elements to an empty list', () => {
		const b = body();
		delete b.elements;
		b.points[0].position = '0';
		expect(assessmentPreviewSchema.parse(b).elements).toEqual([]);
	});

	it('refuses unknown keys at every level', () => {
		const extra = [
			(b: any) => (b.extra = 1),
			(b: any) => (b.line.colour = 'green'),
			(b: any) => (b.elements[0].angle = 1),
			(b: any) => (b.points[0].note = 'x'),
			(b: any) => (b.limits[0].source = 'x'),
			(b: any) => (b.nohd.margin = 2)
		];
		for (const mutate of extra) {
			const b = body();
			mutate(b);
			const r = assessmentPreviewSchema.safeParse(b);
			expect(r.success).toBe(false);
			if (!r.success) expect(r.error.issues[0].code).toBe('unrecognized_keys');
		}
	});

	it('refuses fields of another emission mode', () => {
		const b: any = body();
		b.line.pulseEnergy = '1e-3';
		expect(assessmentPreviewSchema.safeParse(b).success).toBe(false);
	});

	it('refuses non-numeric, comma-decimal and non-finite numbers, and unknown enum values, naming the path', () => {
		const cases: [(b: any) => void, (string | number)[]][] = [
			[(b) => (b.line.power = 'lots'), ['line', 'power']],
			[(b) => (b.line.power = '1,5'), ['line', 'power']],
			[(b) => (b.line.power = 'NaN'), ['line', 'power']],
			[(b) => (b.line.power = 'Infinity'), ['line', 'power']],
			[(b) => (b.line.power = null), ['line', 'power']],
			[(b) => (b.elements[1].transmission = true), ['elements', 1, 'transmission']],
			[(b) => (b.points[0].tissue = 'lung'), ['points', 0, 'tissue']],
			[(b) => (b.elements[0].kind = 'prism'), ['elements', 0, 'kind']],
			[(b) => (b.limits[0].quantity = 'radiance'), ['limits', 0, 'quantity']],
			[(b) => (b.line.mode = 'cw'), ['line', 'mode']]
		];
		for (const [mutate, path] of cases) {
			const b = body();
			mutate(b);
			const r = assessmentPreviewSchema.safeParse(b);
			expect(r.success, JSON.stringify(path)).toBe(false);
			if (!r.success) expect(r.error.issues[0].path).toEqual(path);
		}
	});

	it('leaves range checks to the engine, which names the field', () => {
		const b: any = body();
		b.line.wavelength = '100e-9';
		const parsed = assessmentPreviewSchema.parse(b);
		const out = assess(toAssessmentInput(parsed));
		expect(out.ok).toBe(false);
		if (!out.ok) expect(out.errors[0].field).toBe('line.wavelength');
	});

	it('maps every element kind, point kind and pulsed mode', () => {
		const b: any = body();
		b.line = { mode: 'repetitive', wavelength: '1064e-9', pulseEnergy: '1e-3', pulseDuration: '1e-8', repetitionRate: '10', beamDiameter: '3e-3', beamDiameterDefinition: '1/e', divergence: '1e-3', divergenceDefinition: '1/e', beamQuality: '1.5' };
		b.elements = [
			{ kind: 'mirror' },
			{ kind: 'expander', magnification: '2' },
			{ kind: 'fibre', coreDiameter: '1e-4', numericalAperture: '0.22', couplingTransmission: '0.9' },
			{ kind: 'enclosure', length: '1' },
			{ kind: 'lens', focalLength: '0.1' },
			{ kind: 'propagate', length: '1' }
		];
		b.points = [
			{ id: 'a', position: '0.5', tissue: 'eye', kind: 'intrabeam', exposureDuration: '10' },
			{ id: 'b', position: '2', tissue: 'skin', kind: 'diffuse', reflectance: '0.5', viewingAngle: '0.2', viewingDistance: '1', exposureDuration: null }
		];
		b.options = { breakdown: false };
		const out = assess(toAssessmentInput(assessmentPreviewSchema.parse(b)));
		expect(out.ok).toBe(true);
		if (out.ok) {
			expect(out.result.points[0].accessible).toBe(false);
			expect(out.result.breakdown).toEqual([]);
		}
	});
});
