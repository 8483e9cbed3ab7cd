// Mail in a real browser: a password reset goes out through the job queue to the local mail
// server; the admin reads it under Sent mail; the link sets a new password once.
import { expect, test } from '@playwright/test';
import { demo, expectAccessible, signIn, signedInClient } from './helpers';

test('a reset link is mailed, the admin reads the mail, and the link works once', async ({ page, browser }) => {
	const admin = await signedInClient(demo('admin'));
	const person = { email: `reset-${Date.now()}@northgate.example`, password: 'first passphrase of the test' };
	expect((await admin.post('/api/admin/users', { data: { name: 'Reset Tester', email: person.email, role: 'researcher', labIds: [], password: person.password } })).status()).toBe(201);

	await page.goto('/signin');
	await page.getByRole('link', { name: 'Forgot your password?' }).click();
	await expect(page.getByRole('heading', { name: 'Reset your password' })).toBeVisible();
	await page.getByLabel('E-mail address').fill(person.email);
	await page.getByRole('button', { name: 'Send me a link' }).click();
	await expect(page.getByRole('status')).toContainText('If an active account uses this address');
	await expectAccessible(page);

	// The admin finds the mail in the local mailbox once the queue has delivered it.
	const adminContext = await browser.newContext();
	const adminPage = await adminContext.newPage();
	await signIn(adminPage, demo('admin'));
	await expect(async () => {
		await adminPage.goto('/admin/mail');
		await expect(adminPage.getByRole('row', { name: new RegExp(person.email) }).first()).toBeVisible({ timeout: 1000 });
	}).toPass({ timeout: 60_000 });
	await expectAccessible(adminPage);
	await adminPage.getByRole('row', { name: new RegExp(person.email) }).first().getByRole('link').click();
	const body = await adminPage.locator('article pre').innerText();
	expect(body).toMatch(/because|why/i);
	const link = /https?:\/\/\S+\/reset-password\/[A-Za-z0-9_-]+/.exec(body)?.[0];
	expect(link, body).toBeTruthy();
	await adminContext.close();

	const path = new URL(link!).pathname;
	await page.goto(path);
	await page.getByLabel('New password').fill('short');
	await page.getByLabel('The same password again').fill('short');
	await page.getByRole('button', { name: 'Save the new password' }).click();
	await expect(page.getByText('Use at least 12 characters.')).toBeVisible();
	await page.getByLabel('New password').fill('a second passphrase after reset');
	await page.getByLabel('The same password again').fill('a second passphrase after reset');
	await page.getByRole('button', { name: 'Save the new password' }).click();
	await expect(page).toHaveURL(/\/signin\?reset=1/);
	await signIn(page, { email: person.email, password: 'a second passphrase after reset' });

	await page.goto(path);
	await expect(page.getByRole('heading', { name: 'This link no longer works' })).toBeVisible();
});

test('each person chooses immediate mails or a daily digest', async ({ page }) => {
	await signIn(page, demo('manager'));
	await page.getByRole('link', { name: 'Preferences' }).click();
	await page.getByLabel('One daily digest').check();
	await page.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved.');
	await page.reload();
	await expect(page.getByLabel('One daily digest')).toBeChecked();
	await expectAccessible(page);
});
