// A limit in its published form, entered through the limit form once for 700–1050 nm, stored exactly,
// shown back as entered, and applied by a saved assessment: an 800 nm point gets C_A, a diffuse point
// its apparent source α and C_E — each factor in the working with its value.
import { beforeAll, describe, expect, it } from 'vitest';
import { limitFormValues, limitToSI } from '$lib/schemas/limits';
import * as paths from '$lib/server/paths';
import { isCurrentResult } from '$lib/assessmentResult';
import type { Scope } from '$lib/server/auth/scope';
import { lasers, laserForm, limitForm, limits, makeLab, makeUser, must, pathForm, scopeFor } from './factories';

let lab: { id: string };
let researcher: Scope;
let officer: Scope;
const label = `Factor test, 700–1050 nm, 10·C_A W/m² ${Date.now()}`;

// The retinal thermal limit beyond 10 s as 10·C_A·C_E W/m², C_A = 10^(0.002·(λ − 700 nm)) over
// 700–1050 nm and C_E = α/α_min for 1.5 mrad ≤ α ≤ 100 mrad (ICNIRP 2013, IEC 60825-1:2014 Annex A;
// recalled from memory, not checked against the texts). A test fixture, never the local code.
const published = limitForm({
	label,
	wavelengthMin: '700 nm',
	wavelengthMax: '1050 nm',
	durationMin: '10 s',
	durationMax: '30000 s',
	quantity: 'irradiance',
	k: '10 W/m²',
	n: '0',
	wavelengthFactorKind: 'exponential',
	wavelengthFactorSlope: '0.002',
	wavelengthFactorOrigin: '700 nm',
	wavelengthFactorFrom: '700 nm',
	wavelengthFactorTo: '1050 nm',
	extendedAlphaMin: '1.5 mrad',
	extendedAlphaMax: '100 mrad',
	extendedExponent: '1'
});

beforeAll(async () => {
	lab = await makeLab();
	researcher = await scopeFor(await makeUser('researcher', [lab.id]));
	officer = await scopeFor(await makeUser('officer'));
});

describe('a limit in its published form', () => {
	it('is stored exactly in SI and shown back as entered', async () => {
		const created = must(await limits.create(officer.userId, published));
		const found = must(await limits.find(created.id)).limit;
		expect(found.current).toMatchObject({
			wavelengthFactorKind: 'exponential',
			wavelengthFactorSlope: '2000000', // 0.002 per nm = 2·10⁶ per m
			wavelengthFactorOrigin: '0.0000007',
			wavelengthFactorFrom: '0.0000007',
			wavelengthFactorTo: '0.00000105',
			extendedAlphaMin: '0.0015',
			extendedAlphaMax: '0.1',
			extendedExponent: '1',
			limitingApertureExponent: '0',
			pulseGroupingTime: null
		});
		const again = limitFormValues(found.current, found.currentVersion);
		expect(limitToSI(again)).toEqual(limitToSI(published));
	});

	it('refuses half an extended-source rule and a factor without its numbers, naming the fields', async () => {
		const half = await limits.create(officer.userId, { ...published, label: `${label} half`, extendedAlphaMax: '', extendedExponent: '' });
		expect(half).toMatchObject({ ok: false, status: 400, fields: { extendedAlphaMin: [expect.stringMatching(/α_min, α_max and its exponent/)] } });
	});

	it('gives an 800 nm point C_A = 10^0.2 and a diffuse point its α and C_E, each in the working', async () => {
		const created = must(await lasers.create(researcher, laserForm(lab.id, { wavelength: '800 nm', power: '50 mW', beamDiameter: '2 mm', divergence: '1 mrad' })));
		const lineId = must(await lasers.find(researcher, created.id)).detail.lines[0].id;
		const form = pathForm(lineId, {
			nohdExposureDuration: '100 s',
			elements: [pathForm(lineId).elements[0]],
			points: [
				{ key: 'direct', label: 'Direct view', kind: 'intrabeam', tissue: 'eye', position: '0.5 m', exposureDuration: '100 s', reflectance: '', viewingAngle: '', viewingDistance: '' },
				{ key: 'diffuse', label: 'Card at the end', kind: 'diffuse', tissue: 'eye', position: '0.5 m', exposureDuration: '100 s', reflectance: '0.9', viewingAngle: '0°', viewingDistance: '0.2 m' }
			]
		});
		const saved = must(await paths.save(researcher, created.id, null, form));
		const result = must(await paths.find(officer, saved.id)).detail.latest!.result;
		if (!isCurrentResult(result)) throw new Error('no current result');
		const comparisonWith = (pointId: string) => {
			const point = result.points.find((p) => p.label === pointId)!;
			for (const line of point.lines) for (const check of line.checks) for (const c of check.comparisons) if (c.limit.label === label) return { point, line, c };
			throw new Error(`no comparison with the factor limit at ${pointId}`);
		};

		const direct = comparisonWith('Direct view');
		expect(direct.c.wavelengthFactor).toBeCloseTo(10 ** 0.2, 12); // 1.5849: C_A at 800 nm
		expect(direct.c.extendedSourceFactor).toBe(1); // direct viewing: a point source
		const step = result.points.find((p) => p.label === 'Direct view')!.breakdown.find((s) => s.formula.startsWith('EL = k·C(λ)'))!;
		expect(step.inputs.find((i) => i.symbol === 'C(λ)')!.value).toBeCloseTo(1.58489319246, 10);
		expect(step.value).toBeCloseTo(15.8489319246, 9); // W/m²

		// Diffuse: the spot of diameter D on the card, seen from r = 0.2 m: α = 2·atan(D/2r), C_E = α/α_min.
		const diffuse = comparisonWith('Card at the end');
		const alpha = diffuse.line.apparentSource!;
		expect(alpha).toBeCloseTo(2 * Math.atan(diffuse.line.beamDiameter / (2 * 0.2)), 12);
		expect(alpha).toBeGreaterThan(0.0015);
		expect(alpha).toBeLessThan(0.1);
		expect(diffuse.c.extendedSourceFactor).toBeCloseTo(alpha / 0.0015, 10);
		const diffuseStep = result.points.find((p) => p.label === 'Card at the end')!.breakdown.find((s) => s.formula.startsWith('EL = k·C(λ)·C_E(α)'))!;
		expect(diffuseStep.inputs.map((i) => i.symbol)).toEqual(expect.arrayContaining(['C(λ)', 'C_E', 'α']));
		expect(diffuseStep.value).toBeCloseTo(10 * 10 ** 0.2 * (alpha / 0.0015), 8);
	});
});
