// Drawings as plain shapes: laid out once by pure functions (hazard zone, plot, schematic) and drawn
// twice, as SVG in the browser (components/report/Drawing.svelte) and as vector paths in the PDF
// (server/reportPdf.ts), so the page and the paper show the same picture.

export type Fill = { fill: string; hatch?: string };
export type Shape =
	| { t: 'line'; x1: number; y1: number; x2: number; y2: number; stroke: string; width?: number; dash?: number }
	| ({ t: 'rect'; x: number; y: number; w: number; h: number; stroke?: string } & Fill)
	| ({ t: 'ellipse'; cx: number; cy: number; rx: number; ry: number; stroke?: string; dash?: number } & Fill)
	| ({ t: 'polygon'; points: [number, number][]; stroke?: string } & Fill)
	| { t: 'polyline'; points: [number, number][]; stroke: string; width?: number; dash?: number }
	| { t: 'text'; x: number; y: number; text: string; size: number; anchor?: 'start' | 'middle' | 'end'; bold?: boolean; fill?: string; rotate?: number };

export type Drawing = { width: number; height: number; shapes: Shape[]; title: string; description: string };

/** Beamwarden's ink, paper and state colours (tailwind.config.ts), for drawings outside the CSS. */
export const ink = { ink: '#1d2327', soft: '#3f4a50', line: '#cfd6d9', paper: '#ffffff', sunk: '#ece8df', alert: '#9b1c1c', alertBg: '#f3c4c4', caution: '#7a4a00', cautionBg: '#fdf3dc', calm: '#1f5130', accent: '#146a66' };

/** Round steps (1, 2, 5 × 10ⁿ) covering 0…max with about `count` ticks. */
export function niceTicks(max: number, count = 6): number[] {
	if (!(max > 0) || !Number.isFinite(max)) return [0];
	const raw = max / count;
	const p = 10 ** Math.floor(Math.log10(raw));
	const step = [1, 2, 5, 10].map((m) => m * p).find((s) => s >= raw)!;
	const ticks: number[] = [];
	for (let v = 0; v <= max * (1 + 1e-9); v += step) ticks.push(Number(v.toPrecision(12)));
	return ticks;
}

/** A tick label: plain digits, no trailing zeros ('0.25', '10'). */
export function tickLabel(v: number): string {
	return String(Number(v.toPrecision(6)));
}
