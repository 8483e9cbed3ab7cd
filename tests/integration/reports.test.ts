// The evaluation report as a PDF, read back with pdfjs: the verdict, the worst ratio and the
// deciding limit's citation are in its text, and the checksum printed is the one of the stored snapshot.
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as paths from '$lib/server/paths';
import * as postings from '$lib/server/postings';
import * as reports from '$lib/server/reports';
import * as reviews from '$lib/server/reviews';
import { renderReportPdf } from '$lib/server/reportPdf';
import { snapshotChecksum } from '$lib/server/snapshotChecksum';
import { ratio } from '$lib/display';
import type { AssessmentResult } from '$lib/assessmentResult';
import type { Scope } from '$lib/server/auth/scope';
import { lasers, laserForm, limitForm, limits, makeLab, makeUser, must, pathForm, scopeFor } from './factories';

const citation = `Report test code, table 5, row ${Date.now()}`;
let lab: { id: string };
let researcher: Scope;
let officer: Scope;

async function pdfText(pdf: Buffer): Promise<{ text: string; pages: number }> {
	const doc = await getDocument({ data: new Uint8Array(pdf), useSystemFonts: false, isEvalSupported: false }).promise;
	const parts: string[] = [];
	for (let i = 1; i <= doc.numPages; i++) {
		const content = await (await doc.getPage(i)).getTextContent();
		parts.push(content.items.map((it) => ('str' in it ? it.str + (it.hasEOL ? '\n' : '') : '')).join(''));
	}
	return { text: parts.join('\n'), pages: doc.numPages };
}

beforeAll(async () => {
	lab = await makeLab();
	researcher = await scopeFor(await makeUser('researcher', [lab.id]));
	officer = await scopeFor(await makeUser('officer'));
	await limits.create(officer.userId, limitForm({ label: `Report tests visible ${Date.now()}`, citation }));
	await paths.reassessStale(1000);
});

async function savedPath() {
	const created = must(await lasers.create(researcher, laserForm(lab.id)));
	const found = must(await lasers.find(researcher, created.id));
	const saved = must(await paths.save(researcher, created.id, null, pathForm(found.detail.lines[0].id)));
	const p = must(await paths.find(researcher, saved.id));
	return { pathId: saved.id, laserId: created.id, snapshot: p.detail.latest! };
}

describe('the evaluation report as a PDF', () => {
	it('carries the verdict, the worst ratio, the citation, the controls and the snapshot checksum', async () => {
		const { pathId, snapshot } = await savedPath();
		const result = snapshot.result as AssessmentResult;
		expect(result.verdict).toBe('exceeds_limit');
		const need = result.requiredOpticalDensities[0].od.roundedUpWhole;
		must(await reviews.decide(officer, pathId, { assessmentId: snapshot.id, afterDecisionId: '', decision: 'cleared', comments: 'Tube the beam.', reviewBy: '', controls: [{ kind: 'eyewear', minOd: String(need), wavelength: '532 nm', wavelengthMax: '', details: '' }] }));

		const { report } = must(await reports.find(researcher, pathId, snapshot.id));
		await renderReportPdf(report, 'A4'); // the first one also reads the fonts
		const started = performance.now();
		const pdf = await renderReportPdf(report, 'A4');
		const ms = performance.now() - started;
		console.info(`evaluation report PDF: ${pdf.length} bytes in ${ms.toFixed(0)} ms`);
		expect(ms).toBeLessThan(10_000);
		expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
		const { text, pages } = await pdfText(pdf);
		const flat = text.replace(/\s+/g, ' ');
		expect(flat).toContain('exceeds limit');
		expect(flat).toContain(`Worst ratio (exposure ÷ limit) ${ratio(result.worstRatio)}`);
		expect(flat).toContain(citation);
		expect(flat).toContain('cleared with controls');
		expect(flat).toContain(`Protective eyewear: at least OD ${need} at 532 nm`);
		expect(flat).toContain(`Engine version ${snapshot.engineVersion}`);
		expect(flat).toContain('does not replace measurement');
		// The checksum in the footer of every page is the one of the stored row, read afresh.
		const [row] = await db.select().from(table.assessment).where(eq(table.assessment.id, snapshot.id));
		const printed = [...flat.matchAll(/SHA-256 ((?:[0-9a-f]{8} ?){8})/g)].map((m) => m[1].replace(/ /g, ''));
		expect(printed).toHaveLength(pages);
		expect(new Set(printed)).toEqual(new Set([snapshotChecksum(row)]));
		// Letter paper: the same contents.
		const letter = await pdfText(await renderReportPdf(report, 'LETTER'));
		expect(letter.text.replace(/\s+/g, ' ')).toContain(citation);
	});

	it('prints a past snapshot as it was, after the path changed', async () => {
		const { pathId, laserId, snapshot } = await savedPath();
		const found = must(await lasers.find(researcher, laserId));
		const p = must(await paths.find(researcher, pathId));
		must(await paths.save(researcher, laserId, pathId, { ...pathForm(found.detail.lines[0].id), name: 'Bench path A, moved', version: p.detail.path.version }));
		const { report } = must(await reports.find(researcher, pathId, snapshot.id));
		expect(report.snapshot.isLatest).toBe(false);
		expect(report.checksum).toBe(snapshotChecksum(snapshot));
		const { text } = await pdfText(await renderReportPdf(report));
		expect(text.replace(/\s+/g, ' ')).toContain('an earlier snapshot');
	});

	it('refuses another lab’s path and a snapshot of another path', async () => {
		const { pathId, snapshot } = await savedPath();
		const stranger = await scopeFor(await makeUser('researcher', [(await makeLab()).id]));
		expect(await reports.find(stranger, pathId, snapshot.id)).toMatchObject({ ok: false });
		const other = await savedPath();
		expect(await reports.find(researcher, pathId, other.snapshot.id)).toMatchObject({ ok: false, status: 404 });
		expect(await reports.find(researcher, pathId, 'not-a-uuid')).toMatchObject({ ok: false, status: 404 });
	});
});

describe('the door posting', () => {
	it('posts the OD of every line from the latest snapshot, and says plainly when a line has no assessment', async () => {
		const [area] = await db.insert(table.area).values({ labId: lab.id, name: `Posting test ${Date.now()}` }).returning();
		const { laserId, snapshot } = await savedPath();
		const bare = must(await lasers.create(researcher, laserForm(lab.id, { wavelength: '1064 nm' })));
		await db.update(table.laser).set({ areaId: area.id }).where(eq(table.laser.id, laserId));
		await db.update(table.laser).set({ areaId: area.id }).where(eq(table.laser.id, bare.id));
		const posting = must(await postings.find(researcher, area.id, '2026-12-02'));
		const need = (snapshot.result as AssessmentResult).requiredOpticalDensities[0].od.roundedUpWhole;
		expect(posting.needs).toHaveLength(2);
		expect(posting.needs.find((n) => Number(n.wavelength) === 532e-9)).toMatchObject({ od: need, state: 'assessed' });
		expect(posting.needs.find((n) => Number(n.wavelength) === 1064e-9)).toMatchObject({ od: null, state: 'not_assessed', note: expect.stringContaining('eyewear not determined') });
		expect(posting.officers.length).toBeGreaterThan(0);
	});
});
