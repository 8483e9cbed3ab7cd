// Training records in a real browser: a researcher sees her own, with what expires soon; an officer
// records a renewal and withdraws a record entered in error; a manager reads without a form.
import { expect, test } from '@playwright/test';
import { addYears, format, subDays } from 'date-fns';
import { demoUsers } from '../../seed/demo';
import { demo, expectAccessible, signIn } from './helpers';

const priya = demoUsers.find((u) => u.email.startsWith('priya'))!;

test('a researcher sees only her own training, and on her overview what expires soon', async ({ page }) => {
	await signIn(page, priya);
	// The overview says what needs doing: her induction expires within 30 days.
	const mine = page.getByRole('region', { name: 'Your training' });
	await expect(mine.getByRole('listitem')).toHaveCount(1);
	await expect(mine.getByRole('listitem')).toContainText('Laser safety induction');
	await expect(mine.getByRole('listitem')).toContainText('expires soon');
	await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Training' }).click();
	const records = page.getByRole('region', { name: 'Your records' });
	await expect(records.getByRole('row')).toHaveCount(3); // header + her two records
	await expect(records.getByRole('row', { name: /Laser safety induction/ })).toContainText('expires soon');
	await expect(records.getByRole('row', { name: /Authorised user, Class 4/ })).toContainText('current');
	await expect(records).not.toContainText('Tomas Weir');
	await expect(page.getByTestId('count-expiring')).toHaveText('1');
	await expect(page.getByRole('button', { name: 'Record the training' })).toHaveCount(0);
	await expectAccessible(page);
});

test('an officer records a renewal, which replaces the expired record, and withdraws one entered in error', async ({ page }) => {
	await signIn(page, demo('officer'));
	await page.goto('/training');
	await expect(page.getByTestId('count-expired')).toHaveText('1'); // Tomas's induction
	const form = page.getByRole('region', { name: 'Record a training' });
	await form.getByLabel('Person').selectOption({ label: 'Tomas Weir' });
	await form.getByLabel('Training or authorisation').fill('Laser safety induction');
	await form.getByLabel('Expires on').fill(format(addYears(new Date(), 1), 'yyyy-MM-dd'));
	await form.getByRole('button', { name: 'Record the training' }).click();
	await expect(form.getByRole('status')).toHaveText('Recorded.');
	await expect(page.getByTestId('count-expired')).toHaveText('0');
	const tomas = page.getByRole('region', { name: 'Records' }).getByRole('row', { name: /Tomas Weir Laser safety induction/ });
	await expect(tomas).toHaveCount(2);
	await expect(tomas.filter({ hasText: 'renewed' })).toHaveCount(1);
	await expect(tomas.filter({ hasText: 'current' })).toHaveCount(1);

	// A completion date in the future is a field message, nothing saved.
	await form.getByLabel('Person').selectOption({ label: 'Priya Raman' });
	await form.getByLabel('Training or authorisation').fill('Tomorrow’s course');
	await form.getByLabel('Completed on').fill(format(addYears(new Date(), 1), 'yyyy-MM-dd'));
	await form.getByRole('button', { name: 'Record the training' }).click();
	await expect(form.getByText('A training cannot be completed in the future.')).toBeVisible();
	await expect(page.getByRole('row', { name: /Tomorrow’s course/ })).toHaveCount(0);

	const withdraw = page.getByRole('region', { name: 'Withdraw a record entered in error' });
	// The demo dates Ines's course 120 days before the day it was loaded (seed/demo.ts).
	await withdraw.getByLabel('Record').selectOption({ label: `Ines Varga: Laser safety officer course (${format(subDays(new Date(), 120), 'yyyy-MM-dd')})` });
	await withdraw.getByLabel('Why it is withdrawn').fill('Entered twice by mistake');
	await withdraw.getByRole('button', { name: 'Withdraw the record' }).click();
	await expect(withdraw.getByRole('status')).toContainText('Withdrawn');
	await expect(page.getByRole('row', { name: /Ines Varga Laser safety officer course/ })).toContainText('withdrawn');
	await expect(page.getByRole('row', { name: /Ines Varga Laser safety officer course/ })).toContainText('Entered twice by mistake');
	await expectAccessible(page);
});

test('a manager reads every record, without the forms', async ({ page }) => {
	await signIn(page, demo('manager'));
	await page.goto('/training');
	await expect(page.getByRole('region', { name: 'Records' })).toContainText('Helen Achter');
	await expect(page.getByRole('region', { name: 'Records' })).toContainText('Priya Raman');
	await expect(page.getByRole('region', { name: 'Record a training' })).toHaveCount(0);
});
