// A line is checked by the assessment's own rules when it is saved, not later on a path page; a
// line stored with values the rules refuse (from before the rules, or an import) is said so in the
// register and on its laser, never left silent.
import { expect, test } from '@playwright/test';
import postgres from 'postgres';
import { demo, expectAccessible, signIn } from './helpers';

test('the laser form refuses impossible line values, naming each field, and saves nothing', async ({ page }) => {
	await signIn(page, demo('researcher'));
	await page.goto('/lasers/new');
	await page.getByLabel('Lab', { exact: true }).selectOption({ label: 'SPX — Raman and Fluorescence Spectroscopy' });
	await page.getByLabel('Maker').fill('Impossible Optics');
	await page.getByLabel('Model').fill('Nowhere 1');
	await page.getByLabel('Laser class').selectOption('4');
	const field = (label: string) => page.getByLabel(label, { exact: true });
	for (const [wavelength, power, diameter] of [
		['532 nm', '-2 W', '1 mm'],
		['532 nm', '0 W', '0 mm'],
		['5 nm', '1 W', '1 mm'],
		['1e9 nm', '1 W', '1 mm']
	]) {
		await field('Wavelength').fill(wavelength);
		await page.getByLabel('Power').fill(power);
		await page.getByLabel('Beam diameter at the aperture').fill(diameter);
		await page.getByLabel('Full-angle divergence').fill('1 mrad');
		await page.getByRole('button', { name: 'Register the laser' }).click();
		await expect(page).toHaveURL(/\/lasers\/new/);
		await expect(page.locator('.field-error').first()).toBeVisible();
		// What was typed stays in the form.
		await expect(field('Wavelength')).toHaveValue(wavelength);
		await expect(page.getByLabel('Power')).toHaveValue(power);
	}
	await expectAccessible(page);
	await page.goto('/lasers?q=Nowhere');
	await expect(page.getByRole('link', { name: /Impossible Optics Nowhere 1/ })).toHaveCount(0);
});

test('a stored line the rules refuse is named in the register and on its laser', async ({ page }) => {
	const sql = postgres(`postgres://beamwarden_app@127.0.0.1:${process.env.BEAMWARDEN_PGPORT ?? '54329'}/beamwarden_e2e`, { max: 1 });
	const serial = `legacy-${Date.now()}`;
	try {
		const [lab] = await sql`SELECT id FROM lab WHERE code = 'SPX'`;
		const [laser] = await sql`INSERT INTO laser (lab_id, maker, model, serial, laser_class) VALUES (${lab.id}, 'Legacy Optics', 'Old Entry', ${serial}, '3B') RETURNING id`;
		// As saved before the line rules: a negative power.
		await sql`INSERT INTO emission_line (laser_id, label, mode, wavelength, power, beam_diameter, beam_diameter_definition, divergence, divergence_definition) VALUES (${laser.id}, 'old line', 'continuous', 5.32e-7, -2, 0.001, '1/e2', 0.001, '1/e2')`;
	} finally {
		await sql.end();
	}
	await signIn(page, demo('researcher'));
	await page.goto('/lasers?q=Old Entry');
	const row = page.getByRole('row', { name: /Legacy Optics Old Entry/ });
	await expect(row).toContainText('1 line cannot be assessed');
	await row.getByRole('link', { name: /Legacy Optics Old Entry/ }).click();
	await expect(page.getByTestId('line-objection')).toContainText('cannot be assessed');
	await expect(page.getByTestId('line-objection')).toContainText(/power/i);
	await expectAccessible(page);
});
