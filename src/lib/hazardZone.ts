// The nominal hazard zone of a beam path seen from above: the path unfolded along x (mirrors and
// lenses keep their place along it), across the beam along y. Pure: read from a stored result and
// the beam's diameter sampled along the path; laid out as shapes for the page and the PDF.
//
// Conservative by construction: a stretch whose hazard distance is unbounded is hazardous to its
// end; one without a limit (or with an input missing) is drawn as unknown, never as clear; a
// stretch the engine found over the limit is hazardous throughout even if no distance was found.
import type { AssessmentResult, DiffuseDistance, HazardDistance } from '$lib/assessmentResult';
import { ink, niceTicks, tickLabel, type Drawing, type Shape } from '$lib/drawing';
import { elementShortWords } from '$lib/words';

export type SpanKind = 'hazard' | 'unknown';
/** A stretch of the path (from, to in m along it) where the beam is hazardous or not known to be safe. */
export type Span = { from: number; to: number; kind: SpanKind; enclosed: boolean; why: string };
export type DiffuseZone = { pointId: string; label: string; position: number; radius: number | null; kind: 'hazard' | 'unknown' | 'none'; why: string };
export type BeamSample = { position: number; diameter: number };

export type HazardZone = {
	length: number;
	spans: Span[];
	diffuse: DiffuseZone[];
	beam: BeamSample[];
	enclosures: { from: number; to: number }[];
	elements: { position: number; index: number; kind: string }[];
	points: { id: string; label: string; position: number; kind: string; accessible: boolean; verdict: string }[];
	/** Where the eye hazard distance ends beyond the path's end (the beam must be stopped there), m. */
	beyondEnd: number | null;
	/** Sentences for what the drawing cannot show as a number: unknown parts, unbounded ones. */
	notes: string[];
};

const m = (v: number) => `${Number(v.toPrecision(3))} m`;
/** A distance that bounds a zone, rounded up to 3 figures (as the screens write the NOHD). */
const mUp = (v: number) => {
	if (!(v > 0)) return m(v);
	const unit = 10 ** (Math.floor(Math.log10(v)) - 2);
	return `${Number((Math.ceil(v / unit - 1e-9) * unit).toPrecision(3))} m`;
};

/** Where a beam's hazard ends along the path: a position, Infinity (unbounded) or null (not known). */
export function hazardEnd(d: HazardDistance): { end: number | null; atLeast: boolean } {
	if (d.status === 'unbounded') return { end: Infinity, atLeast: false };
	if ((d.status === 'finite' || d.status === 'partial') && d.distance !== null) return { end: d.origin + d.distance, atLeast: d.status === 'partial' };
	return { end: null, atLeast: false };
}

/** The hazardous and unknown parts of each stretch of the path. */
export function hazardSpans(result: AssessmentResult): Span[] {
	const spans: Span[] = [];
	for (const s of result.stretches) {
		const enclosed = s.enclosedBy !== null;
		const d = result.hazardDistances[s.beam];
		const before = spans.length;
		if (!d) {
			spans.push({ from: s.from, to: s.to, kind: 'unknown', enclosed, why: 'no hazard distance was recorded for this beam' });
		} else {
			const { end, atLeast } = hazardEnd(d);
			if (end === null) {
				spans.push({ from: s.from, to: s.to, kind: 'unknown', enclosed, why: d.status === 'no_applicable_limit' ? 'no applicable limit' : 'an input is missing' });
			} else {
				const hazardTo = Math.min(s.to, end);
				if (hazardTo > s.from) spans.push({ from: s.from, to: hazardTo, kind: 'hazard', enclosed, why: end === Infinity ? 'the beam does not spread: unbounded' : atLeast ? 'at least this far' : 'within the hazard distance' });
				// A check without a limit: beyond the distance found, the hazard is not known.
				if (atLeast && s.to > Math.max(s.from, end)) spans.push({ from: Math.max(s.from, end), to: s.to, kind: 'unknown', enclosed, why: 'a check has no limit, so the distance is a lower bound' });
			}
		}
		// The stretch's own verdict overrides a distance that came out shorter.
		if (spans.length === before && s.verdict === 'exceeds_limit') spans.push({ from: s.from, to: s.to, kind: 'hazard', enclosed, why: 'the exposure on this stretch exceeds the limit' });
		if (spans.length === before && (s.verdict === 'incomplete' || s.verdict === 'no_applicable_limit'))
			spans.push({ from: s.from, to: s.to, kind: 'unknown', enclosed, why: s.verdict === 'incomplete' ? 'an input is missing' : 'no applicable limit' });
	}
	return merge(spans);
}

/** Neighbouring spans of the same kind and enclosure drawn as one. */
function merge(spans: Span[]): Span[] {
	const out: Span[] = [];
	for (const s of spans) {
		const last = out[out.length - 1];
		if (last && last.kind === s.kind && last.enclosed === s.enclosed && Math.abs(last.to - s.from) < 1e-9) last.to = s.to;
		else out.push({ ...s });
	}
	return out;
}

/** The diffuse hazard radius of a diffuse point, or why there is none to draw. */
export function diffuseZone(p: { id: string; label: string; position: number }, d: DiffuseDistance | null): DiffuseZone {
	const base = { pointId: p.id, label: p.label || p.id, position: p.position };
	if (!d) return { ...base, radius: null, kind: 'unknown', why: 'no diffuse hazard distance was recorded' };
	if (d.status === 'unbounded') return { ...base, radius: null, kind: 'unknown', why: 'unbounded' };
	if ((d.status === 'finite' || d.status === 'partial') && d.distance !== null)
		return d.distance > 0 ? { ...base, radius: d.distance, kind: 'hazard', why: d.status === 'partial' ? 'at least this far: a check has no limit' : 'within the diffuse hazard distance' } : { ...base, radius: 0, kind: 'none', why: 'below the limits at the reflecting spot' };
	return { ...base, radius: null, kind: 'unknown', why: d.status === 'no_applicable_limit' ? 'no applicable limit' : 'an input is missing' };
}

/** The beam's diameter along the path: sampled by the engine when given, else from the points and the aperture. */
function beamOf(result: AssessmentResult, samples: BeamSample[] | null): BeamSample[] {
	if (samples && samples.length > 1) return samples;
	const at0 = Math.max(0, ...result.lines.map((l) => l.beamDiameter));
	const fromPoints = result.points.filter((p) => p.kind === 'intrabeam').map((p) => ({ position: p.position, diameter: Math.max(0, ...p.lines.map((l) => l.beamDiameter)) }));
	return [{ position: 0, diameter: at0 }, ...fromPoints, { position: result.pathLength, diameter: fromPoints.at(-1)?.diameter ?? at0 }].sort((a, b) => a.position - b.position);
}

export function hazardZone(result: AssessmentResult, samples: BeamSample[] | null = null): HazardZone {
	const spans = hazardSpans(result);
	const diffuse = result.points.filter((p) => p.kind === 'diffuse').map((p) => diffuseZone(p, p.diffuseHazardDistance));
	const enclosures = mergeRanges(result.stretches.filter((s) => s.enclosedBy !== null).map((s) => ({ from: s.from, to: s.to })));
	const elements = result.hazardDistances.filter((d) => d.afterElement !== null).map((d) => ({ position: d.origin, index: d.afterElement!, kind: d.elementKind ?? '' }));
	const points = result.points.map((p) => ({ id: p.id, label: p.label || p.id, position: p.position, kind: p.kind, accessible: p.accessible, verdict: p.verdict }));
	const ends = result.hazardDistances.map(hazardEnd).map((e) => e.end).filter((e): e is number => e !== null && Number.isFinite(e));
	const farthest = ends.length ? Math.max(...ends) : null;
	const beyondEnd = farthest !== null && farthest > result.pathLength + 1e-9 ? farthest : null;

	const notes: string[] = [];
	for (const s of spans.filter((x) => x.kind === 'unknown'))
		notes.push(`From ${m(s.from)} to ${m(s.to)} the hazard zone is not known (${s.why}) — this is not a sign of safety; ask the laser safety officer.`);
	if (spans.some((s) => s.kind === 'hazard' && s.why.includes('unbounded'))) notes.push('A beam that does not spread stays hazardous to the end of its stretch and beyond: it must be stopped.');
	if (beyondEnd !== null) notes.push(`The eye hazard distance reaches ${mUp(beyondEnd)} along the path, beyond its end at ${m(result.pathLength)}: the beam must end on a stop or be enclosed there.`);
	for (const d of diffuse.filter((x) => x.kind === 'unknown')) notes.push(`Diffuse reflection at “${d.label}”: its hazard radius is not known (${d.why}) — this is not a sign of safety.`);
	for (const d of diffuse.filter((x) => x.kind === 'hazard' && x.why.startsWith('at least'))) notes.push(`Diffuse reflection at “${d.label}”: at least ${mUp(d.radius!)} (a check has no limit, so it may be larger).`);
	if (result.pathLength <= 0) notes.push('The path has no length to draw along.');
	return { length: result.pathLength, spans, diffuse, beam: beamOf(result, samples), enclosures, elements, points, beyondEnd, notes };
}

function mergeRanges(r: { from: number; to: number }[]): { from: number; to: number }[] {
	const out: { from: number; to: number }[] = [];
	for (const x of [...r].sort((a, b) => a.from - b.from)) {
		const last = out[out.length - 1];
		if (last && x.from <= last.to + 1e-9) last.to = Math.max(last.to, x.to);
		else out.push({ ...x });
	}
	return out;
}

/** Half the beam's diameter at z, interpolated between samples. */
export function beamRadiusAt(beam: BeamSample[], z: number): number {
	if (beam.length === 0) return 0;
	if (z <= beam[0].position) return beam[0].diameter / 2;
	for (let i = 1; i < beam.length; i++) {
		const a = beam[i - 1];
		const b = beam[i];
		if (z <= b.position) return (b.position === a.position ? b.diameter : a.diameter + ((b.diameter - a.diameter) * (z - a.position)) / (b.position - a.position)) / 2;
	}
	return beam[beam.length - 1].diameter / 2;
}

const W = 760;
const LEFT = 64;
const RIGHT = 24;
const TOP = 20;
const AXIS = 54;
/** Drawn half-widths (drawing units) below which the beam and its zone would not be seen. */
const MIN_BEAM = 1.2;
const MIN_ZONE = 7;

/** The zone as shapes: x and y in metres to scale (y stretched, and said so, when the path is long and the zone thin). */
export function zoneDrawing(zone: HazardZone): Drawing {
	const plotW = W - LEFT - RIGHT;
	const xMax = Math.max(zone.length, 1e-6);
	const sx = plotW / xMax;
	const radii = [...zone.diffuse.map((d) => d.radius ?? 0), ...zone.beam.map((b) => b.diameter / 2)];
	const yReal = Math.max(...radii, 0.06 * xMax) * 1.15;
	// Same scale both ways when it fits; otherwise y is stretched (circles become ellipses) and the drawing says so.
	const plotH = Math.min(320, Math.max(140, 2 * yReal * sx));
	const sy = plotH / (2 * yReal);
	const stretch = sy / sx;
	const H = TOP + plotH + AXIS + 6;
	const X = (z: number) => LEFT + z * sx;
	const Y = (y: number) => TOP + plotH / 2 - y * sy;
	const shapes: Shape[] = [];

	shapes.push({ t: 'rect', x: LEFT, y: TOP, w: plotW, h: plotH, fill: ink.paper, stroke: ink.line });
	for (const e of zone.enclosures) shapes.push({ t: 'rect', x: X(e.from), y: TOP + 2, w: (e.to - e.from) * sx, h: plotH - 4, fill: ink.sunk, stroke: ink.soft });
	for (const e of zone.enclosures) shapes.push({ t: 'text', x: X((e.from + e.to) / 2), y: TOP + 14, text: 'enclosed', size: 11, anchor: 'middle', fill: ink.soft });

	// The intrabeam zone: the beam's outline over each span, widened so it can be seen.
	for (const s of zone.spans) {
		const steps = 24;
		const zs = Array.from({ length: steps + 1 }, (_, i) => s.from + ((s.to - s.from) * i) / steps);
		const half = (z: number) => Math.max(beamRadiusAt(zone.beam, z) * sy, MIN_ZONE);
		const upper = zs.map((z) => [X(z), TOP + plotH / 2 - half(z)] as [number, number]);
		const lower = zs.map((z) => [X(z), TOP + plotH / 2 + half(z)] as [number, number]).reverse();
		shapes.push(
			s.kind === 'hazard'
				? { t: 'polygon', points: [...upper, ...lower], fill: ink.alertBg, stroke: ink.alert }
				: { t: 'polygon', points: [...upper, ...lower], fill: ink.cautionBg, hatch: ink.caution, stroke: ink.caution }
		);
	}
	// Diffuse hazard radii around their points.
	for (const d of zone.diffuse) {
		if (d.kind === 'hazard' && d.radius) shapes.push({ t: 'ellipse', cx: X(d.position), cy: Y(0), rx: Math.max(d.radius * sx, 3), ry: Math.max(d.radius * sy, 3), fill: ink.alertBg, stroke: ink.alert, dash: d.why.startsWith('at least') ? 4 : undefined });
		if (d.kind === 'unknown') shapes.push({ t: 'ellipse', cx: X(d.position), cy: Y(0), rx: 16, ry: 16, fill: ink.cautionBg, hatch: ink.caution, stroke: ink.caution, dash: 3 });
	}
	// The beam itself.
	const beamPts = (sign: 1 | -1) => zone.beam.map((b) => [X(b.position), TOP + plotH / 2 - sign * Math.max((b.diameter / 2) * sy, MIN_BEAM)] as [number, number]);
	shapes.push({ t: 'polygon', points: [...beamPts(1), ...beamPts(-1).reverse()], fill: ink.accent });
	// Elements and points along the path.
	for (const e of zone.elements) {
		shapes.push({ t: 'line', x1: X(e.position), y1: TOP + plotH / 2 - 22, x2: X(e.position), y2: TOP + plotH / 2 + 22, stroke: ink.ink, width: 2 });
		shapes.push({ t: 'text', x: X(e.position), y: TOP + plotH / 2 - 26, text: `${e.index + 1}. ${elementShortWords[e.kind] ?? e.kind}`, size: 10, anchor: 'middle', fill: ink.ink });
	}
	zone.points.forEach((p, i) => {
		const x = X(p.position);
		const y = TOP + plotH / 2;
		shapes.push({ t: 'polygon', points: [[x, y - 5], [x + 5, y], [x, y + 5], [x - 5, y]], fill: p.accessible ? ink.ink : ink.paper, stroke: ink.ink });
		const below = i % 2 === 0;
		shapes.push({ t: 'text', x, y: below ? y + 34 + (i % 4 === 2 ? 12 : 0) : y - 40 - (i % 4 === 3 ? 12 : 0), text: `P${i + 1}`, size: 11, anchor: 'middle', bold: true, fill: ink.ink });
	});

	// Axes in metres.
	for (const t of niceTicks(xMax, 8)) {
		shapes.push({ t: 'line', x1: X(t), y1: TOP + plotH, x2: X(t), y2: TOP + plotH + 5, stroke: ink.ink });
		shapes.push({ t: 'text', x: X(t), y: TOP + plotH + 18, text: tickLabel(t), size: 11, anchor: 'middle', fill: ink.ink });
	}
	shapes.push({ t: 'text', x: LEFT + plotW / 2, y: TOP + plotH + 38, text: 'Distance along the path (m), unfolded at mirrors', size: 12, anchor: 'middle', fill: ink.ink });
	const yTicks = niceTicks(yReal, 3);
	for (const t of [...yTicks.slice(1).map((v) => -v), ...yTicks]) {
		shapes.push({ t: 'line', x1: LEFT - 5, y1: Y(t), x2: LEFT, y2: Y(t), stroke: ink.ink });
		shapes.push({ t: 'text', x: LEFT - 8, y: Y(t) + 4, text: tickLabel(t), size: 11, anchor: 'end', fill: ink.ink });
	}
	shapes.push({ t: 'text', x: 14, y: TOP + plotH / 2, text: 'Across (m)', size: 12, anchor: 'middle', fill: ink.ink, rotate: -90 });

	const stretchNote = stretch > 1.05 ? ` Across the beam the drawing is stretched ×${Number(stretch.toPrecision(2))}.` : '';
	const hazardText = zone.spans.filter((s) => s.kind === 'hazard').map((s) => `${m(s.from)}–${m(s.to)}${s.enclosed ? ' (enclosed)' : ''}`);
	const description =
		(hazardText.length ? `Nominal hazard zone along the beam: ${hazardText.join(', ')}.` : 'No stretch of the beam is shown as hazardous.') +
		zone.diffuse.filter((d) => d.kind === 'hazard').map((d) => ` Diffuse hazard radius ${mUp(d.radius!)} around “${d.label}”.`).join('') +
		(zone.notes.length ? ' ' + zone.notes.join(' ') : '') +
		` Where the beam and its zone would be too thin to see, they are drawn wider than to scale.${stretchNote}`;
	return { width: W, height: H, shapes, title: 'Hazard zone, top view', description };
}
