// Records to print: the hazard zone on a demo path, its evaluation report (printed by Chromium on
// A4 and US Letter: no table row cut, nothing wider than the page), the PDF download, and an area's
// door posting. Screenshots go to test-results/print-records/.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import postgres from 'postgres';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { demo, expectAccessible, signIn } from './helpers';
import { e2eDatabaseUrl } from './routes';

const shots = 'test-results/print-records';
// Whitespace as one space; the micro sign as the Greek mu a PDF font may map it to.
const norm = (s: string) => s.replace(/\s+/g, ' ').replace(/\u00b5/g, '\u03bc').trim();

async function pdfPages(data: Uint8Array): Promise<string[]> {
	const doc = await getDocument({ data, useSystemFonts: false, isEvalSupported: false }).promise;
	const pages: string[] = [];
	for (let i = 1; i <= doc.numPages; i++) {
		const content = await (await doc.getPage(i)).getTextContent();
		pages.push(norm(content.items.map((it) => ('str' in it ? it.str + (it.hasEOL ? ' ' : '') : '')).join('')));
	}
	return pages;
}

async function openDemoPath(page: Page) {
	await page.goto('/lasers');
	await page.getByRole('link', { name: /Solace 5G/ }).first().click();
	await page.getByRole('link', { name: 'Raman excitation, table 2' }).first().click();
	await expect(page).toHaveURL(/\/paths\/[0-9a-f-]{36}$/);
}

test('an officer sees the hazard zone of a demo path, opens its report, downloads the PDF and opens an area’s posting', async ({ page }) => {
	test.setTimeout(180_000);
	await signIn(page, demo('officer'));
	await openDemoPath(page);
	const zone = page.getByTestId('zone-panel');
	await expect(zone.getByRole('heading', { name: 'Hazard zone, top view' })).toBeVisible();
	const svg = zone.getByTestId('zone-drawing').locator('svg');
	await expect(svg).toBeVisible();
	await expect(svg.locator('desc')).toContainText(/Nominal hazard zone along the beam: 0 m–/);
	await expect(svg.locator('text', { hasText: 'Distance along the path (m), unfolded at mirrors' })).toHaveCount(1);
	await expect(svg.locator('polygon[stroke="#9b1c1c"]').first()).toBeAttached();
	await zone.scrollIntoViewIfNeeded();
	await zone.screenshot({ path: `${shots}/hazard-zone.png` });
	await expectAccessible(page);

	await zone.getByTestId('latest-report-link').click();
	await expect(page).toHaveURL(/\/report\/[0-9a-f-]{36}$/);
	const report = page.getByTestId('evaluation-report');
	await expect(report.getByRole('heading', { name: 'Hazard evaluation report' })).toBeVisible();
	await expect(report.getByTestId('headline')).toContainText('Worst ratio');
	await expect(report.getByTestId('report-zone')).toBeVisible();
	await expect(report.getByTestId('report-limits')).toContainText('yes');
	const checksum = norm(await report.getByTestId('checksum').innerText());
	expect(checksum).toMatch(/^([0-9a-f]{8} ){7}[0-9a-f]{8}$/);
	await expect(page.getByRole('navigation')).toHaveCount(1); // the report's own links only: no app chrome
	await expectAccessible(page);
	await page.screenshot({ path: `${shots}/evaluation-report.png`, fullPage: true });

	const [download] = await Promise.all([page.waitForEvent('download'), report.getByTestId('pdf-a4').click()]);
	expect(download.suggestedFilename()).toMatch(/^hazard-evaluation-.*\.pdf$/);
	const pdf = readFileSync((await download.path())!);
	mkdirSync(shots, { recursive: true });
	writeFileSync(`${shots}/evaluation-server.pdf`, pdf);
	expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
	const text = (await pdfPages(new Uint8Array(pdf))).join(' ');
	const verdict = norm(await report.getByTestId('headline').locator('dd').first().innerText());
	expect(text).toContain(verdict);
	expect(text).toContain(`SHA-256 ${checksum}`);

	// The area of the demo laser, and its door posting.
	const sql = postgres(e2eDatabaseUrl(), { max: 1 });
	const [area] = await sql`SELECT id FROM area WHERE name = 'Spectroscopy LCA M1.07'`;
	await sql.end();
	await page.goto(`/areas/${area.id}`);
	await page.getByTestId('posting-link').click();
	const posting = page.getByTestId('area-posting');
	await expect(posting.getByRole('heading', { name: 'Laser controlled area' })).toBeVisible();
	await expect(posting.getByTestId('laser-warning-sign')).toBeVisible();
	await expect(posting.getByTestId('highest-class')).toContainText('Class 4');
	await expect(posting.getByTestId('posting-eyewear')).toContainText('532 nm');
	await expect(posting.getByTestId('posting-eyewear')).toContainText(/OD \d/);
	await expect(posting.getByTestId('posting-officers')).toContainText('@');
	// Readable at two metres: body text of the posting at least 24 px.
	const size = await posting.getByTestId('posting-people').evaluate((el) => parseFloat(getComputedStyle(el).fontSize));
	expect(size).toBeGreaterThanOrEqual(24);
	await page.setViewportSize({ width: 900, height: 1300 });
	await posting.screenshot({ path: `${shots}/area-posting.png` });
	await expectAccessible(page);
	// One page when printed on A4.
	const printed = await pdfPages(new Uint8Array(await page.pdf({ format: 'A4', printBackground: true })));
	expect(printed).toHaveLength(1);
});

for (const format of ['A4', 'Letter'] as const) {
	test(`the report page prints on ${format}: every table row whole on one page, nothing wider than the page`, async ({ page }) => {
		test.setTimeout(120_000);
		await signIn(page, demo('officer'));
		await openDemoPath(page);
		await page.getByTestId('latest-report-link').click();
		await expect(page.getByTestId('evaluation-report')).toBeVisible();

		// Laid out at the printable width of the paper (margins 12 mm each side): nothing overflows it.
		const printableMm = (format === 'A4' ? 210 : 215.9) - 24;
		await page.emulateMedia({ media: 'print' });
		await page.setViewportSize({ width: Math.floor((printableMm / 25.4) * 96), height: 1000 });
		const layout = await page.evaluate(() => {
			const width = document.documentElement.clientWidth;
			const wide = [...document.querySelectorAll('main *')]
				.filter((el) => el.getBoundingClientRect().right > width + 0.5 && getComputedStyle(el).display !== 'none')
				.map((el) => `${el.tagName}.${el.className}`);
			const rows = [...document.querySelectorAll('main tr')].map((tr) => getComputedStyle(tr).breakInside);
			const nav = [...document.querySelectorAll('.no-print')].map((el) => getComputedStyle(el).display);
			return { width, scroll: document.documentElement.scrollWidth, wide, rows, nav };
		});
		expect(layout.scroll).toBeLessThanOrEqual(layout.width);
		expect(layout.wide).toEqual([]);
		expect(layout.rows.length).toBeGreaterThan(3);
		expect(new Set(layout.rows)).toEqual(new Set(['avoid']));
		expect(layout.nav).toEqual(['none']);

		// Printed by Chromium: each row's cells are all found on one page (a cut row splits them).
		const rows = (await page.locator('main tbody tr').evaluateAll((trs) => trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent ?? '')))).map((cells) => cells.map(norm).filter(Boolean));
		const printed = await page.pdf({ format, printBackground: true });
		mkdirSync(shots, { recursive: true });
		writeFileSync(`${shots}/evaluation-printed-${format}.pdf`, printed);
		const pages = await pdfPages(new Uint8Array(printed));
		expect(pages.length).toBeGreaterThan(1);
		const cut = rows.filter((cells) => !pages.some((p) => cells.every((c) => p.includes(c))));
		expect(cut).toEqual([]);
	});
}
