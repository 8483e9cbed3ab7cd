import { expect, test } from '@playwright/test';
import { roleLabels, roles } from '../../src/lib/roles';
import { demo, expectAccessible, signIn } from './helpers';

test('the sign-in page is accessible and refuses a wrong password without saying whether the account exists', async ({ page }) => {
	await page.goto('/signin');
	await expectAccessible(page);
	await page.getByLabel('E-mail address').fill(demo('officer').email);
	await page.getByLabel('Password').fill('definitely not it');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('alert')).toHaveText('That e-mail and password do not match an active account.');
	await page.getByLabel('E-mail address').fill('no-such-person@northgate.example');
	await page.getByLabel('Password').fill('definitely not it');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('alert')).toHaveText('That e-mail and password do not match an active account.');
});

test('signed out, a page sends you to sign in and back afterwards', async ({ page }) => {
	await page.goto('/limits');
	await expect(page).toHaveURL(/\/signin\?next=%2Flimits$/);
	await page.getByLabel('E-mail address').fill(demo('researcher').email);
	await page.getByLabel('Password').fill(demo('researcher').password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/limits$/);
});

for (const role of roles) {
	test(`a ${role} signs in, sees the sections of the role, and every page is accessible`, async ({ page }) => {
		await signIn(page, demo(role));
		await expect(page.getByText(roleLabels[role], { exact: false }).first()).toBeVisible();
		// the shell fetched /api/me from the browser
		await expect(page.getByText(/Session ends by/)).toBeVisible();
		const nav = page.getByRole('navigation', { name: 'Sections' });
		await expect(nav.getByRole('link', { name: 'People and labs' })).toHaveCount(role === 'admin' ? 1 : 0);
		await expectAccessible(page);
		for (const name of ['Register', 'Review desk', 'Inspection rota', 'Eyewear store', 'Training', 'Procedures', 'Authorisations', 'Limit library']) {
			await nav.getByRole('link', { name }).click();
			await expect(page.getByRole('heading', { level: 1, name: name === 'Register' ? 'Register' : name })).toBeVisible();
			await expectAccessible(page);
		}
	});
}

test('a researcher is refused the admin screen with a page that says what is missing', async ({ page }) => {
	await signIn(page, demo('researcher'));
	const res = await page.goto('/admin/users');
	expect(res?.status()).toBe(403);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('This needs the administrator role. You are signed in as researcher.');
});

test('an admin adds a person: each bad field is named, nothing is saved until all are right', async ({ page }) => {
	await signIn(page, demo('admin'));
	await page.goto('/admin/users/new');
	await expectAccessible(page);
	await page.getByLabel('Full name').fill('Ada Quill');
	await page.getByLabel('E-mail address').fill('not-an-address');
	await page.getByLabel('First password').fill('short');
	await page.getByRole('button', { name: 'Create the account' }).click();
	await expect(page.getByText('Enter an e-mail address like name@example.org.')).toBeVisible();
	await expect(page.getByText('Use at least 12 characters.')).toBeVisible();
	await page.getByLabel('E-mail address').fill('ada.quill@northgate.example');
	await page.getByLabel('First password').fill('qwerty123456');
	await page.getByRole('button', { name: 'Create the account' }).click();
	await expect(page.getByText('This password is on a list of common passwords; choose another.')).toBeVisible();
	await page.getByLabel('Role').selectOption('officer');
	await page.getByLabel('UFL — Ultrafast Optics Laboratory').check();
	await page.getByLabel('First password').fill('tidal lantern over the quarry');
	await page.getByRole('button', { name: 'Create the account' }).click();
	await expect(page).toHaveURL(/\/admin\/users\?created=[\w-]+$/);
	await expect(page.getByRole('status')).toContainText('Account created for Ada Quill (ada.quill@northgate.example).');
	const row = page.getByRole('row', { name: /Ada Quill/ });
	await expect(row).toContainText('Laser safety officer');
	await expect(row).toContainText('UFL');
	await expectAccessible(page);
});

test('sign-out ends the session on the server', async ({ page, context }) => {
	await signIn(page, demo('manager'));
	const cookie = (await context.cookies()).find((c) => c.name === 'bw_session')!;
	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/signin$/);
	// replaying the old cookie does not bring the session back
	await context.addCookies([cookie]);
	const res = await page.request.get('/api/me');
	expect(res.status()).toBe(401);
});
