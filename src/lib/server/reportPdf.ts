// The hazard evaluation report as a PDF, made on the server with pdfkit (no browser): the same
// sentences (reportText.ts) and the same drawings (drawing.ts shapes) as the print page, on A4 or
// US Letter, every table row kept whole on one page, the snapshot's checksum in every footer.
//
// Fonts: Noto Sans from npm (@fontsource), embedded and subset by pdfkit. Its files are split by
// script, so each character is written in the first file that has it (Greek and math symbols in the
// working); super- and subscript digits, which none of them carry, are written as ^-19 and plain digits.
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import PDFDocument from 'pdfkit';
import * as fontkit from 'fontkit';
import type { Drawing, Shape } from '$lib/drawing';
import { hazardZone, zoneDrawing } from '$lib/hazardZone';
import { plotDrawing, schematicDrawing } from '$lib/reportDrawings';
import { checkLines, exposureLine, headline, lineHead, lineRows, pointDistances, pointHead, pointRow, reportCautions, stepText, verdictWord, warningsOf } from '$lib/reportText';
import type { Report } from '$lib/server/reports';
import { groupedChecksum } from '$lib/server/snapshotChecksum';

export type Paper = 'A4' | 'LETTER';

const require = createRequire(import.meta.url);
const fontFile = (pkg: string, file: string) => readFileSync(require.resolve(`@fontsource/${pkg}/files/${file}`));

type Face = { name: string; data: Buffer; font: fontkit.Font };
let faces: { regular: Face[]; bold: Face[] } | null = null;
function loadFaces() {
	if (faces) return faces;
	const face = (name: string, pkg: string, file: string): Face => {
		const data = fontFile(pkg, file);
		return { name, data, font: fontkit.create(data) as fontkit.Font };
	};
	const chain = (w: 400 | 700): Face[] => [
		face(`latin-${w}`, 'noto-sans', `noto-sans-latin-${w}-normal.woff`),
		face(`latin-ext-${w}`, 'noto-sans', `noto-sans-latin-ext-${w}-normal.woff`),
		face(`greek-${w}`, 'noto-sans', `noto-sans-greek-${w}-normal.woff`),
		face('math', 'noto-sans-math', 'noto-sans-math-latin-400-normal.woff')
	];
	faces = { regular: chain(400), bold: chain(700) };
	return faces;
}

const SUP: Record<string, string> = { '⁰': '0', '¹': '1', '²': '2', '³': '3', '⁴': '4', '⁵': '5', '⁶': '6', '⁷': '7', '⁸': '8', '⁹': '9', '⁺': '+', '⁻': '-', ⁿ: 'n' };
const SUB: Record<string, string> = { '₀': '0', '₁': '1', '₂': '2', '₃': '3', '₄': '4', '₅': '5', '₆': '6', '₇': '7', '₈': '8', '₉': '9', ₑ: 'e' };

/** Super- and subscripts the fonts lack, in plain characters ('10⁻¹⁹' → '10^-19', 'log₁₀' → 'log10'); ², ³, ¹ alone stay. */
export function pdfText(text: string): string {
	return text
		.replace(/[⁰¹²³⁴-⁹⁺⁻ⁿ]+/g, (run) => (/^[¹²³]$/.test(run) ? run : '^' + [...run].map((c) => SUP[c]).join('')))
		.replace(/[₀-₉ₑ]+/g, (run) => [...run].map((c) => SUB[c]).join(''));
}

/** The text cut into runs, each in the first face that has all its characters. */
function runsOf(text: string, bold: boolean): { face: string; text: string }[] {
	const chain = loadFaces()[bold ? 'bold' : 'regular'];
	const runs: { face: string; text: string }[] = [];
	for (const ch of pdfText(text)) {
		const cp = ch.codePointAt(0)!;
		const face = cp < 0x80 ? chain[0] : (chain.find((f) => f.font.hasGlyphForCodePoint(cp)) ?? chain[0]);
		const last = runs[runs.length - 1];
		if (last && last.face === face.name) last.text += ch;
		else runs.push({ face: face.name, text: ch });
	}
	return runs;
}

type Doc = PDFKit.PDFDocument;
type TextOpts = { bold?: boolean; size?: number; width?: number; x?: number; y?: number; color?: string; align?: 'left' | 'center' | 'right'; gap?: number };

const MARGIN = 48;
const FOOTER = 40;

export function renderReportPdf(report: Report, paper: Paper = 'A4'): Promise<Buffer> {
	const doc = new PDFDocument({ size: paper, margins: { top: MARGIN, left: MARGIN, right: MARGIN, bottom: MARGIN + FOOTER }, bufferPages: true, info: { Title: `Hazard evaluation report — ${report.path.name}`, Author: 'Beamwarden', Subject: `Assessment snapshot ${report.snapshot.id}` } });
	const chunks: Buffer[] = [];
	doc.on('data', (c: Buffer) => chunks.push(c));
	const done = new Promise<Buffer>((resolve, reject) => {
		doc.on('end', () => resolve(Buffer.concat(chunks)));
		doc.on('error', reject);
	});
	const f = loadFaces();
	for (const face of [...f.regular, ...f.bold]) doc.registerFont(face.name, face.data);
	new ReportWriter(doc, report).write();
	doc.end();
	return done;
}

class ReportWriter {
	private readonly width: number;
	private readonly bottom: number;
	constructor(
		private doc: Doc,
		private report: Report
	) {
		this.width = doc.page.width - MARGIN * 2;
		this.bottom = doc.page.height - MARGIN - FOOTER;
	}

	/** Text in mixed faces, wrapped to the width. */
	private text(s: string, o: TextOpts = {}) {
		const { doc } = this;
		const runs = runsOf(s || ' ', o.bold ?? false);
		doc.fontSize(o.size ?? 10).fillColor(o.color ?? '#1d2327');
		const x = o.x ?? MARGIN;
		const width = o.width ?? this.width - (x - MARGIN);
		runs.forEach((r, i) => {
			doc.font(r.face);
			const last = i === runs.length - 1;
			if (i === 0) doc.text(r.text, x, o.y ?? doc.y, { width, continued: !last, align: o.align ?? 'left', lineGap: 1.5 });
			else doc.text(r.text, { continued: !last, lineGap: 1.5 });
		});
		if (o.gap) doc.y += o.gap;
	}

	private heightOf(s: string, o: TextOpts & { width: number }): number {
		const { doc } = this;
		// Measured in the first face: the fallbacks have the same metrics family (Noto).
		doc.font(runsOf(s || ' ', o.bold ?? false)[0].face).fontSize(o.size ?? 10);
		return doc.heightOfString(pdfText(s || ' '), { width: o.width, lineGap: 1.5 });
	}

	private ensure(height: number) {
		if (this.doc.y + height > this.bottom) this.doc.addPage();
	}

	private heading(s: string) {
		this.ensure(60);
		this.doc.y += 8;
		this.text(s, { bold: true, size: 13, gap: 4 });
	}

	/** A table whose rows never break across pages: the header repeats on a new page. */
	private table(head: string[], rows: (string[] | { span: string })[], widths: number[], size = 9) {
		const { doc } = this;
		const total = widths.reduce((a, b) => a + b, 0);
		const cols = widths.map((w) => (w / total) * this.width);
		const pad = 3;
		const drawRow = (row: string[] | { span: string }, bold: boolean) => {
			// A spanning row (a line's exposure under its point) is written across the whole table.
			const spanning = !Array.isArray(row);
			const cells = spanning ? [row.span] : row;
			const widthsOf = spanning ? [this.width - 14] : cols;
			const h = Math.max(...cells.map((c, i) => this.heightOf(c, { width: widthsOf[i] - pad * 2, size, bold }))) + pad * 2;
			if (doc.y + h > this.bottom) {
				doc.addPage();
				if (!bold) drawRow(head, true);
			}
			const y = doc.y;
			let x = spanning ? MARGIN + 14 : MARGIN;
			if (bold) doc.rect(MARGIN, y, this.width, h).fill('#ece8df');
			cells.forEach((c, i) => {
				this.text(c, { x: x + pad, y: y + pad, width: widthsOf[i] - pad * 2, size, bold, color: spanning ? '#3f4a50' : undefined });
				x += widthsOf[i];
			});
			doc.moveTo(MARGIN, y + h).lineTo(MARGIN + this.width, y + h).lineWidth(0.5).strokeColor('#cfd6d9').stroke();
			doc.y = y + h;
			doc.x = MARGIN;
		};
		drawRow(head, true);
		for (const r of rows) drawRow(r, false);
		doc.y += 6;
	}

	/** Label → value pairs in two columns, each pair kept whole. */
	private pairs(items: [string, string][]) {
		const lw = this.width * 0.34;
		for (const [label, value] of items) {
			const h = Math.max(this.heightOf(label, { width: lw - 6, bold: true }), this.heightOf(value, { width: this.width - lw }));
			this.ensure(h + 2);
			const y = this.doc.y;
			this.text(label, { x: MARGIN, y, width: lw - 6, bold: true });
			this.text(value, { x: MARGIN + lw, y, width: this.width - lw });
			this.doc.y = y + h + 2;
		}
		this.doc.x = MARGIN;
	}

	private para(s: string, o: TextOpts = {}) {
		this.ensure(this.heightOf(s, { ...o, width: o.width ?? this.width }) + 2);
		this.text(s, { ...o, gap: o.gap ?? 3 });
		this.doc.x = MARGIN;
	}

	private drawing(d: Drawing) {
		const scale = this.width / d.width;
		const h = d.height * scale;
		this.ensure(h + 30);
		this.text(d.title, { bold: true, size: 10, gap: 2 });
		const top = this.doc.y;
		drawShapes(this.doc, d.shapes, MARGIN, top, scale);
		this.doc.y = top + h + 4;
		this.doc.x = MARGIN;
		this.para(d.description, { size: 8.5, color: '#3f4a50' });
	}

	write() {
		const { report } = this;
		const r = report.result;
		const s = report.snapshot;
		this.text('Hazard evaluation report', { bold: true, size: 20, gap: 2 });
		this.text(`${report.path.name} — ${report.laser.name}${report.laser.serial ? `, serial ${report.laser.serial}` : ''}, Class ${report.laser.laserClass} · ${report.laser.labName} (${report.laser.labCode})`, { size: 11, gap: 6 });
		this.pairs([
			['Assessment snapshot', `${s.createdAt.slice(0, 16).replace('T', ' ')} UTC${s.createdByName ? `, saved by ${s.createdByName}` : ''} (path version ${s.pathVersion}, ${s.cause === 'save' ? 'saved' : 're-evaluated'})`],
			['Engine version', s.engineVersion],
			['Status of this snapshot', `${s.isLatest ? 'the latest snapshot of the path' : 'an earlier snapshot: the path has been assessed again since'}${s.stale ? ` — out of date: ${s.staleReason ?? 'a line, limit or the engine changed'}` : ''}`],
			['Report made', `${report.printedAt.slice(0, 16).replace('T', ' ')} UTC`]
		]);
		if (report.path.purpose) this.para(`Purpose: ${report.path.purpose}`);

		this.heading('Result');
		if (r) {
			this.pairs(headline(r));
			this.para(r.reason, { gap: 4 });
			for (const w of warningsOf(r)) this.para(`• ${w}`, { size: 9 });
		} else if (report.older) {
			this.pairs([
				['Verdict', verdictWord(report.older.verdict)],
				['Worst ratio', report.older.worstRatio === null ? 'not computed' : String(report.older.worstRatio)]
			]);
			this.para(`${report.older.reason} Made by the earlier engine ${report.older.engineVersion}; printed as it was saved, without the parts that engine did not record.`);
		}

		this.heading('Review decision on this snapshot');
		const d = report.decision;
		if (d) {
			this.pairs([
				['Decision', d.decision === 'cleared' ? 'cleared with controls' : 'returned to the researcher'],
				['By, on', `${d.decidedByName}, ${d.decidedAt.slice(0, 10)}`],
				...(d.reviewBy ? ([['Review again by', d.reviewBy]] as [string, string][]) : [])
			]);
			this.para(d.controls.length ? 'Required controls:' : 'No control was required.', { bold: true });
			for (const c of d.controls) this.para(`• ${c}`);
			if (d.comments) this.para(`Comments: ${d.comments}`);
			if (report.laterDecision) this.para('A later decision on this path supersedes this one.', { bold: true });
		} else this.para('No review decision was taken on this snapshot.');

		if (r) {
			this.heading('Laser and emission lines');
			this.table(lineHead, lineRows(r), [14, 14, 14, 28, 30]);
		}
		this.heading('The beam path');
		this.drawing(schematicDrawing(report.elements, report.laser.name));
		if (r) {
			this.drawing(zoneDrawing(hazardZone(r, report.beam)));
			if (report.plot) this.drawing(plotDrawing(report.plot, r.nohd, r.pathLength));
			else this.para('No plot: the exposure could not be sampled along this path.', { size: 9 });

			this.heading('Points of concern and results');
			const rows = r.points.flatMap((p) => [pointRow(p), ...p.lines.map((l) => ({ span: exposureLine(r, l) }))]);
			this.table(pointHead, rows, [26, 12, 12, 16, 12, 12]);
			for (const p of r.points) {
				this.ensure(60);
				this.text(`${p.label || p.id} — ${verdictWord(p.verdict)}`, { bold: true, size: 11, gap: 1 });
				this.para(p.reason, { size: 9 });
				for (const c of checkLines(r, p)) {
					this.para(c.head, { bold: true, size: 9, gap: 1 });
					for (const x of c.detail) this.para(x, { size: 9, x: MARGIN + 10, gap: 1 });
				}
				for (const x of pointDistances(p)) this.para(x, { size: 9 });
				this.doc.y += 4;
			}

			this.heading('Exposure limits used');
			this.table(
				['Limit', 'Version', 'Citation', 'Deciding'],
				report.limits.map((l) => [l.label, l.version, l.citation, l.deciding ? 'yes' : '']),
				[30, 10, 48, 12]
			);

			this.heading('The working');
			for (const p of r.points) this.working(`At “${p.label || p.id}”`, p.breakdown);
			this.working('The beam and the NOHD', r.breakdown);
		}

		this.heading('Cautions');
		for (const c of reportCautions) this.para(`• ${c}`);
		this.footers();
	}

	private working(title: string, steps: AssessmentResultStep[]) {
		this.ensure(40);
		this.text(title, { bold: true, size: 10.5, gap: 2 });
		if (!steps.length) this.para('No steps were recorded for this part.', { size: 9 });
		steps.forEach((step, i) => {
			const t = stepText(step);
			const block = [`${i + 1}. ${t.label}`, t.formula, t.inputs, t.value, t.note].filter(Boolean);
			const h = block.reduce((sum, b) => sum + this.heightOf(b, { width: this.width - 12, size: 8.5 }), 0);
			this.ensure(h + 4);
			this.text(block[0], { bold: true, size: 8.5, x: MARGIN + 6 });
			for (const b of block.slice(1)) this.text(b, { size: 8.5, x: MARGIN + 12 });
			this.doc.y += 3;
			this.doc.x = MARGIN;
		});
	}

	private footers() {
		const { doc } = this;
		const range = doc.bufferedPageRange();
		for (let i = range.start; i < range.start + range.count; i++) {
			doc.switchToPage(i);
			const bottom = doc.page.margins.bottom;
			doc.page.margins.bottom = 0;
			const y = doc.page.height - MARGIN - 22;
			doc.moveTo(MARGIN, y - 4).lineTo(doc.page.width - MARGIN, y - 4).lineWidth(0.5).strokeColor('#cfd6d9').stroke();
			this.text(`Snapshot ${this.report.snapshot.id} · SHA-256 ${groupedChecksum(this.report.checksum)}`, { x: MARGIN, y, size: 7.5, width: this.width });
			this.text(`Beamwarden hazard evaluation · computed from entered data, not a substitute for measurement · page ${i + 1} of ${range.count}`, { x: MARGIN, y: y + 10, size: 7.5, width: this.width, color: '#3f4a50' });
			doc.page.margins.bottom = bottom;
		}
	}
}

type AssessmentResultStep = NonNullable<Report['result']>['breakdown'][number];

/** Shapes laid out for the page, drawn as PDF vectors at (x, y) and scale. */
function drawShapes(doc: Doc, shapes: Shape[], x: number, y: number, scale: number) {
	const X = (v: number) => x + v * scale;
	const Y = (v: number) => y + v * scale;
	const hatch = (colour: string, path: () => void, box: { x: number; y: number; w: number; h: number }) => {
		doc.save();
		path();
		doc.clip();
		for (let t = -box.h; t < box.w + box.h; t += 6) doc.moveTo(box.x + t, box.y + box.h).lineTo(box.x + t + box.h, box.y).lineWidth(1).strokeColor(colour).stroke();
		doc.restore();
	};
	const dash = (d?: number) => (d ? doc.dash(d * scale, { space: d * scale }) : doc.undash());
	for (const s of shapes) {
		switch (s.t) {
			case 'line':
				dash(s.dash);
				doc.moveTo(X(s.x1), Y(s.y1)).lineTo(X(s.x2), Y(s.y2)).lineWidth((s.width ?? 1) * scale).strokeColor(s.stroke).stroke();
				doc.undash();
				break;
			case 'polyline': {
				dash(s.dash);
				doc.moveTo(X(s.points[0][0]), Y(s.points[0][1]));
				for (const [px, py] of s.points.slice(1)) doc.lineTo(X(px), Y(py));
				doc.lineWidth((s.width ?? 1) * scale).strokeColor(s.stroke).stroke();
				doc.undash();
				break;
			}
			case 'rect': {
				const path = () => doc.rect(X(s.x), Y(s.y), s.w * scale, s.h * scale);
				path();
				if (s.stroke) doc.lineWidth(scale).fillAndStroke(s.fill, s.stroke);
				else doc.fill(s.fill);
				if (s.hatch) hatch(s.hatch, path, { x: X(s.x), y: Y(s.y), w: s.w * scale, h: s.h * scale });
				break;
			}
			case 'ellipse': {
				const path = () => doc.ellipse(X(s.cx), Y(s.cy), s.rx * scale, s.ry * scale);
				dash(s.dash);
				path();
				doc.fillOpacity(0.85);
				if (s.stroke) doc.lineWidth(scale).fillAndStroke(s.fill, s.stroke);
				else doc.fill(s.fill);
				doc.fillOpacity(1).undash();
				if (s.hatch) hatch(s.hatch, path, { x: X(s.cx - s.rx), y: Y(s.cy - s.ry), w: 2 * s.rx * scale, h: 2 * s.ry * scale });
				break;
			}
			case 'polygon': {
				const path = () => {
					doc.moveTo(X(s.points[0][0]), Y(s.points[0][1]));
					for (const [px, py] of s.points.slice(1)) doc.lineTo(X(px), Y(py));
					doc.closePath();
				};
				path();
				if (s.stroke) doc.lineWidth(scale).fillAndStroke(s.fill, s.stroke);
				else doc.fill(s.fill);
				if (s.hatch) {
					const xs = s.points.map((p) => X(p[0]));
					const ys = s.points.map((p) => Y(p[1]));
					hatch(s.hatch, path, { x: Math.min(...xs), y: Math.min(...ys), w: Math.max(...xs) - Math.min(...xs), h: Math.max(...ys) - Math.min(...ys) });
				}
				break;
			}
			case 'text': {
				const size = s.size * scale;
				const runs = runsOf(s.text, s.bold ?? false);
				doc.fontSize(size).fillColor(s.fill ?? '#1d2327');
				const widths = runs.map((r) => doc.font(r.face).widthOfString(r.text));
				const total = widths.reduce((a, b) => a + b, 0);
				let tx = X(s.x) - (s.anchor === 'middle' ? total / 2 : s.anchor === 'end' ? total : 0);
				// SVG places text by its baseline; pdfkit by its top.
				const ty = Y(s.y) - size * 0.8;
				doc.save();
				if (s.rotate) doc.rotate(s.rotate, { origin: [X(s.x), Y(s.y)] });
				runs.forEach((r, i) => {
					doc.font(r.face).text(r.text, tx, ty, { lineBreak: false });
					tx += widths[i];
				});
				doc.restore();
				break;
			}
		}
	}
	doc.x = MARGIN;
}
