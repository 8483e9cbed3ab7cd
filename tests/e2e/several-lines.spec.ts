// A laser that emits two lines together (the demo's frequency-doubled Nd:YAG: 532 nm with residual
// 1064 nm): its lines are grouped on its page, a new path carries both, the assessment sums them and
// gives the OD at each wavelength, the editor shows each line's power after every element, and a
// clearance whose eyewear covers only the green line is refused, naming the 1064 nm line.
import { expect, test } from '@playwright/test';
import { demoUsers } from '../../seed/demo';
import { demo, expectAccessible, signIn } from './helpers';

const tomas = demoUsers.find((u) => u.email.startsWith('tomas'))!;

test('two lines emitted together are summed, get an OD each, and one-line eyewear is refused at clearance', async ({ page, browser }) => {
	test.setTimeout(150_000);
	const name = `Both lines to the bench ${Date.now()}`;
	await signIn(page, tomas);
	await page.goto('/lasers?q=QS-300');
	await page.getByRole('link', { name: /QS-300 SHG/ }).click();
	const group = page.getByTestId('line-group').filter({ hasText: 'Emitted together: SHG head output' });
	await expect(group).toContainText('532 nm second harmonic');
	await expect(group).toContainText('1064 nm residual fundamental');
	await expectAccessible(page);

	await page.getByRole('link', { name: 'New beam path' }).click();
	await expect(page.getByLabel(/532 nm second harmonic/)).toBeChecked();
	await expect(page.getByLabel(/1064 nm residual fundamental/)).toBeChecked();
	await page.getByLabel('Path name').fill(name);
	await page.getByLabel('New element').selectOption('mirror');
	await page.getByRole('button', { name: 'Add element' }).click();
	await page.getByRole('group', { name: /^Element 2:/ }).getByLabel('Reflectance (0–1)').fill('0.9');

	const panel = page.getByRole('region', { name: 'Live assessment' });
	await expect(page.getByTestId('preview-status')).toContainText('Up to date');
	// Each line's power after every element, as the engine walks it.
	await expect(page.getByTestId('element-1-power')).toContainText('532 nm');
	await expect(page.getByTestId('element-1-power')).toContainText('1064 nm');
	// The sum of the two retinal lines, each line's own ratio, and the OD at each wavelength.
	const sum = panel.getByTestId('point-sum').first();
	await expect(sum).toContainText('Summed (retina (400–1400 nm))');
	await expect(sum).toContainText('532 nm second harmonic');
	await expect(sum).toContainText('1064 nm residual fundamental');
	await expect(panel.getByTestId('line-ratio').first()).toBeVisible();
	const ods = panel.getByTestId('od-line');
	await expect(ods).toHaveCount(2);
	await expect(ods.nth(0)).toContainText('532 nm');
	await expect(ods.nth(1)).toContainText('1064 nm');
	await expect(ods.nth(0)).toContainText(/OD \d/);
	await expect(panel.getByTestId('exposure-plot')).toContainText('for each line and summed');
	await expectAccessible(page);
	await page.getByRole('button', { name: 'Save the path' }).click();
	await expect(page).toHaveURL(/saved=/);

	// The officer clears it with eyewear for the green line only: refused, naming the other line.
	const officer = await (await browser.newContext()).newPage();
	await signIn(officer, demo('officer'));
	await officer.goto('/reviews?state=all');
	await officer.getByRole('link', { name }).click();
	await expect(officer.getByTestId('od-per-line')).toContainText('1064 nm');
	const decision = officer.getByRole('region', { name: 'Your decision' });
	const controls = decision.getByRole('group', { name: /^Control \d: Protective eyewear/ });
	await expect(controls).toHaveCount(2);
	await expect(decision.getByRole('group', { name: /^Control 1:/ }).getByLabel('At wavelength')).toHaveValue(/532/);
	await expect(decision.getByRole('group', { name: /^Control 2:/ }).getByLabel('At wavelength')).toHaveValue(/1064/);
	await decision.getByRole('button', { name: 'Remove control 2' }).click();
	await expect(decision.getByRole('group', { name: /^Control \d: Protective eyewear/ })).toHaveCount(1);
	await decision.getByRole('button', { name: 'Record the decision' }).click();
	await expect(decision).toContainText(/1064 nm line needs at least OD \d+/);
	await expect(decision).toContainText('no eyewear control covers it');
	await expect(officer.getByRole('status').filter({ hasText: 'Decision recorded' })).toHaveCount(0);
	await expectAccessible(officer);
	await officer.context().close();
});
