// The decision reaches the researcher: the path page (where the mails lead) shows where the path
// stands, the officer's comments with an answer box, and the required controls with where the
// eyewear is kept; each state has one name on the desk, the overview, the filters and the API.
import { expect, test, type Page } from '@playwright/test';
import { demoUsers } from '../../seed/demo';
import { demo, expectAccessible, signIn, signedInClient } from './helpers';

const priya = demoUsers.find((u) => u.email.startsWith('priya'))!;

async function openReview(page: Page, name: string) {
	await page.goto('/reviews?state=all');
	await page.getByRole('link', { name }).click();
	await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();
}

async function openPath(page: Page, laser: string, name: string) {
	await page.goto(`/lasers?q=${encodeURIComponent(laser)}`);
	await page.getByRole('link', { name: new RegExp(laser) }).click();
	await page.getByRole('link', { name }).click();
}

test('a returned path shows the comments and takes an answer on the path page; a cleared one lists its controls and where the eyewear is', async ({ page, browser }) => {
	test.setTimeout(120_000);
	await signIn(page, demo('officer'));
	await openReview(page, 'Raman excitation, table 2');
	const decision = page.getByRole('region', { name: 'Your decision' });
	await decision.getByRole('radio', { name: 'Return to the researcher' }).check();
	await decision.getByLabel('What should change').fill('Enclose the pick-off before the power monitor.');
	await decision.getByRole('button', { name: 'Record the decision' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Decision recorded' })).toBeVisible();

	const researcher = await (await browser.newContext()).newPage();
	await signIn(researcher, priya);
	await openPath(researcher, 'Solace 5G', 'Raman excitation, table 2');
	const record = researcher.getByTestId('review-record');
	await expect(record).toContainText('returned');
	await expect(record).toContainText('What should change: Enclose the pick-off before the power monitor.');
	await expect(researcher.getByText('awaiting review')).toHaveCount(0);
	await record.getByLabel('Your answer to the officer').fill('A tube is ordered; I will add it to the path when fitted.');
	await record.getByRole('button', { name: 'Send the answer' }).click();
	await expect(researcher).toHaveURL(/replied=1/);
	await expect(researcher.getByTestId('review-record').locator('blockquote')).toContainText('A tube is ordered');
	await expectAccessible(researcher);

	// A clearance: the eyewear the assessment asks for starts filled in; add a procedure.
	await openReview(page, 'Compressor to the pump–probe table');
	const clear = page.getByRole('region', { name: 'Your decision' });
	await expect(clear.getByRole('group', { name: /^Control 1: Protective eyewear/ }).getByLabel('At wavelength')).toHaveValue('800 nm');
	await clear.getByRole('button', { name: 'Add a control' }).click();
	const procedure = clear.getByRole('group', { name: /^Control 2:/ });
	await procedure.getByLabel('Kind').selectOption('procedure');
	await procedure.getByLabel('What is required').fill('Alignment at low power, SOP UFL-02');
	await clear.getByRole('button', { name: 'Record the decision' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Decision recorded' })).toBeVisible();

	await openPath(researcher, 'Aurora 1K', 'Compressor to the pump–probe table');
	const cleared = researcher.getByTestId('review-record');
	await expect(cleared).toContainText('cleared with controls');
	const controls = cleared.getByTestId('required-controls');
	await expect(controls).toContainText(/Protective eyewear: at least OD \d+ at 800 nm/);
	await expect(controls).toContainText('Procedure (SOP) — Alignment at low power, SOP UFL-02');
	await expect(cleared.getByTestId('eyewear-check')).toContainText('UFL-T3 (kept at: shelf by the amplifier) covers every line.');
	await expectAccessible(researcher);
	await researcher.context().close();
});

/** A laser of the demo researcher's lab with one flagged path, made through the API; returns the API client and ids. */
async function flaggedPath(name: string) {
	const api = await signedInClient(priya);
	const me = await (await api.get('/api/me')).json();
	const labId = me.labs.find((l: { code: string }) => l.code === 'SPX').id;
	const line = { label: '', mode: 'continuous', wavelength: '532 nm', wavelengthMax: '', power: '2 W', pulseEnergy: '', pulseDuration: '', repetitionRate: '', beamDiameter: '2 mm', beamDiameterDefinition: '1/e2', divergence: '1 mrad', divergenceDefinition: '1/e2', beamQuality: '' };
	const created = await api.post('/api/lasers', { data: { labId, maker: 'Decision Test', model: 'Bench laser', serial: `dt-${Date.now()}`, laserClass: '4', status: 'active', notes: '', line } });
	expect(created.status()).toBe(201);
	const laserId = (await created.json()).id;
	const lineId = (await (await api.get(`/api/lasers/${laserId}`)).json()).lines[0].id;
	const element = { label: '', length: '', transmission: '', reflectance: '', magnification: '', focalLength: '', coreDiameter: '', numericalAperture: '', couplingTransmission: '' };
	const body = (purpose: string, version: number) => ({
		lineIds: [lineId],
		lineChoiceReason: '',
		name,
		purpose,
		nohdExposureDuration: '0.25 s',
		elements: [{ ...element, kind: 'propagate', length: '2 m' }],
		points: [{ key: 'a', label: 'Viewer', kind: 'intrabeam', tissue: 'eye', position: '1 m', exposureDuration: '0.25 s', reflectance: '', viewingAngle: '', viewingDistance: '' }],
		version
	});
	const path = await api.post(`/api/lasers/${laserId}/paths`, { data: body('first', 0) });
	expect(path.status()).toBe(201);
	return { api, id: (await path.json()).id as string, body };
}

test('a path changed after its clearance has one name everywhere: badge, desk counter, overview counter, filter and API', async ({ page }) => {
	test.setTimeout(120_000);
	const name = `Changed after clearance ${Date.now()}`;
	const { api, id, body } = await flaggedPath(name);
	expect((await (await api.get(`/api/paths/${id}`)).json()).state).toBe('awaiting_review');

	// The officer clears it with the eyewear the assessment asks for; its researcher then changes it.
	await signIn(page, demo('officer'));
	await openReview(page, name);
	await page.getByRole('region', { name: 'Your decision' }).getByRole('button', { name: 'Record the decision' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Decision recorded' })).toBeVisible();
	expect((await (await api.get(`/api/paths/${id}`)).json()).state).toBe('cleared');
	expect((await api.put(`/api/paths/${id}`, { data: body('changed after the clearance', 1) })).status()).toBe(200);
	expect((await (await api.get(`/api/paths/${id}`)).json()).state).toBe('changed_since_clearance');

	await page.goto('/reviews');
	const row = page.getByRole('row', { name: new RegExp(name) });
	await expect(row).toContainText('changed since clearance');
	await expect(row).not.toContainText('awaiting review');
	await expect(page.getByTestId('desk-count-changed_since_clearance')).not.toHaveText('0');
	await page.getByLabel('Show').selectOption('changed_since_clearance');
	await expect(page.getByRole('row', { name: new RegExp(name) })).toBeVisible();
	await expect(page.getByRole('row', { name: /Feed to target chamber B/ })).toHaveCount(0);
	await page.goto('/overview');
	await expect(page.getByTestId('count-changed_since_clearance')).not.toHaveText('0');
	await page.getByTestId('count-changed_since_clearance').click();
	await expect(page.getByRole('row', { name: new RegExp(name) })).toContainText('changed since clearance');
	await page.goto(`/paths/${id}`);
	await expect(page.getByTestId('review-record')).toContainText('changed since clearance');
});

test('a path with an incomplete point is a draft: saved, shown as such, off the desk, and not clearable until complete', async ({ page }) => {
	const api = await signedInClient(priya);
	const lasers = (await (await api.get('/api/lasers?q=Solace')).json()) as { items: { id: string }[] };
	const laserId = lasers.items[0].id;
	const lineId = (await (await api.get(`/api/lasers/${laserId}`)).json()).lines[0].id;
	const element = { label: '', length: '', transmission: '', reflectance: '', magnification: '', focalLength: '', coreDiameter: '', numericalAperture: '', couplingTransmission: '' };
	const point = { label: '', kind: 'intrabeam', tissue: 'eye', position: '1 m', exposureDuration: '0.25 s', reflectance: '', viewingAngle: '', viewingDistance: '' };
	const body = (reflectance: string, version: number) => ({
		lineIds: [lineId],
		lineChoiceReason: '',
		name: 'Draft: reflection off the cuvette',
		purpose: '',
		nohdExposureDuration: '0.25 s',
		elements: [{ ...element, kind: 'propagate', length: '2 m' }],
		points: [
			{ ...point, key: 'a', label: 'On the beam' },
			{ ...point, key: 'b', label: 'Off the cuvette', kind: 'diffuse', reflectance, viewingDistance: '0.5 m' }
		],
		version
	});
	const created = await api.post(`/api/lasers/${laserId}/paths`, { data: body('', 0) });
	expect(created.status()).toBe(201);
	const { id } = await created.json();
	expect((await (await api.get(`/api/paths/${id}`)).json()).state).toBe('draft');

	await signIn(page, demo('officer'));
	await page.goto('/reviews');
	await expect(page.getByRole('row', { name: /Draft: reflection off the cuvette/ })).toHaveCount(0);
	await page.getByLabel('Show').selectOption('draft');
	await expect(page.getByRole('row', { name: /Draft: reflection off the cuvette/ })).toContainText('draft');
	await page.goto(`/reviews/${id}`);
	await expect(page.getByText('This beam path is a draft: an accessible point lacks an input.')).toBeVisible();
	await expect(page.getByRole('button', { name: 'Record the decision' })).toHaveCount(0);
	await page.goto(`/paths/${id}`);
	await expect(page.getByTestId('review-record')).toContainText('draft');
	await expectAccessible(page);

	// Completed, it goes to the desk.
	expect((await api.put(`/api/paths/${id}`, { data: body('0.5', 1) })).status()).toBe(200);
	await page.goto('/reviews');
	await expect(page.getByRole('row', { name: /Draft: reflection off the cuvette/ })).toContainText('awaiting review');
});
