// Flow 1 in a real browser: a researcher registers a laser and a beam path with a splitter and a
// lens, watches the live assessment and the plot change while typing, saves, and finds the path
// flagged; an officer revises a limit and sees the dependent assessments go stale, then re-evaluated.
import { expect, test, type Page } from '@playwright/test';
import { demo, expectAccessible, signIn } from './helpers';

async function plotRevision(page: Page): Promise<number> {
	return Number((await page.locator('[data-revision]').first().getAttribute('data-revision')) ?? '0');
}

test('a researcher registers a laser and a beam path, sees it assessed live, and saves it flagged', async ({ page }) => {
	await signIn(page, demo('researcher'));
	await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Register' }).click();
	await expect(page.getByRole('link', { name: /Verdant Photonics Solace 5G/ })).toBeVisible();
	await expectAccessible(page);
	await page.getByRole('link', { name: 'Register a laser' }).click();
	await expect(page).toHaveURL(/\/lasers\/new$/);
	await page.getByLabel('Lab', { exact: true }).selectOption({ label: 'SPX — Raman and Fluorescence Spectroscopy' });
	await page.getByLabel('Maker').fill('Helio Instruments');
	await page.getByLabel('Model').fill('Green 2000');
	await page.getByLabel('Laser class').selectOption('4');
	await page.getByLabel('Wavelength', { exact: true }).fill('532 nm');
	await page.getByLabel('Power').fill('2000 mW');
	await expect(page.getByText('reads as 2 W')).toBeVisible();
	await page.getByLabel('Beam diameter at the aperture').fill('1.5 mm');
	await page.getByLabel('Full-angle divergence').fill('0.8 mrad');
	await expectAccessible(page);
	await page.getByRole('button', { name: 'Register the laser' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Helio Instruments Green 2000' })).toBeVisible();

	await page.getByRole('link', { name: 'New beam path' }).click();
	await expect(page).toHaveURL(/\/paths\/new$/);
	await page.getByLabel('Path name').fill('Pump line to the OPO');
	// The starting path: 1 m of free space and a viewer at its end. Add a splitter and a lens.
	await page.getByLabel('New element').selectOption('transmission');
	await page.getByRole('button', { name: 'Add element' }).click();
	const splitter = page.getByRole('group', { name: /^Element 2:/ });
	await splitter.getByLabel('Transmission (0–1)').fill('0.5');
	await page.getByLabel('New element').selectOption('propagate');
	await page.getByRole('button', { name: 'Add element' }).click();
	await page.getByRole('group', { name: /^Element 3:/ }).getByLabel('Length').fill('0.5 m');
	await page.getByLabel('New element').selectOption('lens');
	await page.getByRole('button', { name: 'Add element' }).click();
	await page.getByRole('group', { name: /^Element 4:/ }).getByLabel('Focal length').fill('100 mm');
	await page.getByLabel('New element').selectOption('propagate');
	await page.getByRole('button', { name: 'Add element' }).click();
	await page.getByRole('group', { name: /^Element 5:/ }).getByLabel('Length').fill('1 m');

	const panel = page.getByRole('region', { name: 'Live assessment' });
	await expect(panel.getByTestId('overall-verdict')).toContainText('exceeds limit');
	const before = await plotRevision(page);
	const viewer = page.getByRole('group', { name: /^Point 1:/ });
	await viewer.getByLabel('Distance along the path').fill('2.4 m');
	await expect.poll(() => plotRevision(page)).toBeGreaterThan(before);
	await expect(panel).toContainText('2.4 m');
	await expectAccessible(page);

	await page.getByRole('button', { name: 'Save the path' }).click();
	await expect(page).toHaveURL(/\/paths\/[0-9a-f-]+\?saved=/);
	await expect(page.getByText(/flagged for the laser safety officer/)).toBeVisible();
	await page.goto('/lasers');
	await expect(page.getByRole('row', { name: /Helio Instruments Green 2000/ })).toContainText('1 flagged');
});

test('an officer revises a limit; the dependent assessments go stale and are re-evaluated', async ({ page }) => {
	await signIn(page, demo('officer'));
	await page.goto('/limits');
	await expect(page.getByText(/Demonstration values/)).toBeVisible();
	await expectAccessible(page);
	await page.getByRole('link', { name: 'Eye, 400–1050 nm, 5 µs – 10 s' }).click();
	await page.getByLabel('Coefficient k').fill('17 J/m²');
	await page.getByRole('button', { name: /Save as version 2/ }).click();
	await expect(page).toHaveURL(/revised=2/);
	const status = page.getByRole('status');
	await expect(status).toContainText(/[1-9]\d* beam paths? marked stale/);
	// The job queue re-evaluates them in the background: reload until none is left.
	await expect(async () => {
		await page.reload();
		await expect(page.getByTestId('stale-count')).toHaveText('All stale beam paths have been re-evaluated.');
	}).toPass({ timeout: 30_000 });
	await page.goto('/lasers?q=Solace');
	await page.getByRole('link', { name: /Solace 5G/ }).click();
	await page.getByRole('link', { name: 'Raman excitation, table 2' }).click();
	await expect(page.getByText(/re-evaluated after a limit changed/).first()).toBeVisible();
	await expectAccessible(page);
});
