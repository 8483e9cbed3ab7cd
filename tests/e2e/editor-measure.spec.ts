// A scripted new user registers a laser and a 6-element, 3-point beam path to a saved verdict: the
// fields filled, the clicks made and the time taken, and the editor page's height on a laptop and a
// phone. The figures go to test-results/editor-figures.json for the issue note.
import { mkdirSync, writeFileSync } from 'node:fs';
import { expect, test, type Locator } from '@playwright/test';
import { demo, signIn } from './helpers';

test('a new user registers a laser and a 6-element path to a saved verdict (figures)', async ({ page }) => {
	test.setTimeout(120_000);
	let fields = 0;
	let clicks = 0;
	const fill = async (l: Locator, value: string) => {
		fields += 1;
		await l.fill(value);
	};
	const choose = async (l: Locator, value: string | { label: string }) => {
		fields += 1;
		await l.selectOption(value);
	};
	const click = async (l: Locator) => {
		clicks += 1;
		await l.click();
	};

	await page.setViewportSize({ width: 1366, height: 900 });
	await signIn(page, demo('researcher'));
	const started = Date.now();
	await page.goto('/lasers/new');
	await choose(page.getByLabel('Lab', { exact: true }), { label: 'SPX — Raman and Fluorescence Spectroscopy' });
	await fill(page.getByLabel('Maker'), 'Tally Optics');
	await fill(page.getByLabel('Model'), `Measure ${Date.now()}`);
	await choose(page.getByLabel('Laser class'), '4');
	await fill(page.getByLabel('Wavelength', { exact: true }), '532 nm');
	await fill(page.getByLabel('Power'), '1 W');
	await fill(page.getByLabel('Beam diameter at the aperture'), '1.5 mm');
	await fill(page.getByLabel('Full-angle divergence'), '0.8 mrad');
	await click(page.getByRole('button', { name: 'Register the laser' }));
	await click(page.getByRole('link', { name: 'New beam path' }));
	await expect(page).toHaveURL(/\/paths\/new$/);
	await fill(page.getByLabel('Path name'), 'Six elements to the sample');

	// Element 1 is the starting free space (1 m); five more.
	const add = async (kind: string, n: number, label: string, value: string) => {
		await choose(page.getByLabel('New element'), kind);
		await click(page.getByRole('button', { name: 'Add element' }));
		await fill(page.getByRole('group', { name: new RegExp(`^Element ${n}:`) }).getByLabel(label, { exact: true }), value);
	};
	await add('transmission', 2, 'Transmission (0–1)', '0.5');
	await add('propagate', 3, 'Length', '0.5 m');
	await add('mirror', 4, 'Reflectance (0–1)', '0.99');
	await add('propagate', 5, 'Length', '0.8 m');
	await add('lens', 6, 'Focal length', '200 mm');

	// Point 1 ("End of the path") is moved to the end only if the editor has not done it already.
	const end = page.getByRole('group', { name: /^Point 1:/ }).getByLabel('Distance along the path');
	if ((await end.inputValue()).replace(/\s/g, '') !== '2.3m') await fill(end, '2.3 m');
	for (const [n, name, at] of [
		[2, 'Bench edge', '1.2 m'],
		[3, 'Before the mirror', '1.5 m']
	] as const) {
		await click(page.getByRole('button', { name: 'Add a point' }));
		const point = page.getByRole('group', { name: new RegExp(`^Point ${n}:`) });
		await fill(point.getByLabel('Name'), name);
		await fill(point.getByLabel('Distance along the path'), at);
	}
	await expect(page.getByTestId('overall-verdict').first()).toBeVisible();
	await click(page.getByRole('button', { name: 'Save the path' }));
	await expect(page.getByTestId('saved-notice')).toBeVisible();
	const seconds = (Date.now() - started) / 1000;

	const heights: Record<string, number> = {};
	for (const [name, width, height] of [
		['laptop 1366×900', 1366, 900],
		['phone 390×844', 390, 844]
	] as const) {
		await page.setViewportSize({ width, height });
		await page.reload();
		await expect(page.getByTestId('preview-status')).toContainText('Up to date');
		heights[name] = await page.evaluate(() => document.documentElement.scrollHeight);
	}
	const figures = { fields, clicks, seconds: Math.round(seconds * 10) / 10, pageHeight: heights };
	mkdirSync('test-results', { recursive: true });
	writeFileSync(`test-results/editor-figures-${process.env.FIGURES_TAG ?? 'run'}.json`, JSON.stringify(figures, null, 2));
	console.log('editor figures', JSON.stringify(figures));
	expect(fields).toBeGreaterThan(0);
});
