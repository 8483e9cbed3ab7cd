// Flow 3 in a real browser: the manager sees what is overdue and due soon, with the chart and the
// export; an officer records an inspection with a photo, and the next due date moves.
import { expect, test } from '@playwright/test';
import { addMonths, format } from 'date-fns';
import { demoUsers } from '../../seed/demo';
import { png } from '../../seed/png';
import { demo, expectAccessible, signIn } from './helpers';

test('a researcher sees the inspections of the areas she answers for on her overview', async ({ page }) => {
	await signIn(page, demoUsers.find((u) => u.email.startsWith('priya'))!); // responsible for UFL and SPX areas
	const mine = page.getByRole('region', { name: 'Your inspections' });
	await expect(mine.getByRole('row', { name: /Ultrafast LCA M2.14/ })).toContainText('overdue');
	await expect(mine.getByRole('row', { name: /Ultrafast LCA M2.14/ })).toContainText('late');
	await expect(mine.getByRole('row', { name: /Spectroscopy LCA M1.07/ })).toContainText('due soon');
	await expect(mine.getByRole('row', { name: /Spectroscopy LCA M1.07/ })).toContainText('responsible');
	await expect(mine.getByRole('row', { name: /Pulse Hall/ })).toHaveCount(0);
	await expectAccessible(page);
});

test('the manager sees overdue and due-soon inspections, the chart and the export', async ({ page }) => {
	await signIn(page, demo('manager'));
	await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Inspection rota' }).click();
	await expect(page.getByTestId('count-overdue')).toHaveText('2');
	await expect(page.getByTestId('count-due-soon')).toHaveText('1');
	const overdue = page.getByRole('region', { name: 'Overdue' });
	await expect(overdue.getByRole('row', { name: /Ultrafast LCA M2.14/ })).toContainText('overdue');
	await expect(overdue.getByRole('row', { name: /Pulse Hall K0.02/ })).toContainText('late');
	await expect(page.getByRole('region', { name: 'Due within 30 days' }).getByRole('row', { name: /Spectroscopy LCA M1.07/ })).toContainText('due soon');
	await expect(page.getByRole('img', { name: 'Inspections due and overdue by month' }).or(page.locator('canvas[aria-label="Inspections due and overdue by month"]'))).toBeVisible();
	await expect(page.getByText(/Over the next 12 months \d+ inspections fall due/)).toBeVisible();
	await expectAccessible(page);

	// Reassign the overdue hall to the deputy LSO.
	await overdue.getByLabel('Inspector of Pulse Hall K0.02').selectOption({ label: 'Ines Varga' });
	const assigned = page.waitForResponse((r) => r.url().includes('/inspections?/assign') && r.request().method() === 'POST');
	await overdue.getByRole('row', { name: /Pulse Hall K0.02/ }).getByRole('button', { name: 'Assign' }).click();
	expect((await assigned).status()).toBe(200);
	await page.reload();
	await expect(page.getByRole('region', { name: 'By inspector' })).toContainText('Ines Varga');

	const download = page.waitForEvent('download');
	await page.getByRole('link', { name: 'Export the list (CSV)' }).click();
	const file = await download;
	const csv = await (await file.createReadStream())!.toArray();
	const text = Buffer.concat(csv).toString('utf8');
	expect(text.split('\r\n')[0]).toBe('"area","lab","state","due on","inspector","responsible","interval (months)"');
	expect(text).toContain('"Pulse Hall K0.02","HEL","overdue"');
});

test('an officer records an inspection with a photo, and the next due date moves', async ({ page }) => {
	await signIn(page, demo('officer'));
	await page.goto('/inspections');
	await page.getByRole('region', { name: 'Overdue' }).getByRole('link', { name: 'Ultrafast LCA M2.14' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Inspection of Ultrafast LCA M2.14' })).toBeVisible();
	await expectAccessible(page);

	await page.getByLabel(/Add photos or a PDF/).setInputFiles({ name: 'door sign.png', mimeType: 'image/png', buffer: png(64, 48, (x) => x * 4) });
	await page.getByRole('button', { name: 'Upload' }).click();
	await expect(page.getByText('1 file added.')).toBeVisible();
	await expect(page.getByRole('img', { name: 'Inspection photo door sign.png' })).toBeVisible();
	// A file that only claims to be an image is refused by its content.
	await page.getByLabel(/Add photos or a PDF/).setInputFiles({ name: 'fake.png', mimeType: 'image/png', buffer: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>') });
	await page.getByRole('button', { name: 'Upload' }).click();
	await expect(page.getByRole('alert')).toContainText('is not a PNG, JPEG, WebP or PDF file');

	const today = format(new Date(), 'yyyy-MM-dd');
	await page.getByLabel('Date of the inspection').fill(today);
	const item = page.getByRole('group', { name: /^2\. Entry interlocks/ });
	await item.getByLabel('fail').check();
	// Every other item answered too: a checklist starts unanswered and is recorded only when complete.
	const items = page.getByRole('group', { name: /^\d+\. / });
	for (let i = 0; i < (await items.count()); i++) if (i !== 1) await items.nth(i).getByLabel('pass', { exact: true }).check();
	await page.getByRole('button', { name: 'Record the inspection as done' }).click();
	await expect(page.getByText('Say what failed.')).toBeVisible();
	await page.getByLabel('What failed').fill('Rear door interlock does not drop the shutter');
	await page.getByRole('button', { name: 'Add a finding' }).click();
	await page.getByLabel('What was found').fill('Rear door interlock faulty');
	await page.getByLabel('Follow-up action').fill('Facilities to replace the switch');
	await page.getByRole('button', { name: 'Record the inspection as done' }).click();

	const next = format(addMonths(new Date(today), 6), 'yyyy-MM-dd'); // the area is inspected every 6 months
	await expect(page.getByRole('status')).toContainText(`The next inspection of this area is due on ${next}`);
	await page.goto('/inspections');
	await expect(page.getByTestId('count-overdue')).toHaveText('1');
	await expect(page.getByRole('region', { name: 'Scheduled later' }).getByRole('row', { name: /Ultrafast LCA M2.14/ })).toContainText(next);
	await expect(page.getByRole('region', { name: 'Open findings' })).toContainText('Rear door interlock faulty');
});
