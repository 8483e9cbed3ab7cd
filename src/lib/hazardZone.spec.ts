import { describe, expect, it } from 'vitest';
import type { AssessmentResult, HazardDistance } from '$lib/assessmentResult';
import { cwLine, eyePoint, free, run, scenario } from '$lib/server/hazard/fixtures';
import { beamRadiusAt, diffuseZone, hazardEnd, hazardSpans, hazardZone, zoneDrawing } from './hazardZone';

const distance = (over: Partial<HazardDistance>): HazardDistance => ({
	status: 'finite', tissue: 'eye', afterElement: null, elementKind: null, origin: 0, distance: 1, exposureDuration: 0.25, decidingLimit: null, decidingCheck: null, decidingLine: null, summedLines: [], missingChecks: [], reason: '', candidates: [], ...over
});

describe('hazard end of a beam', () => {
	it('is the origin plus the hazard distance, unbounded as Infinity, and unknown without a limit', () => {
		expect(hazardEnd(distance({ origin: 2, distance: 3 }))).toEqual({ end: 5, atLeast: false });
		expect(hazardEnd(distance({ status: 'partial', distance: 3 }))).toEqual({ end: 3, atLeast: true });
		expect(hazardEnd(distance({ status: 'unbounded', distance: null })).end).toBe(Infinity);
		expect(hazardEnd(distance({ status: 'no_applicable_limit', distance: null })).end).toBeNull();
		expect(hazardEnd(distance({ status: 'incomplete', distance: null })).end).toBeNull();
	});
});

describe('hazard zone of an evaluated path', () => {
	// 5 mW at 532 nm, 1 mm and 1 mrad (1/e): the NOHD falls inside a 40 m path.
	const result = run(scenario({ line: cwLine({ power: '0.005' }), points: [eyePoint('p1', 5), eyePoint('p2', 35)] }, [free(40)]));

	it('shades the beam from the aperture to the NOHD and leaves the rest of the path clear', () => {
		expect(result.nohd.status).toBe('finite');
		const spans = hazardSpans(result);
		expect(spans).toHaveLength(1);
		expect(spans[0]).toMatchObject({ from: 0, kind: 'hazard', enclosed: false });
		expect(spans[0].to).toBeCloseTo(result.nohd.distance!, 9);
		expect(spans[0].to).toBeGreaterThan(5);
		expect(spans[0].to).toBeLessThan(35);
	});

	it('samples the beam radius along the path by interpolation', () => {
		const beam = [{ position: 0, diameter: 2e-3 }, { position: 10, diameter: 12e-3 }];
		expect(beamRadiusAt(beam, 5)).toBeCloseTo(3.5e-3, 12);
		expect(beamRadiusAt(beam, -1)).toBe(1e-3);
		expect(beamRadiusAt(beam, 99)).toBe(6e-3);
	});

	it('draws a finite picture: no NaN, inside its own frame, with axes in metres', () => {
		const drawing = zoneDrawing(hazardZone(result));
		const numbers = JSON.stringify(drawing.shapes).match(/-?\d+(\.\d+)?(e-?\d+)?/g)!.map(Number);
		expect(numbers.every(Number.isFinite)).toBe(true);
		expect(JSON.stringify(drawing.shapes)).not.toContain('null');
		for (const s of drawing.shapes) if (s.t === 'polygon') for (const [x] of s.points) expect(x).toBeLessThanOrEqual(drawing.width);
		expect(drawing.shapes.some((s) => s.t === 'text' && s.text.includes('(m)'))).toBe(true);
		expect(drawing.description).toMatch(/Nominal hazard zone along the beam: 0 m–\d/);
	});

	it('says when the hazard distance reaches past the end of the path', () => {
		const long = run(scenario({ line: cwLine({ power: '0.1' }), points: [eyePoint('p1', 1)] }, [free(2)]));
		const zone = hazardZone(long);
		expect(zone.spans).toEqual([expect.objectContaining({ from: 0, to: 2, kind: 'hazard' })]);
		expect(zone.beyondEnd).toBeGreaterThan(2);
		expect(zone.notes.join(' ')).toContain('beyond its end');
	});
});

describe('a missing limit is never drawn as safe', () => {
	const noLimit = run(scenario({ limits: [] }));

	it('marks the whole path unknown, with words, and no stretch clear', () => {
		const zone = hazardZone(noLimit);
		expect(zone.spans.length).toBeGreaterThan(0);
		expect(zone.spans.every((s) => s.kind === 'unknown')).toBe(true);
		expect(zone.spans[0].from).toBe(0);
		expect(zone.spans.at(-1)!.to).toBe(noLimit.pathLength);
		expect(zone.notes.join(' ')).toContain('not a sign of safety');
		const drawing = zoneDrawing(zone);
		expect(drawing.shapes.some((s) => s.t === 'polygon' && s.hatch)).toBe(true);
		expect(drawing.description).toContain('not known');
	});

	it('treats a stretch over the limit as hazardous even when no distance was found', () => {
		const r = structuredClone(noLimit) as AssessmentResult;
		r.hazardDistances[0] = distance({ distance: 0 });
		r.stretches[0].verdict = 'exceeds_limit';
		expect(hazardSpans(r)[0]).toMatchObject({ kind: 'hazard', from: r.stretches[0].from, to: r.stretches[0].to });
	});

	it('leaves the part beyond a lower-bound distance unknown', () => {
		const r = structuredClone(noLimit) as AssessmentResult;
		r.hazardDistances[0] = distance({ status: 'partial', distance: 4 });
		r.stretches = [{ ...r.stretches[0], from: 0, to: 10 }];
		expect(hazardSpans(r).map((s) => [s.from, s.to, s.kind])).toEqual([[0, 4, 'hazard'], [4, 10, 'unknown']]);
	});

	it('gives a diffuse point its radius, or says it is unknown', () => {
		const p = { id: 'd', label: 'Card', position: 3 };
		const base = { decidingLimit: null, decidingCheck: null, decidingLine: null, missingChecks: [], reason: '' };
		expect(diffuseZone(p, { ...base, status: 'finite', distance: 0.4 })).toMatchObject({ kind: 'hazard', radius: 0.4 });
		expect(diffuseZone(p, { ...base, status: 'no_applicable_limit', distance: null })).toMatchObject({ kind: 'unknown', radius: null });
		expect(diffuseZone(p, { ...base, status: 'unbounded', distance: null }).kind).toBe('unknown');
		expect(diffuseZone(p, null).kind).toBe('unknown');
		expect(diffuseZone(p, { ...base, status: 'finite', distance: 0 }).kind).toBe('none');
	});
});
