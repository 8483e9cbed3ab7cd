// The register's CSV in a browser: an officer downloads the template, uploads a file with problems
// and sees them by line and column, imports the valid rows only and follows the job to the end,
// then downloads the exports (lasers, lines, paths) and finds the new lasers there, formula-like
// text kept as text.
import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { demo, expectAccessible, signIn } from './helpers';

const columns = ['lab', 'maker', 'model', 'serial', 'class', 'status', 'notes', 'line_label', 'mode', 'wavelength', 'power', 'beam_diameter', 'divergence'];
const quote = (v: string) => `"${v.replace(/"/g, '""')}"`;

async function download(page: Page, link: string): Promise<string> {
	const waiting = page.waitForEvent('download');
	await page.getByRole('link', { name: link, exact: true }).click();
	const file = await waiting;
	return readFileSync((await file.path())!, 'utf8');
}

test('an officer imports the valid rows of a file with problems, follows the import, and downloads the exports', async ({ page }) => {
	test.setTimeout(120_000);
	const tag = Date.now().toString(36).toUpperCase();
	await signIn(page, demo('officer'));
	await page.goto('/lasers');
	await page.getByRole('link', { name: 'Import from CSV' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Import lasers from a CSV file' })).toBeVisible();
	await expect(page.getByRole('rowheader', { name: 'beam_diameter_definition' })).toBeVisible();
	await expectAccessible(page);
	const template = await download(page, 'template CSV');
	expect(template.split('\r\n')[0]).toMatch(/^"lab","maker","model","serial","class"/);

	// Not a CSV at all: refused with a word on what to do.
	await page.getByLabel(/CSV file/).setInputFiles({ name: 'register.xlsx', mimeType: 'text/csv', buffer: Buffer.from('504b0304140000000800', 'hex') });
	await page.getByRole('button', { name: 'Check the file' }).click();
	await expect(page.getByRole('alert')).toContainText('save it as “CSV UTF-8”');

	const rows = [
		['SPX', 'Import Optics', 'Beacon 532', `IMP-${tag}-1`, '3B', 'active', '=HYPERLINK("x")', 'green', 'continuous', '532 nm', '40 mW', '1.5 mm', '1.2 mrad'],
		['SPX', 'Import Optics', 'Beacon 532', `IMP-${tag}-1`, '3B', 'active', '=HYPERLINK("x")', 'red', 'continuous', '635 nm', '5 mW', '1.5 mm', '1.2 mrad'],
		['UFL', 'Import Optics', 'Beacon 1064', `IMP-${tag}-2`, '4', 'active', '', '', 'continuous', '1064 nm', '2 W', '2 mm', '1 mrad'],
		['UFL', 'Import Optics', 'Beacon 1064', `IMP-${tag}-3`, '4', 'active', '', '', 'continuous', '1064 nm', 'two watts', '2 mm', '1 mrad'],
		['NOPE', 'Import Optics', 'Beacon 1064', `IMP-${tag}-4`, '7', 'active', '', '', 'continuous', '1064 nm', '2 W', '2 mm', '1 mrad']
	];
	const csv = [columns, ...rows].map((r) => r.map(quote).join(',')).join('\r\n') + '\r\n';
	await page.getByLabel(/CSV file/).setInputFiles({ name: `lasers-${tag}.csv`, mimeType: 'text/csv', buffer: Buffer.from(csv) });
	await page.getByRole('button', { name: 'Check the file' }).click();
	await expect(page.getByRole('heading', { level: 1, name: `Import of “lasers-${tag}.csv”` })).toBeVisible();
	await expect(page.getByTestId('total-rows')).toHaveText('5');
	await expect(page.getByTestId('error-rows')).toHaveText('2');
	const problems = page.getByTestId('problems');
	await expect(problems.getByRole('row')).toHaveCount(1 + 3);
	await expect(problems.getByRole('row', { name: /^5 power/ })).toBeVisible();
	await expect(problems.getByRole('row', { name: /^6 lab No lab has the code “NOPE”/ })).toBeVisible();
	await expect(problems.getByRole('row', { name: /^6 class/ })).toBeVisible();
	// Nothing is imported while rows have problems, unless the officer asks for the valid rows only.
	await expect(page.getByRole('button', { name: /^Import \d+ rows$/ })).toHaveCount(0);
	await expectAccessible(page);
	await page.getByRole('button', { name: 'Import the valid rows only (3)' }).click();

	// The job writes it; the page follows until it is done.
	const progress = page.getByTestId('import-progress');
	await expect(progress).toBeVisible();
	await expect(progress).toContainText('3 of 3 rows written (100 %) — done.', { timeout: 30_000 });
	await expect(page.getByTestId('import-summary')).toContainText('2 lasers added, 0 updated');
	await expect(page.getByTestId('import-summary')).toContainText('3 lines added');
	await expectAccessible(page);

	await page.goto(`/lasers?q=IMP-${tag}`);
	await expect(page.getByRole('link', { name: /Import Optics Beacon 532/ })).toBeVisible();
	await expect(page.getByRole('link', { name: /Import Optics Beacon 1064/ })).toHaveCount(1);

	// The exports, through the links of the register page.
	await page.goto('/lasers');
	const lasers = await download(page, 'lasers');
	expect(lasers.split('\r\n')[0]).toMatch(/^"lab","maker","model","serial","class","status"/);
	expect(lasers).toContain(`"IMP-${tag}-1"`);
	expect(lasers).toContain(`"'=HYPERLINK(""x"")"`);
	const lines = await download(page, 'emission lines');
	expect(lines.split('\r\n').filter((l) => l.includes(`IMP-${tag}-1`))).toHaveLength(2);
	expect(lines).toContain('"532 nm","","40 mW"'); // wavelength, (no) wavelength_max, power: with their units
	const paths = await download(page, 'beam paths with their latest verdict');
	expect(paths.split('\r\n')[0]).toContain('"latest verdict"');
	expect(paths).toContain('"Verdant Photonics","Solace 5G"');
});
