// Limit sets in a real browser, as the officer: download the library, upload the file back and see
// "no changes"; a broken file gets a report naming rows and fields, and nothing is published.
import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { demo, expectAccessible, signIn, signedInClient } from './helpers';

/** The library as the export API gives it, without the export time. */
async function library() {
	const officer = await signedInClient(demo('officer'));
	const res = await officer.get('/api/limits/export');
	expect(res.status()).toBe(200);
	const { exportedAt: _, ...rest } = await res.json();
	return rest;
}

test('the officer downloads the limit set, uploads it back unchanged, and gets a report for a broken file', async ({ page }, testInfo) => {
	// Four accessibility checks and two uploads on a shared machine.
	test.setTimeout(150_000);
	await signIn(page, demo('officer'));
	await page.goto('/limits');
	await expectAccessible(page);

	const downloading = page.waitForEvent('download');
	await page.getByRole('link', { name: 'Download the limit set' }).click();
	const download = await downloading;
	expect(download.suggestedFilename()).toMatch(/^beamwarden-limit-set-\d{4}-\d{2}-\d{2}\.json$/);
	const saved = testInfo.outputPath('limit-set.json');
	await download.saveAs(saved);
	const file = JSON.parse(readFileSync(saved, 'utf8'));
	expect(file).toMatchObject({ format: 'beamwarden-limit-set', version: 1 });
	expect(file.limits.length).toBeGreaterThanOrEqual(10);
	const before = await library();

	// Back in: a draft of unchanged rows.
	await page.getByRole('link', { name: 'Import a limit set' }).click();
	await expect(page.getByRole('heading', { name: 'Import a limit set' })).toBeVisible();
	await expectAccessible(page);
	await page.getByLabel(/Limit-set file/).setInputFiles(saved);
	await page.getByRole('button', { name: 'Check the file' }).click();
	await expect(page).toHaveURL(/\/limits\/import\/[0-9a-f-]{36}$/);
	await expect(page.getByTestId('import-summary')).toHaveText(/No changes: every row matches a limit in force\./);
	await expect(page.getByRole('row', { name: /unchanged/ })).toHaveCount(file.limits.length);
	await expectAccessible(page);
	await page.getByRole('button', { name: 'Publish (changes nothing)' }).click();
	await expect(page.getByText(/Published: 0 new, 0 revised, \d+ unchanged; 0 beam paths marked stale\./)).toBeVisible();
	expect(await library()).toEqual(before);

	// A broken file: the report names each bad row (counted from 1), its limit and field.
	const broken = structuredClone(file);
	broken.limits[1].k = '-5 J/m²';
	broken.limits[3].wavelengthMin = 'green';
	broken.limits[4].colour = 'red';
	await page.goto('/limits/import');
	await page.getByLabel(/Limit-set file/).setInputFiles({ name: 'broken-set.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(broken)) });
	await page.getByRole('button', { name: 'Check the file' }).click();
	const report = page.getByTestId('import-report');
	await expect(report.getByRole('alert')).toHaveText('3 of ' + file.limits.length + ' limits need attention. Nothing was imported.');
	await expect(report.getByRole('heading')).toContainText('Not imported: “broken-set.json”');
	const row = (n: number, label: string, field: string) => report.getByRole('row').filter({ hasText: label }).filter({ has: page.getByRole('cell', { name: String(n), exact: true }) }).filter({ hasText: field });
	await expect(row(2, file.limits[1].label, 'Coefficient k')).toContainText('The limit must be above zero.');
	await expect(row(4, file.limits[3].label, 'Shortest wavelength')).toHaveCount(1);
	await expect(row(5, file.limits[4].label, 'colour')).toContainText('Not a field of a limit.');
	await expectAccessible(page);
	// Nothing published, nothing kept as a draft.
	expect(await library()).toEqual(before);
	await page.goto('/limits/import');
	await expect(page.getByRole('link', { name: 'broken-set.json' })).toHaveCount(0);
});

test('malformed JSON, another format, a newer version and an oversized file are refused with a 4xx and a clear message', async () => {
	const officer = await signedInClient(demo('officer'));
	const upload = async (body: string | Buffer, name = 'set.json') => {
		const res = await officer.post('/limits/import?/upload', { headers: { accept: 'text/html' }, multipart: { file: { name, mimeType: 'application/json', buffer: Buffer.from(body) } }, maxRedirects: 0 });
		return { status: res.status(), text: await res.text() };
	};
	const before = await library();
	expect(await upload('{"format": "beamwarden-limit-set", "limits": [')).toMatchObject({ status: 400, text: expect.stringContaining('The file is not valid JSON') });
	expect(await upload(JSON.stringify({ format: 'some-other-list', version: 1 }))).toMatchObject({ status: 400, text: expect.stringContaining('This is not a Beamwarden limit set') });
	expect(await upload(JSON.stringify({ format: 'beamwarden-limit-set', version: 7, exportedAt: new Date().toISOString(), limits: [] }))).toMatchObject({
		status: 400,
		text: expect.stringContaining('written in version 7 of the format; this Beamwarden reads version 1')
	});
	const big = await upload(' '.repeat(2 * 1024 * 1024 + 10), 'big.json');
	expect(big.status).toBe(413);
	expect(big.text).toMatch(/larger than 2 MB|too large/);
	expect(await library()).toEqual(before);
	// The API's export is the officer's alone.
	const researcher = await signedInClient(demo('researcher'));
	expect((await researcher.get('/api/limits/export')).status()).toBe(403);
});
