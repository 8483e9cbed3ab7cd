// The path editor as a person uses it: the whole path and the verdict on one laptop screen, the
// verdict pinned on a phone, the schematic picks rows, rows reorder by keyboard and by drag, a removed
// element comes back with Undo, "End of the path" follows the end, unsaved edits are not lost
// silently, a failed save takes the focus to its summary, and the transmission field takes 0.5, 1 %
// or OD 2. Messages name fields as the form does ("Point 2, Reflectance ρ (0–1)").
import { expect, test, type Page } from '@playwright/test';
import { demoUsers } from '../../seed/demo';
import { expectAccessible, signIn, signedInClient } from './helpers';

const priya = demoUsers.find((u) => u.email.startsWith('priya'))!;
const blank = { label: '', length: '', transmission: '', reflectance: '', magnification: '', focalLength: '', coreDiameter: '', numericalAperture: '', couplingTransmission: '', bands: [] };
const point = (key: string, label: string, position: string, more: Record<string, string> = {}) => ({
	key,
	label,
	kind: 'intrabeam',
	tissue: 'eye',
	position,
	exposureDuration: '0.25 s',
	reflectance: '',
	viewingAngle: '',
	viewingDistance: '',
	...more
});

/** A laser of the demo researcher's lab with one path, made through the API; returns the path id. */
async function pathOf(elements: Record<string, unknown>[], points: Record<string, unknown>[]): Promise<string> {
	const api = await signedInClient(priya);
	const me = await (await api.get('/api/me')).json();
	const labId = me.labs.find((l: { code: string }) => l.code === 'SPX').id;
	const line = { label: '', mode: 'continuous', wavelength: '532 nm', wavelengthMax: '', power: '1 W', pulseEnergy: '', pulseDuration: '', repetitionRate: '', beamDiameter: '1.5 mm', beamDiameterDefinition: '1/e2', divergence: '0.8 mrad', divergenceDefinition: '1/e2', beamQuality: '' };
	const created = await api.post('/api/lasers', { data: { labId, maker: 'Editor Test', model: `Bench ${Date.now()}`, serial: `ed-${Date.now()}`, laserClass: '4', status: 'active', notes: '', line } });
	expect(created.status()).toBe(201);
	const laserId = (await created.json()).id;
	const lineId = (await (await api.get(`/api/lasers/${laserId}`)).json()).lines[0].id;
	const body = { lineIds: [lineId], lineChoiceReason: '', name: 'Six elements to the sample', purpose: '', nohdExposureDuration: '0.25 s', elements: elements.map((e) => ({ ...blank, ...e })), points, version: 0 };
	const path = await api.post(`/api/lasers/${laserId}/paths`, { data: body });
	expect(path.status(), await path.text()).toBe(201);
	return (await path.json()).id as string;
}

const sixElements = [
	{ kind: 'propagate', length: '1 m' },
	{ kind: 'transmission', transmission: '0.5', label: 'pick-off window' },
	{ kind: 'propagate', length: '0.5 m' },
	{ kind: 'mirror', reflectance: '0.99', label: 'turning mirror M2' },
	{ kind: 'propagate', length: '0.8 m' },
	{ kind: 'lens', focalLength: '200 mm', label: 'sample lens' }
];
const threePoints = [point('a', 'End of the path', '2.3 m'), point('b', 'Bench edge, seated eye height', '1.2 m'), point('c', 'Before the turning mirror', '1.5 m')];

async function openEditor(page: Page, id: string) {
	await page.goto(`/paths/${id}`);
	await expect(page.getByTestId('preview-status')).toContainText('Up to date');
}

test('a 6-element, 3-point path and its verdict fit a 1366×900 screen; the schematic is readable and picks rows', async ({ page }) => {
	const id = await pathOf(sixElements, threePoints);
	await page.setViewportSize({ width: 1366, height: 900 });
	await signIn(page, priya);
	await openEditor(page, id);
	const editor = page.getByTestId('path-editor');
	await editor.evaluate((el) => el.scrollIntoView({ block: 'start' }));
	const box = (await editor.boundingBox())!;
	expect(box.height, 'the editor is no taller than the screen').toBeLessThanOrEqual(900);
	expect(box.y).toBeGreaterThanOrEqual(0);
	const verdict = (await page.getByRole('region', { name: 'Live assessment' }).getByTestId('overall-verdict').boundingBox())!;
	expect(verdict.y + verdict.height, 'the verdict is on screen beside the editor').toBeLessThanOrEqual(900);
	expect(verdict.x, 'beside, not below').toBeGreaterThan(box.x + box.width - 1);
	await page.screenshot({ path: 'test-results/editor-1366x900.png' });

	// Every label of the schematic is inside the drawing.
	const svg = page.getByTestId('path-editor').locator('svg[role="group"]');
	const frame = (await svg.boundingBox())!;
	for (const text of await svg.locator('text').all()) {
		if (!(await text.isVisible())) continue;
		const t = (await text.boundingBox())!;
		expect(t.x).toBeGreaterThanOrEqual(frame.x - 0.5);
		expect(t.x + t.width).toBeLessThanOrEqual(frame.x + frame.width + 0.5);
		expect(t.y + t.height).toBeLessThanOrEqual(frame.y + frame.height + 0.5);
	}
	await expect(svg.locator('text', { hasText: 'Bench edge, seated eye height' })).toBeVisible();
	const fontSize = await svg.locator('text').first().evaluate((t) => t.getBoundingClientRect().height);
	expect(fontSize, 'labels drawn at a readable size').toBeGreaterThanOrEqual(11);

	// Picking the lens on the schematic opens its row; picking a point opens the point.
	await page.getByTestId('schematic-element-5').click();
	await expect(page.getByRole('group', { name: /^Element 6:/ }).getByLabel('Label (optional)')).toHaveValue('sample lens');
	await expect(page.getByRole('group', { name: /^Element 6:/ }).getByLabel('Focal length')).toBeFocused();
	await page.getByTestId('schematic-point-1').press('Enter');
	await expect(page.getByRole('group', { name: /^Point 2:/ }).getByLabel('Name')).toHaveValue('Bench edge, seated eye height');
	await expectAccessible(page);
});

test('on a phone the verdict is pinned in view, at the top of the editor and halfway down', async ({ page }) => {
	const id = await pathOf(sixElements, threePoints);
	await page.setViewportSize({ width: 390, height: 844 });
	await signIn(page, priya);
	await openEditor(page, id);
	const pinned = page.getByTestId('pinned-verdict');
	const inView = async () => {
		const b = (await pinned.boundingBox())!;
		return b.y >= 0 && b.y + b.height <= 844;
	};
	await expect(pinned).toContainText('worst ratio');
	expect(await inView()).toBe(true);
	await page.getByRole('group', { name: /^Element 4:/ }).scrollIntoViewIfNeeded();
	expect(await inView()).toBe(true);
	await page.screenshot({ path: 'test-results/editor-390x844.png' });
	await expectAccessible(page);
});

test('rows reorder by keyboard and by drag; Remove has an Undo', async ({ page }) => {
	const id = await pathOf(sixElements, threePoints);
	await page.setViewportSize({ width: 1366, height: 900 });
	await signIn(page, priya);
	await openEditor(page, id);
	const kinds = () => page.getByTestId('element-row').evaluateAll((rows) => rows.map((r) => r.querySelector('legend')?.textContent?.trim()));
	await page.getByRole('button', { name: 'Move element 2 down' }).focus();
	await page.keyboard.press('Enter');
	expect((await kinds())[1]).toMatch(/^Element 2: Free space/);
	expect((await kinds())[2]).toMatch(/^Element 3: Window/);
	await expect(page.getByRole('button', { name: 'Move element 3 down' })).toBeFocused();

	await page.getByTestId('element-5-handle').dragTo(page.getByTestId('element-0-handle'));
	expect((await kinds())[0]).toMatch(/^Element 1: Focusing lens/);

	await page.getByRole('button', { name: 'Remove element 1' }).click();
	await expect(page.getByTestId('element-removed')).toContainText('Element 1 (focusing lens) removed.');
	await expect(page.getByRole('button', { name: 'Undo' })).toBeFocused();
	expect(await kinds()).toHaveLength(5);
	await page.getByRole('button', { name: 'Undo' }).click();
	expect(await kinds()).toHaveLength(6);
	expect((await kinds())[0]).toMatch(/^Element 1: Focusing lens/);
	await expect(page.getByRole('group', { name: /^Element 1:/ }).getByLabel('Focal length')).toHaveValue('200 mm');
	await expectAccessible(page);
});

test('"End of the path" follows the end until its distance is typed; the transmission takes 0.5, 1 % or OD 2', async ({ page }) => {
	await signIn(page, priya);
	await page.goto('/lasers?q=Solace');
	await page.getByRole('link', { name: /Solace 5G/ }).click();
	await page.getByRole('link', { name: 'New beam path' }).click();
	const end = page.getByRole('group', { name: /^Point 1:/ }).getByLabel('Distance along the path');
	await expect(end).toHaveValue('1 m');
	await page.getByRole('group', { name: /^Element 1:/ }).getByLabel('Length').fill('0.4 m');
	await expect(end).toHaveValue('0.4 m');
	await page.getByLabel('New element').selectOption('transmission');
	await page.getByRole('button', { name: 'Add element' }).click();
	const filter = page.getByRole('group', { name: /^Element 2:/ }).getByLabel('Transmission (0–1)');
	await expect(filter).toHaveAttribute('placeholder', '0.5, 1 % or OD 2');
	await expect(page.getByRole('group', { name: /^Element 2:/ })).toContainText('a percentage (1 %) or an optical density (OD 2)');
	await page.getByLabel('New element').selectOption('propagate');
	await page.getByRole('button', { name: 'Add element' }).click();
	await page.getByRole('group', { name: /^Element 3:/ }).getByLabel('Length').fill('1.6 m');
	await expect(end).toHaveValue('2 m');

	const power = page.getByTestId('element-1-power');
	for (const [typed, after] of [
		['0.5', '2.5 W'],
		['1 %', '50 mW'],
		['OD 2', '50 mW']
	]) {
		await filter.fill(typed);
		await expect(power).toContainText(after);
	}
	// Typed by hand, the distance stays where it was put.
	await end.fill('1.5 m');
	await page.getByRole('group', { name: /^Element 3:/ }).getByLabel('Length').fill('3 m');
	await expect(page.getByTestId('element-2-power')).toBeVisible();
	await expect(end).toHaveValue('1.5 m');
	await expectAccessible(page);
});

test('unsaved edits ask before leaving; a failed save takes the focus to its summary; messages use the form’s words', async ({ page }) => {
	const id = await pathOf([{ kind: 'propagate', length: '2 m' }], [point('a', 'End of the path', '2 m'), point('b', 'Reflection off the mount', '1 m', { kind: 'diffuse', viewingAngle: '0°' })]);
	await signIn(page, priya);
	await openEditor(page, id);
	// The incomplete diffuse point is named as the form names it, in the list and in the working.
	const panel = page.getByRole('region', { name: 'Live assessment' });
	await expect(panel).toContainText('Point 2, Reflectance ρ (0–1)');
	await expect(panel).toContainText('the reflectance ρ (0–1)');
	await expect(panel).not.toContainText(/points\.\d|viewingDistance|exposureDuration|reflectance,/);

	await page.getByLabel('Path name').fill('');
	const dialogs: string[] = [];
	page.on('dialog', (d) => {
		dialogs.push(d.type());
		void d.dismiss();
	});
	await page.getByRole('link', { name: /^← / }).click();
	await expect.poll(() => dialogs).toContain('confirm');
	await expect(page).toHaveURL(new RegExp(`/paths/${id}`));

	await page.getByRole('button', { name: 'Save the path' }).click();
	const summary = page.getByTestId('save-errors');
	await expect(summary).toBeFocused();
	await expect(summary).toContainText('Not saved');
	await expect(summary).toContainText('name');
	await expectAccessible(page);

	// Closing or reloading the tab with the edit unsaved asks too (the page cancels its beforeunload).
	expect(await page.evaluate(() => {
		const event = new Event('beforeunload', { cancelable: true });
		window.dispatchEvent(event);
		return event.defaultPrevented;
	})).toBe(true);
});
