import { describe, expect, it } from 'vitest';
import { beamPathFromRows, beamPathSchema, previewSchema, type PreviewRequest } from './assessment';
import { evaluate } from '../server/hazard/index';

function body(): PreviewRequest {
	return {
		path: {
			lines: [{ mode: 'continuous', wavelength: '532e-9', power: 0.1, beamDiameter: '1e-3', beamDiameterDefinition: '1/e2', divergence: 1e-3, divergenceDefinition: 'fwhm' }],
			elements: [{ kind: 'propagate', length: '2' }, { kind: 'transmission', transmission: '0.5', label: 'ND 0.3' }, { kind: 'propagate', length: 3 }],
			points: [{ id: 'bench-edge', position: '4', tissue: 'eye', kind: 'intrabeam', exposureDuration: '0.25' }],
			nohdExposureDuration: '0.25'
		},
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
		]
	};
}

describe('assessment preview body', () => {
	it('bounds the work of one request: at most 100 points, 50 limits and 2000 point × limit pairs', () => {
		const b = body();
		const point = b.path.points![0];
		const limit = b.limits![0];
		const withCounts = (points: number, limits: number) => ({ ...b, path: { ...b.path, points: Array.from({ length: points }, (_, i) => ({ ...point, id: `p${i}` })) }, limits: Array.from({ length: limits }, (_, i) => ({ ...limit, id: `l${i}` })) });
		expect(previewSchema.safeParse(withCounts(100, 20)).success).toBe(true);
		const tooMany = previewSchema.safeParse(withCounts(100, 21));
		expect(tooMany.success).toBe(false);
		expect(tooMany.error!.issues.map((x) => x.path.join('.'))).toContain('limits');
		expect(previewSchema.safeParse(withCounts(101, 1)).success).toBe(false);
		expect(previewSchema.safeParse(withCounts(1, 51)).success).toBe(false);
	});

	it('accepts numbers and numeric strings and keeps them as exact decimal strings; absent values are null', () => {
		const parsed = previewSchema.parse(body());
		const line = parsed.path.lines[0];
		expect(line.wavelength).toBe('532e-9');
		expect(line.power).toBe('0.1');
		expect(line.pulseEnergy).toBeNull();
		expect(line.beamProfile).toBe('gaussian');
		expect(line.emissionGroup).toBe('');
		expect(parsed.path.elements[0]).toEqual({ kind: 'propagate', label: '', length: '2', transmission: null, reflectance: null, magnification: null, focalLength: null, coreDiameter: null, numericalAperture: null, couplingTransmission: null, bands: null });
		expect(parsed.limits?.[0].version).toBe('2');
		expect(parsed.limits?.[0].noTrainCorrection).toBe(false);
		expect(parsed.breakdown).toBe(true);
		const out = evaluate(parsed.path, parsed.limits);
		expect(out.ok).toBe(true);
		if (out.ok) expect(out.result.points[0].id).toBe('bench-edge');
	});

	it('defaults elements and points to empty lists', () => {
		const b = body();
		delete b.path.elements;
		delete b.path.points;
		const parsed = previewSchema.parse(b);
		expect(parsed.path.elements).toEqual([]);
		expect(parsed.path.points).toEqual([]);
	});

	it('refuses unknown keys at every level', () => {
		const extra = [
			(b: any) => (b.extra = 1),
			(b: any) => (b.path.extra = 1),
			(b: any) => (b.path.lines[0].colour = 'green'),
			(b: any) => (b.path.elements[0].angle = 1),
			(b: any) => (b.path.points[0].note = 'x'),
			(b: any) => (b.limits[0].source = 'x')
		];
		for (const mutate of extra) {
			const b = body();
			mutate(b);
			const r = previewSchema.safeParse(b);
			expect(r.success).toBe(false);
			if (!r.success) expect(r.error.issues[0].code).toBe('unrecognized_keys');
		}
	});

	it('refuses non-numeric, comma-decimal and non-finite numbers, and unknown enum values, naming the path', () => {
		const cases: [(b: any) => void, (string | number)[]][] = [
			[(b) => (b.path.lines[0].power = 'lots'), ['path', 'lines', 0, 'power']],
			[(b) => (b.path.lines[0].power = '1,5'), ['path', 'lines', 0, 'power']],
			[(b) => (b.path.lines[0].power = 'NaN'), ['path', 'lines', 0, 'power']],
			[(b) => (b.path.lines[0].power = 'Infinity'), ['path', 'lines', 0, 'power']],
			[(b) => (b.path.lines[0].power = Infinity), ['path', 'lines', 0, 'power']],
			[(b) => (b.path.elements[1].transmission = true), ['path', 'elements', 1, 'transmission']],
			[(b) => (b.path.points[0].tissue = 'lung'), ['path', 'points', 0, 'tissue']],
			[(b) => (b.path.elements[0].kind = 'prism'), ['path', 'elements', 0, 'kind']],
			[(b) => (b.limits[0].quantity = 'radiance'), ['limits', 0, 'quantity']],
			[(b) => (b.path.lines[0].mode = 'cw'), ['path', 'lines', 0, 'mode']],
			[(b) => (b.path.lines[0].beamProfile = 'top-hat'), ['path', 'lines', 0, 'beamProfile']]
		];
		for (const [mutate, path] of cases) {
			const b = body();
			mutate(b);
			const r = previewSchema.safeParse(b);
			expect(r.success, JSON.stringify(path)).toBe(false);
			if (!r.success) expect(r.error.issues[0].path).toEqual(path);
		}
	});

	it('carries at least one line and at most 12', () => {
		const none: any = body();
		none.path.lines = [];
		expect(previewSchema.safeParse(none).success).toBe(false);
		const two: any = body();
		two.path.lines.push({ ...two.path.lines[0], wavelength: '1064e-9' });
		expect(previewSchema.safeParse(two).success).toBe(true);
		const many: any = body();
		many.path.lines = Array.from({ length: 13 }, () => many.path.lines[0]);
		expect(previewSchema.safeParse(many).success).toBe(false);
	});

	it('leaves range checks to the engine, which names the field', () => {
		const b: any = body();
		b.path.lines[0].wavelength = '100e-9';
		const parsed = previewSchema.parse(b);
		const out = evaluate(parsed.path, parsed.limits);
		expect(out.ok).toBe(false);
		if (!out.ok) expect(out.errors[0].field).toBe('lines.0.wavelength');
	});

	it('turns stored rows into the same shape, field for field (the one mapper)', () => {
		const path = beamPathFromRows({
			path: { nohdExposureDuration: '10' },
			lines: [{ id: 'L1', label: 'main', emissionGroup: '', mode: 'continuous', wavelength: '1.064e-6', wavelengthMax: null, power: '2', pulseEnergy: null, pulseDuration: null, repetitionRate: null, beamProfile: 'flat_top', beamDiameter: '0.004', beamDiameterDefinition: '1/e2', divergence: '0.001', divergenceDefinition: '1/e2', beamQuality: null, hotSpotFactor: '1.5' }],
			elements: [{ kind: 'lens', label: 'f 100', length: null, transmission: null, reflectance: null, magnification: null, focalLength: '0.1', coreDiameter: null, numericalAperture: null, couplingTransmission: null, bands: null }],
			points: [{ id: 'p', label: 'at the lens', kind: 'intrabeam', tissue: 'eye', position: '0', exposureDuration: '10', reflectance: null, viewingAngle: null, viewingDistance: null }]
		});
		expect(beamPathSchema.parse(path)).toEqual(path);
		const out = evaluate(path, body().limits);
		expect(out.ok).toBe(true);
	});
});
