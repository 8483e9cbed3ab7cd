// Incidents in a real browser: a researcher reports a near miss in under a minute, a suspected eye
// exposure reaches the officers' mailbox at once, the officer investigates, sets two actions,
// suspends the laser (a new clearance on it is refused), closes the actions and the incident, and
// the figures and the CSV show it. Then: an anonymous reporter's name reaches no researcher and no
// manager (pages, page data, API, CSV, mail), another lab sees nothing, the medical follow-up
// reaches officers only.
import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import postgres from 'postgres';
import { demoUsers } from '../../seed/demo';
import { anonymousClient, demo, expectAccessible, signIn, signedInClient } from './helpers';

const sqlUrl = `postgres://beamwarden_app@127.0.0.1:${process.env.BEAMWARDEN_PGPORT ?? '54329'}/beamwarden_e2e`;
const stamp = Date.now();

async function openReportFromLaser(page: Page, query: string) {
	await page.goto(`/lasers?q=${encodeURIComponent(query)}`);
	await page.getByRole('link', { name: new RegExp(query) }).first().click();
	await expect(page).toHaveURL(/\/lasers\/[0-9a-f-]{36}$/);
	await page.getByTestId('report-incident').click();
	await expect(page.getByRole('heading', { level: 1, name: 'Report an incident or near miss' })).toBeVisible();
}

test('report in a minute, investigate, suspend, follow up, close; the figures and the CSV show it', async ({ page, browser }) => {
	test.setTimeout(120_000);
	const description = `Alignment near miss ${stamp}: a periscope mirror turned past its stop during alignment and the beam rose above the table.`;

	// 1. The researcher reports from the laser's page: the area and the laser come prefilled.
	await signIn(page, demo('researcher'));
	await openReportFromLaser(page, 'Solace 5G');
	await expect(page.getByLabel('Laser (if one was involved)')).toHaveValue(/[0-9a-f-]{36}/);
	await expect(page.getByLabel('Area')).toHaveValue(/[0-9a-f-]{36}/);
	await expectAccessible(page);
	const started = Date.now();
	let filled = 0;
	await page.getByRole('radio', { name: /^Near miss/ }).check();
	filled++;
	await page.getByLabel('What happened?').fill(description);
	filled++;
	await page.getByRole('radio', { name: 'No', exact: true }).check();
	filled++;
	await page.getByRole('checkbox', { name: /Keep my name to the laser safety officers/ }).check();
	filled++;
	await page.getByRole('button', { name: 'Send the report' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'the report is sent' })).toBeVisible();
	const seconds = (Date.now() - started) / 1000;
	const prefilled = 3; // when (now), area and laser
	console.log(`near-miss report: ${filled} fields answered, ${prefilled} prefilled, ${seconds.toFixed(1)} s from the open form to the confirmation`);
	expect(filled).toBeLessThanOrEqual(5);
	expect(seconds).toBeLessThan(60);
	const incidentUrl = new URL(page.url()).pathname;
	const incidentNumber = Number(/Incident (\d+)/.exec(await page.getByRole('heading', { level: 1 }).innerText())![1]);
	await expectAccessible(page);

	// 2. A suspected eye exposure: the steps show at once, and every officer is mailed immediately.
	await openReportFromLaser(page, 'Aurora');
	await page.getByRole('radio', { name: /^Suspected eye exposure/ }).check();
	await expect(page.getByTestId('eye-steps')).toContainText('eye examination today');
	await expectAccessible(page);
	await page.getByLabel('What happened?').fill(`Eye exposure test ${stamp}: a flash from the compressor grating during alignment.`);
	await page.getByRole('radio', { name: 'Yes, medical attention was sought' }).check();
	await page.getByRole('button', { name: 'Send the report' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'the report is sent' })).toBeVisible();
	await expect(page.getByTestId('eye-steps')).toContainText('What to do now');
	const eyeNumber = Number(/Incident (\d+)/.exec(await page.getByRole('heading', { level: 1 }).innerText())![1]);

	const adminContext = await browser.newContext();
	const adminPage = await adminContext.newPage();
	await signIn(adminPage, demo('admin'));
	await expect(async () => {
		await adminPage.goto('/admin/mail');
		await expect(adminPage.getByRole('row', { name: new RegExp(`${demo('officer').email}.*Suspected eye exposure reported \\(incident ${eyeNumber}\\)`) }).first()).toBeVisible({ timeout: 1000 });
	}).toPass({ timeout: 60_000 });
	await adminContext.close();

	// 3. The officer investigates the near miss.
	const officerContext = await browser.newContext();
	const officer = await officerContext.newPage();
	await signIn(officer, demo('officer'));
	await officer.goto('/incidents');
	await expectAccessible(officer);
	await officer.getByRole('link', { name: description.slice(0, 40) }).click();
	await expect(officer).toHaveURL(new RegExp(`${incidentUrl}$`));
	await expect(officer.getByTestId('reporter')).toContainText('Priya Raman');
	await officer.getByRole('radio', { name: /^caught in time/ }).check();
	await officer.getByRole('textbox', { name: 'Causes' }).fill('The periscope mirror had no end stop; alignment was done at full power.');
	await officer.getByRole('checkbox', { name: /^Beam alignment work/ }).check();
	await officer.getByRole('checkbox', { name: /^Enclosure or beam stop/ }).check();
	await officer.getByRole('button', { name: 'Save the investigation' }).click();
	await expect(officer.getByRole('status').filter({ hasText: 'Investigation saved.' })).toBeVisible();
	await expect(officer.getByText('being looked into').first()).toBeVisible();

	// 4. Two corrective actions.
	for (const [what, owner] of [
		['Fit end stops to the periscope mirrors', 'Priya Raman'],
		['Add low-power alignment to the SOP', 'Ines Varga']
	]) {
		await officer.getByLabel('What is to be done').fill(what);
		await officer.getByLabel('Owner').selectOption({ label: owner });
		await officer.getByLabel('Due on').fill('2031-01-15');
		await officer.getByRole('button', { name: 'Add the action' }).click();
		await expect(officer.getByTestId('action').filter({ hasText: what })).toBeVisible();
	}
	await expect(officer.getByTestId('action')).toHaveCount(2);

	// 5. Suspend the laser: every page of it says so, and a new clearance on it is refused.
	await officer.getByLabel('Why it is suspended').fill('Periscope mounts under review');
	await officer.getByRole('button', { name: 'Suspend the laser' }).click();
	await expect(officer.getByRole('region', { name: 'Laser suspension' })).toContainText('suspended');
	await expect(officer.getByRole('region', { name: 'Laser suspension' })).toContainText('Periscope mounts under review');
	await expectAccessible(officer);
	await officer.goto('/lasers?q=Solace');
	await expect(officer.getByRole('row', { name: /Solace 5G/ })).toContainText('suspended');
	await officer.goto('/reviews?state=all');
	const row = officer.getByRole('row', { name: /Raman excitation, table 2/ });
	await expect(row).toContainText('suspended');
	await row.getByRole('link', { name: 'Raman excitation, table 2' }).click();
	await expect(officer.getByTestId('suspension-notice')).toContainText('Periscope mounts under review');
	const decision = officer.getByRole('region', { name: 'Your decision' });
	await decision.getByRole('radio', { name: 'Clear with controls' }).check();
	const control1 = decision.getByRole('group', { name: /^Control 1:/ });
	if ((await control1.count()) === 0) await decision.getByRole('button', { name: 'Add a control' }).click();
	await control1.getByLabel('Kind').selectOption('enclosure');
	await control1.getByLabel('What is required').fill('Enclose the periscope');
	await decision.getByRole('button', { name: 'Record the decision' }).click();
	await expect(officer.getByText(/is suspended since .* No new clearance until a laser safety officer lifts the suspension/).first()).toBeVisible();

	// 6. The actions are closed with evidence, the suspension lifted, the incident closed.
	await officer.goto(incidentUrl);
	for (const what of ['Fit end stops to the periscope mirrors', 'Add low-power alignment to the SOP']) {
		const action = officer.getByTestId('action').filter({ hasText: what });
		await action.getByLabel(/What was done/).fill(`Done: ${what.toLowerCase()}.`);
		await action.getByRole('button', { name: 'Close this action' }).click();
		await expect(officer.getByTestId('action').filter({ hasText: what })).toContainText('done');
	}
	await officer.getByLabel('Why it can be lifted').fill('End stops fitted and checked');
	await officer.getByRole('button', { name: 'Lift the suspension' }).click();
	await expect(officer.getByText('Lifted', { exact: false }).first()).toBeVisible();
	await officer.getByLabel('What was learned (optional)').fill('Mirrors that steer a beam upwards get end stops.');
	await officer.getByRole('button', { name: 'Close the incident' }).click();
	await expect(officer.getByRole('heading', { name: 'Closed', exact: true })).toBeVisible();
	await expect(officer.getByText('Mirrors that steer a beam upwards get end stops.')).toBeVisible();
	await expectAccessible(officer);

	// 7. The figures and the CSV show it.
	await officer.goto('/incidents/learning');
	const month = new Date().toISOString().slice(0, 7);
	await expect(officer.getByTestId('month-table').getByRole('row', { name: new RegExp(`^${month}`) })).toBeAttached();
	const nearMisses = Number(await officer.getByTestId('month-table').getByRole('row', { name: new RegExp(`^${month}`) }).getByRole('cell').nth(1).innerText());
	expect(nearMisses).toBeGreaterThanOrEqual(1);
	await expect(officer.getByRole('region', { name: 'By cause' })).toContainText('Beam alignment work');
	await expectAccessible(officer);
	const csv = await (await officer.request.get('/incidents/export.csv')).text();
	const line = csv.split('\r\n').find((l) => l.startsWith(`"${incidentNumber}",`));
	expect(line, csv.slice(0, 500)).toMatch(/"Near miss","caught","closed"/);
	expect(line).toContain('Solace 5G');
	await officerContext.close();
});

test('an anonymous reporter stays unknown to researchers and the manager; other labs see nothing; medical follow-up is for officers only', async () => {
	test.setTimeout(120_000);
	const admin = await signedInClient(demo('admin'));
	const sql = postgres(sqlUrl, { max: 1 });
	const [ufl] = await sql`SELECT id FROM lab WHERE code = 'UFL'`;
	const [area] = await sql`SELECT id FROM area WHERE name = 'Ultrafast LCA M2.14'`;
	const makePerson = async (name: string) => {
		const person = { email: `${name.split(' ')[0].toLowerCase()}-${stamp}@northgate.example`, password: 'a long enough test passphrase' };
		const res = await admin.post('/api/admin/users', { data: { name, email: person.email, role: 'researcher', labIds: [ufl.id], password: person.password } });
		expect(res.status()).toBe(201);
		return person;
	};
	const reporterName = `Wren Quietly-${stamp}`;
	const bystander = `Zephyr Bystander-${stamp}`;
	const reporter = await signedInClient(await makePerson(reporterName));
	const colleague = await signedInClient(await makePerson(`Colm Sameleb-${stamp}`));

	const send = async (kind: string, text: string) => {
		const res = await reporter.post('/incidents/report?/save', {
			headers: { accept: 'text/html' },
			maxRedirects: 0,
			multipart: { intent: 'submit', kind, occurredAt: '2026-02-03T08:30', areaId: area.id, laserId: '', pathId: '', locationNotes: '', description: text, peopleInvolved: bystander, medicalAttention: 'unknown', anonymous: 'on', version: '0' }
		});
		expect(res.status(), await res.text()).toBe(303);
		return /\/incidents\/([0-9a-f-]{36})/.exec(res.headers()['location'])![1];
	};
	const nearMiss = await send('near_miss', `Anonymous near miss ${stamp}: a beam dump was found moved off the beam line.`);
	const eye = await send('eye_exposure', `Anonymous eye report ${stamp}: a reflection from a loose mount.`);

	const officer = await signedInClient(demo('officer'));
	const outcome = `Lens clear ${stamp}`;
	const put = await officer.put(`/api/incidents/${eye}/medical`, { data: { examinationRequestedOn: '2026-02-03', examinationDoneOn: '2026-02-03', outcome, version: 0 } });
	expect(put.status(), await put.text()).toBe(200);
	expect((await (await officer.get(`/api/incidents/${eye}/medical`)).json()).outcome).toBe(outcome);
	expect((await (await officer.get(`/api/incidents/${nearMiss}`)).json()).reporter.name).toBe(reporterName);

	const manager = await signedInClient(demo('manager'));
	// A researcher of other labs only (the demo's second researcher works in HEL and MPC).
	const stranger = await signedInClient(demoUsers.find((u) => u.role === 'researcher' && !u.labs.includes('UFL'))!);
	const read = async (who: APIRequestContext, url: string) => {
		const res = await who.get(url, { headers: { accept: url.startsWith('/api/') ? 'application/json' : 'text/html' } });
		return { status: res.status(), body: await res.text() };
	};

	// The manager: the incidents, the people involved, never the reporter, never the medical outcome.
	for (const url of ['/incidents', `/incidents/${nearMiss}`, `/incidents/${nearMiss}/__data.json`, `/incidents/${eye}`, `/incidents/${eye}/__data.json`, '/api/incidents', `/api/incidents/${nearMiss}`, `/api/incidents/${eye}`, '/incidents/learning', '/incidents/export.csv']) {
		const r = await read(manager, url);
		expect(r.status, url).toBe(200);
		expect(r.body, url).not.toContain(reporterName);
		expect(r.body, url).not.toContain(outcome);
	}
	expect((await read(manager, `/api/incidents/${nearMiss}`)).body).toContain(bystander);
	// A researcher of the same lab: the near miss with every name removed, not the eye report.
	for (const url of ['/incidents', `/incidents/${nearMiss}`, `/incidents/${nearMiss}/__data.json`, '/api/incidents', `/api/incidents/${nearMiss}`]) {
		const r = await read(colleague, url);
		expect(r.status, url).toBe(200);
		expect(r.body, url).toContain(`Anonymous near miss ${stamp}`);
		expect(r.body, url).not.toContain(reporterName);
		expect(r.body, url).not.toContain(bystander);
	}
	expect((await read(colleague, `/api/incidents/${eye}`)).status).toBe(404);
	expect((await read(colleague, '/incidents/export.csv')).status).toBe(403);
	// Another lab's researcher: nothing at all.
	for (const id of [nearMiss, eye]) {
		expect((await read(stranger, `/api/incidents/${id}`)).status).toBe(404);
		expect((await read(stranger, `/incidents/${id}`)).status).toBe(404);
	}
	for (const url of ['/incidents', '/api/incidents']) expect((await read(stranger, url)).body).not.toContain(`${stamp}`);
	// The medical follow-up: officers only, page and API.
	for (const who of [manager, colleague, stranger, reporter, admin]) {
		expect((await read(who, `/api/incidents/${eye}/medical`)).status).toBe(403);
		expect((await read(who, `/incidents/${eye}/medical`)).status).toBe(403);
		expect((await who.put(`/api/incidents/${eye}/medical`, { data: { examinationRequestedOn: '', examinationDoneOn: '', outcome: '', version: 1 } })).status()).toBe(403);
	}
	expect((await read(await anonymousClient(), `/api/incidents/${eye}/medical`)).status).toBe(401);
	// Mail: the officers' immediate mails went out, with no name in them.
	const mails = await sql`SELECT recipient_email, subject, text_body, html_body FROM mail_outbox WHERE record_id = ${eye}`;
	expect(mails.length).toBeGreaterThanOrEqual(2);
	for (const m of mails) expect(`${m.subject}${m.text_body}${m.html_body}`).not.toContain(reporterName);
	// Every view of the personal fields left an audit row.
	const [{ n }] = await sql`SELECT count(*)::int AS n FROM audit_log WHERE entity_id = ${nearMiss} AND action = 'incident.view_personal'`;
	expect(n).toBeGreaterThanOrEqual(3);
	await sql.end();
});

test('the incident pages pass the accessibility checks for the manager and a researcher', async ({ page, browser }) => {
	await signIn(page, demo('manager'));
	await page.goto('/incidents');
	await expectAccessible(page);
	await page.goto('/incidents/learning');
	await expectAccessible(page);
	await page.goto('/incidents');
	await page.getByRole('row').nth(1).getByRole('link').first().click();
	await expect(page.getByRole('heading', { level: 1, name: /^Incident \d+/ })).toBeVisible();
	await expectAccessible(page);
	const researcher = await (await browser.newContext()).newPage();
	await signIn(researcher, demo('researcher'));
	await researcher.goto('/incidents');
	await expect(researcher.getByRole('heading', { name: 'Corrective actions you own' })).toBeVisible();
	await expectAccessible(researcher);
	await researcher.getByRole('link', { name: /Beam block on the microscope table/ }).click();
	await expect(researcher.getByRole('heading', { level: 1, name: /^Draft report \d+/ })).toBeVisible();
	await expectAccessible(researcher);
});
