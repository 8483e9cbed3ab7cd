// The report's other two pictures, laid out as shapes (see drawing.ts): the path as a schematic
// (its elements in order, not to scale) and the exposure along the path against the limit.
import type { HazardDistance } from '$lib/assessmentResult';
import { ink, niceTicks, tickLabel, type Drawing, type Shape } from '$lib/drawing';
import { elementShortWords as shortKind, elementWords } from '$lib/words';

/** The plot's data (server/alongPath.ts makes it), as plain data the browser may hold. */
export type PlotData = {
	checkLabel: string;
	unit: string | null;
	exposureDuration: number | null;
	samples: { position: number; exposure: number | null; limit: number | null; accessible: boolean }[];
};

/** An element of the stored path: its kind, label and length (SI decimal text, null when it has none). */
export type SchematicElement = { kind: string; label: string; length: string | null };

const metres = (v: string | null) => (v === null ? '' : `${Number(Number(v).toPrecision(3))} m`);

/** The path from the aperture to its end, one box per element, rows of six. */
export function schematicDrawing(elements: SchematicElement[], laserName: string): Drawing {
	const perRow = 6;
	const cellW = 112;
	const rowH = 78;
	const nodes = [{ kind: 'laser', label: laserName, length: null as string | null }, ...elements, { kind: 'end', label: '', length: null }];
	const rows = Math.ceil(nodes.length / perRow);
	const W = perRow * cellW + 16;
	const H = rows * rowH + 8;
	const shapes: Shape[] = [];
	nodes.forEach((n, i) => {
		const row = Math.floor(i / perRow);
		const col = i % perRow;
		const cx = 8 + col * cellW + cellW / 2;
		const cy = 8 + row * rowH + 24;
		// The beam into the next node (across the row end it continues on the next row).
		if (i < nodes.length - 1) {
			if (col < perRow - 1) shapes.push({ t: 'line', x1: cx + 22, y1: cy, x2: cx + cellW - 22, y2: cy, stroke: ink.accent, width: 2 });
			else shapes.push({ t: 'line', x1: cx + 22, y1: cy, x2: W - 4, y2: cy, stroke: ink.accent, width: 2, dash: 4 });
		}
		if (col === 0 && row > 0) shapes.push({ t: 'line', x1: 4, y1: cy, x2: cx - 22, y2: cy, stroke: ink.accent, width: 2, dash: 4 });
		const kindText = n.kind === 'laser' ? 'laser aperture' : n.kind === 'end' ? 'end of the path' : `${i}. ${shortKind[n.kind] ?? (elementWords[n.kind] ?? n.kind).toLowerCase()}`;
		switch (n.kind) {
			case 'laser':
				shapes.push({ t: 'rect', x: cx - 22, y: cy - 12, w: 44, h: 24, fill: ink.ink });
				break;
			case 'end':
				shapes.push({ t: 'rect', x: cx - 4, y: cy - 14, w: 8, h: 28, fill: ink.soft });
				break;
			case 'mirror':
				shapes.push({ t: 'line', x1: cx - 12, y1: cy + 14, x2: cx + 12, y2: cy - 14, stroke: ink.ink, width: 4 });
				break;
			case 'lens':
				shapes.push({ t: 'ellipse', cx, cy, rx: 6, ry: 16, fill: ink.paper, stroke: ink.ink });
				break;
			case 'enclosure':
				shapes.push({ t: 'rect', x: cx - 22, y: cy - 14, w: 44, h: 28, fill: ink.sunk, stroke: ink.ink });
				break;
			case 'propagate':
				shapes.push({ t: 'line', x1: cx - 22, y1: cy, x2: cx + 22, y2: cy, stroke: ink.accent, width: 2 });
				break;
			default:
				shapes.push({ t: 'rect', x: cx - 10, y: cy - 14, w: 20, h: 28, fill: ink.paper, stroke: ink.ink });
		}
		shapes.push({ t: 'text', x: cx, y: cy + 30, text: kindText, size: 10.5, anchor: 'middle', bold: true, fill: ink.ink });
		const detail = [n.kind === 'laser' ? '' : n.label, metres(n.length)].filter(Boolean).join(', ');
		if (detail) shapes.push({ t: 'text', x: cx, y: cy + 44, text: detail.length > 22 ? detail.slice(0, 21) + '…' : detail, size: 10, anchor: 'middle', fill: ink.soft });
	});
	const description = `From the laser aperture: ${elements.map((e, i) => `${i + 1}. ${(elementWords[e.kind] ?? e.kind).toLowerCase()}${e.label ? ` “${e.label}”` : ''}${e.length ? ` ${metres(e.length)}` : ''}`).join('; ') || 'no elements'}; then the end of the path.`;
	return { width: W, height: H, shapes, title: 'The beam path, schematic (not to scale)', description };
}

/** Exposure and limit along the path, on a logarithmic scale; the NOHD marked. */
export function plotDrawing(plot: PlotData, nohd: HazardDistance, pathLength: number): Drawing {
	const W = 760;
	const H = 300;
	const L = 78;
	const R = 20;
	const T = 16;
	const B = 50;
	const pw = W - L - R;
	const ph = H - T - B;
	const values = plot.samples.flatMap((s) => [s.exposure, s.limit]).filter((v): v is number => v !== null && v > 0 && Number.isFinite(v));
	const lo = values.length ? Math.floor(Math.log10(Math.min(...values))) : 0;
	const hi = values.length ? Math.max(lo + 1, Math.ceil(Math.log10(Math.max(...values)))) : 1;
	const xMax = Math.max(pathLength, 1e-6);
	const X = (z: number) => L + (z / xMax) * pw;
	const Y = (v: number) => T + ph - ((Math.log10(v) - lo) / (hi - lo)) * ph;
	const shapes: Shape[] = [{ t: 'rect', x: L, y: T, w: pw, h: ph, fill: ink.paper, stroke: ink.line }];
	const decadeStep = Math.max(1, Math.ceil((hi - lo) / 8));
	for (let e = lo; e <= hi; e += decadeStep) {
		shapes.push({ t: 'line', x1: L, y1: Y(10 ** e), x2: L + pw, y2: Y(10 ** e), stroke: ink.line });
		shapes.push({ t: 'text', x: L - 6, y: Y(10 ** e) + 4, text: `1e${e}`, size: 11, anchor: 'end', fill: ink.ink });
	}
	for (const t of niceTicks(xMax, 8)) shapes.push({ t: 'text', x: X(t), y: T + ph + 16, text: tickLabel(t), size: 11, anchor: 'middle', fill: ink.ink });
	shapes.push({ t: 'text', x: L + pw / 2, y: H - 12, text: 'Distance along the path (m)', size: 12, anchor: 'middle', fill: ink.ink });
	shapes.push({ t: 'text', x: 14, y: T + ph / 2, text: plot.unit ?? '', size: 12, anchor: 'middle', fill: ink.ink, rotate: -90 });
	const runs = (key: 'exposure' | 'limit') => {
		const out: [number, number][][] = [[]];
		for (const s of plot.samples) {
			const v = s[key];
			if (v !== null && v > 0 && Number.isFinite(v)) out[out.length - 1].push([X(s.position), Y(v)]);
			else if (out[out.length - 1].length) out.push([]);
		}
		return out.filter((r) => r.length > 1);
	};
	for (const r of runs('limit')) shapes.push({ t: 'polyline', points: r, stroke: ink.alert, width: 2, dash: 6 });
	for (const r of runs('exposure')) shapes.push({ t: 'polyline', points: r, stroke: ink.accent, width: 2.5 });
	if ((nohd.status === 'finite' || nohd.status === 'partial') && nohd.distance !== null) {
		const z = nohd.origin + nohd.distance;
		if (z <= xMax) {
			shapes.push({ t: 'line', x1: X(z), y1: T, x2: X(z), y2: T + ph, stroke: ink.ink, width: 1.5, dash: 3 });
			shapes.push({ t: 'text', x: X(z) + 4, y: T + 12, text: 'NOHD', size: 11, anchor: 'start', bold: true, fill: ink.ink });
		}
	}
	// Legend: line style and word, never colour alone.
	shapes.push({ t: 'line', x1: L + pw - 250, y1: T + 14, x2: L + pw - 226, y2: T + 14, stroke: ink.accent, width: 2.5 });
	shapes.push({ t: 'text', x: L + pw - 222, y: T + 18, text: 'exposure', size: 11, fill: ink.ink });
	if (plot.samples.some((s) => s.limit !== null)) {
		shapes.push({ t: 'line', x1: L + pw - 150, y1: T + 14, x2: L + pw - 126, y2: T + 14, stroke: ink.alert, width: 2, dash: 6 });
		shapes.push({ t: 'text', x: L + pw - 122, y: T + 18, text: 'limit (dashed)', size: 11, fill: ink.ink });
	} else shapes.push({ t: 'text', x: L + pw - 150, y: T + 18, text: 'no applicable limit', size: 11, bold: true, fill: ink.caution });
	const over = plot.samples.filter((s) => s.accessible && s.exposure !== null && s.limit !== null && s.exposure > s.limit);
	const description = `${plot.checkLabel}${plot.exposureDuration !== null ? ` over ${plot.exposureDuration} s` : ''}: exposure${plot.samples.some((s) => s.limit !== null) ? ' and limit' : ''} at ${plot.samples.length} positions along ${tickLabel(pathLength)} m. ${over.length ? `Over the limit from ${tickLabel(over[0].position)} m to ${tickLabel(over[over.length - 1].position)} m (accessible positions).` : 'No accessible position over the limit among the samples.'}`;
	return { width: W, height: H, shapes, title: 'Exposure along the path', description };
}
