// The inspection and reminder flows as an officer, a manager and an admin use them: nothing typed is
// lost on an upload, a checklist starts unanswered and cannot be completed half answered, findings are
// closed with who, when and what was done, the daily reminder run is shown, and the small things a
// person trips over (confirmations, named note boxes, the chart's current month, huge pastes).
import { expect, test, type Page } from '@playwright/test';
import { format, subDays } from 'date-fns';
import { demoUsers } from '../../seed/demo';
import { png } from '../../seed/png';
import { demo, expectAccessible, signIn } from './helpers';

const AREA = 'Processing bay K0.11'; // due in months: recording it moves no other test's counts
const today = () => format(new Date(), 'yyyy-MM-dd');

async function openInspection(page: Page) {
	await page.goto('/inspections');
	await page.getByRole('region', { name: 'Scheduled later' }).getByRole('link', { name: AREA }).click();
	await expect(page.getByRole('heading', { level: 1, name: `Inspection of ${AREA}` })).toBeVisible();
}

test('uploading a photo or a refused file keeps the checklist answers being typed', async ({ page }) => {
	await signIn(page, demo('officer'));
	await openInspection(page);
	const item = page.getByRole('group', { name: /^2\. Entry interlocks/ });
	await item.getByLabel('fail').check();
	await page.getByLabel(/What failed/).fill('Rear door switch sticks');
	await page.getByRole('button', { name: 'Add a finding' }).click();
	await page.getByLabel('What was found').fill('Door switch worn');

	await page.getByLabel(/Add photos or a PDF/).setInputFiles({ name: 'switch.png', mimeType: 'image/png', buffer: png(32, 24, (x) => x * 6) });
	await page.getByRole('button', { name: 'Upload' }).click();
	await expect(page.getByText('1 file added.')).toBeVisible();
	await expect(page.getByRole('img', { name: 'Inspection photo switch.png' })).toBeVisible();
	await expect(item.getByLabel('fail')).toBeChecked();
	await expect(page.getByLabel(/What failed/)).toHaveValue('Rear door switch sticks');
	await expect(page.getByLabel('What was found')).toHaveValue('Door switch worn');

	await page.getByLabel(/Add photos or a PDF/).setInputFiles({ name: 'fake.png', mimeType: 'image/png', buffer: Buffer.from('not an image at all') });
	await page.getByRole('button', { name: 'Upload' }).click();
	await expect(page.getByRole('alert')).toContainText('is not a PNG, JPEG, WebP or PDF file');
	await expect(item.getByLabel('fail')).toBeChecked();
	await expect(page.getByLabel(/What failed/)).toHaveValue('Rear door switch sticks');
	await expect(page.getByLabel('What was found')).toHaveValue('Door switch worn');
});

test('an incident photo upload keeps the investigation being typed', async ({ page }) => {
	await signIn(page, demo('officer'));
	await page.goto('/incidents');
	await page.getByRole('link', { name: /Eyewear for 1064 nm was found/ }).first().click(); // not investigated yet
	const causes = page.getByRole('textbox', { name: 'Causes' });
	await causes.fill('Clamp screw worked loose; not yet known why.');
	await page.getByLabel(/Add photos/).setInputFiles({ name: 'block.png', mimeType: 'image/png', buffer: png(24, 24, (x) => x * 9) });
	await page.getByRole('button', { name: 'Upload' }).click();
	await expect(page.getByRole('img', { name: /block\.png/ })).toBeVisible();
	await expect(causes).toHaveValue('Clamp screw worked loose; not yet known why.');
});

test('a procedure draft keeps its unsaved text when a PDF upload is refused', async ({ page }) => {
	await signIn(page, demoUsers.find((u) => u.email.startsWith('priya'))!);
	await page.goto('/procedures');
	await page.getByRole('link', { name: 'Aurora compressor alignment' }).click(); // has a draft
	await page.waitForURL(/\/procedures\/[0-9a-f-]{36}$/);
	const body = page.getByLabel(/Text of version/);
	await body.fill('Step 1: switch the laser off at the key.\nStep 2: unsaved words that must survive.');
	const upload = page.locator('form[action="?/attach"]');
	await upload.getByLabel('Attach a PDF').setInputFiles({ name: 'not.pdf', mimeType: 'application/pdf', buffer: Buffer.from('plain text, not a PDF') });
	await upload.getByRole('button', { name: 'Upload' }).click();
	await expect(page.getByText('“not.pdf” is not a PNG, JPEG, WebP or PDF file.')).toBeVisible();
	await expect(body).toHaveValue(/unsaved words that must survive/);
});

test('a checklist starts unanswered, cannot be completed half answered, and failed items stand out', async ({ page }) => {
	await signIn(page, demo('officer'));
	await openInspection(page);
	// Every item starts unanswered, each note box is named by its item.
	const groups = page.getByRole('group', { name: /^\d+\. / });
	const count = await groups.count();
	expect(count).toBeGreaterThan(5);
	for (let i = 0; i < count; i++) for (const o of ['pass', 'fail', 'not applicable']) await expect(groups.nth(i).getByLabel(o, { exact: true })).not.toBeChecked();
	await expect(page.getByLabel('Notes (optional)', { exact: true })).toHaveCount(1); // the inspection's own notes only
	await expect(page.getByLabel(/^Notes on 1\. Warning signs/)).toBeVisible();
	await expectAccessible(page);

	await page.getByLabel('Date of the inspection').fill(today());
	await groups.nth(0).getByLabel('pass', { exact: true }).check();
	await page.getByLabel(/^Notes on 1\. Warning signs/).fill('New sign at the side door');
	await page.getByRole('button', { name: 'Record the inspection as done' }).click();
	const summary = page.getByRole('alert').filter({ hasText: 'Answer every item' });
	await expect(summary).toContainText('2. Entry interlocks');
	await expect(summary).toContainText(`${count}. `);
	await expect(summary).not.toContainText('1. Warning signs');
	await expect(page.getByLabel(/^Notes on 1\. Warning signs/)).toHaveValue('New sign at the side door');

	for (let i = 1; i < count; i++) await groups.nth(i).getByLabel(i === 2 ? 'fail' : 'pass', { exact: true }).check();
	// The failed item is marked with a word and an icon, not colour alone.
	await expect(page.getByTestId('item-3')).toContainText('Failed');
	await expect(page.getByTestId('item-3').locator('svg')).not.toHaveCount(0);
	await page.getByLabel(/What failed/).fill('Two pairs of 1064 nm goggles scratched');
	await page.getByRole('button', { name: 'Add a finding' }).click();
	await page.getByLabel('What was found').fill('Scratched goggles in the bay');
	await page.getByLabel('Follow-up action').fill('Order two new pairs');
	await page.getByLabel('Follow-up due (optional)').fill(format(subDays(new Date(), 3), 'yyyy-MM-dd'));
	await page.getByRole('button', { name: 'Record the inspection as done' }).click();
	await expect(page.getByRole('status')).toContainText('The next inspection of this area is due on');

	const results = page.getByRole('region', { name: 'Checklist results' });
	const failed = results.getByRole('row', { name: /Protective eyewear/ });
	await expect(failed).toContainText('Failed');
	await expect(failed.locator('svg')).not.toHaveCount(0);
	await expect(results.getByRole('row', { name: /Warning signs/ })).toContainText('New sign at the side door');
	await expectAccessible(page);

	// The finding is closed with what was done; who and when are recorded.
	const finding = page.getByRole('listitem').filter({ hasText: 'Scratched goggles in the bay' });
	await expect(finding).toContainText('overdue');
	await finding.getByRole('button', { name: 'Close this finding' }).click();
	await expect(finding.getByText('Say what was done.')).toBeVisible();
	await finding.getByLabel(/What was done/).fill('Two new pairs OD 7 at 1064 nm in the cabinet');
	await finding.getByRole('button', { name: 'Close this finding' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Finding closed' })).toBeVisible();
	const closed = page.getByRole('listitem').filter({ hasText: 'Scratched goggles in the bay' });
	await expect(closed).toContainText(`Closed on ${today()} by Helen Achter`);
	await expect(closed).toContainText('Two new pairs OD 7 at 1064 nm in the cabinet');
	await page.goto('/inspections');
	await expect(page.getByRole('region', { name: 'Open findings' })).not.toContainText('Scratched goggles in the bay');
});

test('the admin sees when the daily reminder run last ran and when it runs next', async ({ page }) => {
	await signIn(page, demo('admin'));
	// A fresh server has never run it: it catches up at start-up.
	await expect(async () => {
		await page.goto('/admin/mail');
		await expect(page.getByTestId('daily-last')).toContainText(today(), { timeout: 1000 });
	}).toPass({ timeout: 60_000 });
	const run = page.getByRole('region', { name: 'Daily reminder run' });
	await expect(run.getByTestId('daily-next')).toContainText(/\d{4}-\d{2}-\d{2} 06:00 UTC/);
	await expectAccessible(page);
});

test('the current month of the chart counts overdue inspections as overdue, not due', async ({ page }) => {
	await signIn(page, demo('manager'));
	await page.goto('/inspections');
	const overdueNow = Number(await page.getByTestId('count-overdue').textContent());
	expect(overdueNow).toBeGreaterThan(0);
	const month = format(new Date(), 'yyyy-MM');
	const row = page.getByRole('table', { name: 'Inspections by month' }).getByRole('row', { name: new RegExp(`^${month}`) });
	await expect(row).toHaveCount(1);
	await expect(row.getByRole('cell').nth(1)).toHaveText(String(overdueNow));
	await expect(page.getByText(new RegExp(`overdue now: ${overdueNow}`))).toBeVisible();
});

test('assigning an inspector and creating a user are confirmed', async ({ page }) => {
	await signIn(page, demo('manager'));
	await page.goto('/inspections');
	const later = page.getByRole('region', { name: 'Scheduled later' });
	await later.getByLabel(`Inspector of ${AREA}`).selectOption({ label: 'Ines Varga' });
	await later.getByRole('row', { name: new RegExp(AREA) }).getByRole('button', { name: 'Assign' }).click();
	await expect(page.getByRole('status')).toContainText(`Ines Varga is now the inspector of ${AREA}.`);
	await expectAccessible(page);

	await page.getByRole('button', { name: /Sign out/ }).click();
	await signIn(page, demo('admin'));
	await page.goto('/admin/users/new');
	const email = `new-${Date.now()}@northgate.example`;
	await page.getByLabel('Full name').fill('Nadia Okafor');
	await page.getByLabel('E-mail address').fill(email);
	await page.getByLabel('First password').fill('a long first passphrase for nadia');
	await page.getByRole('button', { name: 'Create the account' }).click();
	await expect(page).toHaveURL(/\/admin\/users/);
	await expect(page.getByRole('status')).toContainText(`Account created for Nadia Okafor (${email}).`);
	await expectAccessible(page);
});

test('text boxes carry a maxlength and a 10 MB paste is refused at once', async ({ page }) => {
	await signIn(page, demo('officer'));
	await openInspection(page);
	const boxes = page.locator('form[action="?/record"] textarea, form[action="?/record"] input[type="text"]');
	expect(await boxes.count()).toBeGreaterThan(5);
	for (const box of await boxes.all()) await expect(box).toHaveAttribute('maxlength', /^\d+$/);

	// A 10 MB paste into the notes is cut to the limit in the browser, at once, and never sent whole
	// (a body that large is refused with 413 by the server as well: see hardening.spec.ts).
	const notes = page.getByLabel('Notes (optional)', { exact: true });
	await notes.fill('x'.repeat(10 * 1024 * 1024));
	expect((await notes.inputValue()).length).toBe(4000);
});
