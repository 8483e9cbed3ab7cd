// Flow 2 in a real browser: the officer reads the working of a flagged path, clears it with
// eyewear and an enclosure, sees the eyewear adequacy; the researcher changes the path and it is
// back on the review desk as a stale clearance, with the diff of what changed.
import { expect, test } from '@playwright/test';
import { demoUsers } from '../../seed/demo';
import { demo, expectAccessible, signIn } from './helpers';

const tomas = demoUsers.find((u) => u.email.startsWith('tomas'))!;

test('an officer clears a flagged path with controls; a later change puts it back on the desk with the diff', async ({ page, browser }) => {
	await signIn(page, demo('officer'));
	await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Review desk' }).click();
	await expectAccessible(page);
	const row = page.getByRole('row', { name: /Feed to target chamber B/ });
	await expect(row).toContainText('awaiting review');
	await row.getByRole('link', { name: 'Feed to target chamber B' }).click();

	// The working is there to read, with the limits and their citations.
	await expect(page.getByRole('heading', { level: 1, name: 'Feed to target chamber B' })).toBeVisible();
	await expect(page.getByText(/1050–1400 nm/).first()).toBeVisible();
	await page.getByText('Show the working for the beam and the NOHD').click();
	await expect(page.getByText('E_ph = h·c / λ').first()).toBeVisible();
	await page.getByText('Show the working for “Open stretch beside the expander”').click();
	await expect(page.getByText('H_beam = Q / (π·D²/4)').first()).toBeVisible();
	await expectAccessible(page);

	// The eyewear the assessment asks for starts filled in (OD 7 at 1064 nm). Eyewear that does not
	// protect is refused with the numbers side by side, and nothing is recorded.
	const decision = page.getByRole('region', { name: 'Your decision' });
	const control1 = decision.getByRole('group', { name: /^Control 1:/ });
	await expect(control1.getByLabel('Minimum optical density')).toHaveValue('7');
	await control1.getByLabel('Minimum optical density').fill('5');
	await decision.getByRole('button', { name: 'Record the decision' }).click();
	await expect(control1.getByText(/The 1064 nm line needs at least OD 7 \(assessed 6\.\d\d, rounded up\); this control gives OD 5 at 1064 nm\./)).toBeVisible();
	await expect(page.getByRole('status').filter({ hasText: 'Decision recorded' })).toHaveCount(0);
	await control1.getByLabel('At wavelength').fill('5 nm');
	await decision.getByRole('button', { name: 'Record the decision' }).click();
	await expect(control1.getByText(/OD 5 at 5 nm concerns no line of this path \(it carries 1064 nm\)/)).toBeVisible();
	await expect(decision.getByText(/The 1064 nm line needs at least OD 7 .*no eyewear control covers it/)).toBeVisible();

	// Clear with eyewear of at least OD 7 at 1064 nm and an enclosure.
	await control1.getByLabel('Minimum optical density').fill('7');
	await control1.getByLabel('At wavelength').fill('1064 nm');
	await decision.getByRole('button', { name: 'Add a control' }).click();
	const control2 = decision.getByRole('group', { name: /^Control 2:/ });
	await control2.getByLabel('Kind').selectOption('enclosure');
	await control2.getByLabel('What is required').fill('Tube over the open stretch beside the expander');
	await decision.getByRole('button', { name: 'Record the decision' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Decision recorded' })).toBeVisible();
	await expect(page.getByText('cleared with controls').first()).toBeVisible();
	await expect(page.getByText(/at least OD 7 at 1064 nm/)).toBeVisible();
	await expect(page.getByTestId('eyewear-check')).toContainText('HEL-G1 (kept at: hook by the inner door) covers every line.');

	await page.goto('/eyewear');
	await expect(page.getByRole('row', { name: /Feed to target chamber B/ })).toContainText('adequate');
	await expectAccessible(page);

	// The researcher changes the path: the clearance is stale and the path is back in the queue.
	const researcher = await browser.newPage();
	await signIn(researcher, tomas);
	await researcher.goto('/lasers?q=QS-850');
	await researcher.getByRole('link', { name: /QS-850/ }).click();
	await researcher.getByRole('link', { name: 'Feed to target chamber B' }).click();
	await researcher.getByRole('group', { name: /^Element 1:/ }).getByLabel('Magnification').fill('3');
	await researcher.getByRole('button', { name: 'Save the path' }).click();
	await expect(researcher).toHaveURL(/saved=/);
	await researcher.close();

	await page.goto('/reviews');
	const back = page.getByRole('row', { name: /Feed to target chamber B/ });
	await expect(back).toContainText('changed since clearance');
	await back.getByRole('link', { name: 'Feed to target chamber B' }).click();
	const changes = page.getByRole('region', { name: 'Changed since the last clearance' });
	await expect(changes.getByRole('heading', { name: 'Changed since the last clearance' })).toBeVisible();
	await expect(changes.getByRole('row', { name: /Magnification/ })).toContainText('3');
});

test('an officer cannot clear a path they last changed', async ({ page }) => {
	await signIn(page, demo('officer'));
	await page.goto('/lasers?q=Aurora');
	await page.getByRole('link', { name: /Aurora 1K/ }).click();
	await page.getByRole('link', { name: 'Compressor to the pump–probe table' }).click();
	await page.getByLabel('Purpose (optional)').fill('Pump arm, checked by the LSO');
	await page.getByRole('button', { name: 'Save the path' }).click();
	await expect(page).toHaveURL(/saved=/);
	await page.goto('/reviews');
	await page.getByRole('link', { name: 'Compressor to the pump–probe table' }).click();
	await expect(page.getByText('You made the latest change to this beam path: another officer must review it.')).toBeVisible();
	await expect(page.getByRole('button', { name: 'Record the decision' })).toHaveCount(0);
});
