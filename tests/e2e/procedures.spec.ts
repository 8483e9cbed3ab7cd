// Procedures and authorisations to operate in a real browser: a researcher drafts an alignment
// procedure for a demo laser, an officer approves it, two researchers are authorised with a training
// and the signed procedure as conditions; one's training runs out and the authorisation shows
// lapsed with the reason, mailed once; a change to a covered path marks the procedure to be
// reviewed. Then the request, refusal, visit and door list, bad input, and fuzzed form posts.
import { execFileSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { addDays, addYears, format } from 'date-fns';
import { expect, test, type Browser, type Page } from '@playwright/test';
import postgres from 'postgres';
import { demoUsers } from '../../seed/demo';
import { baseURL, demo, expectAccessible, signIn, signedInClient } from './helpers';

const tomas = demoUsers.find((u) => u.email.startsWith('tomas'))!; // researcher in HEL and MPC
const priya = demoUsers.find((u) => u.email.startsWith('priya'))!; // researcher in UFL and SPX
const pgPort = process.env.BEAMWARDEN_PGPORT ?? '54329';
const databaseUrl = `postgres://beamwarden_app@127.0.0.1:${pgPort}/beamwarden_e2e`;
const today = format(new Date(), 'yyyy-MM-dd');
const yesterday = format(addDays(new Date(), -1), 'yyyy-MM-dd');

/** The daily reminder run against the end-to-end database and its mail server, as the job does it. */
function runReminders() {
	execFileSync('npx', ['tsx', 'scripts/run-reminders.ts', '--deliver'], {
		env: { ...process.env, DATABASE_URL: databaseUrl, SMTP_HOST: '127.0.0.1', SMTP_PORT: process.env.E2E_SMTP_PORT ?? '2727', APP_URL: baseURL },
		stdio: 'pipe'
	});
}

/** Messages the local mail server kept (one per Message-ID) for an address, by subject. */
function mailbox(to: string, subject: RegExp) {
	const dir = '.data/mailbox-e2e';
	return readdirSync(dir)
		.filter((f) => f.endsWith('.json'))
		.map((f) => JSON.parse(readFileSync(join(dir, f), 'utf8')) as { to: string[]; subject: string; text: string })
		.filter((m) => m.to.some((t) => t.toLowerCase() === to.toLowerCase()) && subject.test(m.subject));
}

async function newPerson(browser: Browser, who: { email: string; password: string }) {
	const context = await browser.newContext();
	const page = await context.newPage();
	await signIn(page, who);
	return page;
}

test('a procedure is drafted, approved, signed; authorisations follow the training and the path', async ({ page, browser }) => {
	test.setTimeout(180_000);
	const stamp = Date.now().toString(36);
	const title = `Cutter beam alignment ${stamp}`;
	const topic = `CO2 cutter briefing ${stamp}`;
	const admin = await signedInClient(demo('admin'));
	const inventory = await (await admin.get('/api/lasers?q=CX-60')).json();
	const laser = await (await admin.get(`/api/lasers/${inventory.items[0].id}`)).json();
	const people = [
		{ name: `Ada Cutter ${stamp}`, email: `ada-${stamp}@northgate.example`, password: 'a long passphrase for ada' },
		{ name: `Ben Cutter ${stamp}`, email: `ben-${stamp}@northgate.example`, password: 'a long passphrase for ben' }
	];
	for (const p of people) expect((await admin.post('/api/admin/users', { data: { name: p.name, email: p.email, role: 'researcher', labIds: [laser.laser.labId], password: p.password } })).status()).toBe(201);

	// 1. A researcher of the lab drafts an alignment procedure for the demo CO₂ cutter and submits it.
	const researcher = await newPerson(browser, tomas);
	await researcher.goto('/lasers?q=CX-60');
	await researcher.getByRole('link', { name: /CX-60/ }).click();
	await researcher.getByRole('link', { name: 'Write a procedure for this laser' }).click();
	await expect(researcher.getByLabel('For which laser or area')).toHaveValue(`laser:${laser.laser.id}`);
	await researcher.getByLabel('Kind').selectOption({ label: 'Alignment procedure' });
	await researcher.getByLabel('Title').fill(title);
	await researcher.getByRole('checkbox', { name: 'Cutting head over the bed' }).check();
	await researcher.getByLabel('The procedure').fill('# Alignment\n\n1. Bypass key from the LSO.\n2. Power at 2 W or less.\n3. Everyone in the bay wears MPC-P1.\n\n<script>alert("x")</script>');
	await expectAccessible(researcher);
	await researcher.getByRole('button', { name: 'Save the draft' }).click();
	await expect(researcher).toHaveURL(/\/procedures\/[0-9a-f-]{36}\?created=1/);
	const procedureUrl = new URL(researcher.url()).pathname;
	await researcher.getByRole('button', { name: 'Submit version 1 for approval' }).click();
	await expect(researcher.getByRole('status')).toContainText('Submitted');
	await expect(researcher.getByText('awaiting approval').first()).toBeVisible();
	await expectAccessible(researcher);

	// 2. The officer reads it (sanitised) and approves it; it is in force.
	await signIn(page, demo('officer'));
	await page.goto(procedureUrl);
	await expect(page.locator('article script')).toHaveCount(0);
	await page.getByRole('button', { name: 'Approve version 1' }).click();
	await expect(page.getByRole('status')).toContainText('Version 1 approved');
	await expect(page.getByRole('heading', { name: 'Version in force' })).toBeVisible();
	await expect(page.getByRole('article', { name: 'Text of version 1' }).getByRole('heading', { name: 'Alignment' })).toBeVisible();
	await expect(page.locator('article script')).toHaveCount(0);
	await expectAccessible(page);

	// 3. Both researchers get the training, then the authorisation with the training and the procedure.
	await page.goto('/training', { waitUntil: 'networkidle' });
	const record = page.getByRole('region', { name: 'Record a training' });
	for (const p of people) {
		await record.getByLabel('Person').selectOption({ label: p.name });
		await record.getByLabel('Training or authorisation').fill(topic);
		await record.getByLabel('Expires on').fill(format(addYears(new Date(), 1), 'yyyy-MM-dd'));
		await record.getByRole('button', { name: 'Record the training' }).click();
		await expect(record.getByRole('status')).toHaveText('Recorded.', { timeout: 15_000 });
		await expect(page.getByRole('row', { name: new RegExp(`${p.name} ${topic}`) })).toHaveCount(1);
	}
	const authorisationUrls: string[] = [];
	for (const p of people) {
		await page.goto('/authorisations');
		const grant = page.getByRole('region', { name: 'Grant an authorisation' });
		await grant.getByLabel('Person').selectOption({ label: p.name });
		await grant.getByLabel('For', { exact: true }).selectOption(`laser:${laser.laser.id}`);
		await grant.getByRole('checkbox', { name: topic }).check();
		await grant.getByRole('checkbox', { name: title }).check();
		await grant.getByRole('button', { name: 'Grant the authorisation' }).click();
		await expect(page).toHaveURL(/\/authorisations\/[0-9a-f-]{36}\?granted=1/);
		await expect(page.getByText('not yet in force').first()).toBeVisible();
		await expect(page.getByRole('region', { name: 'Why it is not in force' })).toContainText('is not signed yet');
		authorisationUrls.push(new URL(page.url()).pathname);
	}
	await expectAccessible(page);

	// 4. Each signs the version in force; each authorisation is active.
	for (const [i, p] of people.entries()) {
		const own = await newPerson(browser, p);
		await own.goto(procedureUrl);
		await own.getByRole('checkbox', { name: /I have read and understood version 1/ }).check();
		await own.getByRole('button', { name: 'Sign version 1' }).click();
		await expect(own.getByRole('status')).toContainText(`Signed on ${today}`);
		await expect(own.getByRole('region', { name: 'Your sign-off' })).toContainText('signed');
		await expectAccessible(own);
		await own.goto(authorisationUrls[i]);
		await expect(own.getByText('active', { exact: true }).first()).toBeVisible();
		await own.context().close();
	}
	await page.goto(`/lasers/${laser.laser.id}`);
	const operators = page.getByRole('region', { name: 'Who may operate it' }).or(page.locator('section', { has: page.getByRole('heading', { name: 'Who may operate it' }) }));
	for (const p of people) await expect(operators.getByRole('row', { name: new RegExp(p.name) })).toContainText('active');
	await expectAccessible(page);

	// 5. Time passes: Ben's training expired yesterday. His authorisation shows lapsed, with the reason.
	const sql = postgres(databaseUrl, { max: 1 });
	try {
		const aYearAgo = format(addDays(new Date(), -366), 'yyyy-MM-dd');
		await sql`UPDATE training_record SET completed_on = ${aYearAgo}, expires_on = ${yesterday} WHERE topic = ${topic} AND user_id = (SELECT id FROM "user" WHERE email = ${people[1].email})`;
		await page.goto(authorisationUrls[1]);
		await expect(page.getByText('lapsed', { exact: true }).first()).toBeVisible();
		await expect(page.getByRole('region', { name: 'Why it is not in force' })).toContainText(`The training “${topic}” expired on ${yesterday}.`);
		await expectAccessible(page);
		await page.goto(authorisationUrls[0]);
		await expect(page.getByText('active', { exact: true }).first()).toBeVisible();

		// The daily run mails the lapse once, however often it runs.
		runReminders();
		runReminders();
		const mails = mailbox(people[1].email, /^Authorisation lapsed/);
		expect(mails).toHaveLength(1);
		expect(mails[0].text).toContain(`expired on ${yesterday}`);
		const [{ n }] = await sql`SELECT count(*)::int AS n FROM mail_outbox WHERE kind = 'authorisation.lapsed' AND recipient_email = ${people[1].email}`;
		expect(n).toBe(1);
		expect(mailbox(people[0].email, /^Authorisation lapsed/)).toHaveLength(0);

		// 6. The researcher changes the covered path: its review reopens, the procedure is to be reviewed.
		await researcher.goto(`/lasers/${laser.laser.id}`);
		await researcher.getByRole('link', { name: 'Cutting head over the bed' }).click();
		await researcher.getByLabel('Purpose (optional)').fill(`Cutting head moved 20 mm (${stamp})`);
		await researcher.getByRole('button', { name: 'Save the path' }).click();
		await expect(researcher).toHaveURL(/saved=/);
		await researcher.goto(procedureUrl);
		await expect(researcher.getByRole('region', { name: 'To be reviewed' })).toContainText('Cutting head over the bed');
		await expect(researcher.getByText('to be reviewed').first()).toBeVisible();
		await expectAccessible(researcher);
		const told = await sql`SELECT recipient_email FROM mail_outbox WHERE kind = 'procedure.review' AND record_id = ${procedureUrl.split('/').pop()!}`;
		expect(told.map((r) => r.recipient_email)).toEqual(expect.arrayContaining([tomas.email, demo('officer').email]));
	} finally {
		await sql.end();
	}

	// 7. The officer renews Ben's training: his authorisation is active again.
	await page.goto('/training', { waitUntil: 'networkidle' });
	await record.getByLabel('Person').selectOption({ label: people[1].name });
	await record.getByLabel('Training or authorisation').fill(topic);
	await record.getByLabel('Expires on').fill(format(addYears(new Date(), 1), 'yyyy-MM-dd'));
	await record.getByRole('button', { name: 'Record the training' }).click();
	await expect(record.getByRole('status')).toHaveText('Recorded.', { timeout: 15_000 });
	await page.goto(authorisationUrls[1]);
	await expect(page.getByText('active', { exact: true }).first()).toBeVisible();
	await researcher.context().close();
});

test('a researcher asks for an authorisation, the officer refuses it with a reason; the overview says what to do', async ({ page, browser }) => {
	await signIn(page, priya);
	const duties = page.getByRole('region', { name: 'What you must do' }).or(page.locator('section', { has: page.getByRole('heading', { name: 'What you must do' }) }));
	await expect(duties).toContainText('Laser safety induction'); // renew: it ends within 30 days
	await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Authorisations' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Authorisations' })).toBeVisible();
	const ask = page.getByRole('region', { name: 'Ask for an authorisation' }).or(page.locator('section', { has: page.getByRole('heading', { name: 'Ask for an authorisation' }) }));
	await ask.getByRole('button', { name: 'Ask for the authorisation' }).click();
	await expect(ask.getByText('Choose a laser or an area.')).toBeVisible();
	await ask.getByLabel('To operate which laser').selectOption({ label: 'Laser: Verdant Photonics Solace 5G (SPX)' });
	await ask.getByLabel('Note for the officer (optional)').fill('Raman runs on table 2');
	await ask.getByRole('button', { name: 'Ask for the authorisation' }).click();
	await expect(page).toHaveURL(/\/authorisations\/[0-9a-f-]{36}\?requested=1/);
	await expect(page.getByText('requested', { exact: true }).first()).toBeVisible();
	await expectAccessible(page);
	const url = new URL(page.url()).pathname;

	const officer = await newPerson(browser, demo('officer'));
	await expect(officer.getByRole('region', { name: /Requests waiting/ })).toContainText('Priya Raman');
	await expectAccessible(officer);
	await officer.goto(url);
	await officer.getByLabel('Refuse').check();
	await officer.getByRole('button', { name: 'Refuse the request' }).click();
	await expect(officer.getByText('Say why it is refused; the person reads it.')).toBeVisible();
	await officer.getByLabel('Why it is refused').fill('Book the Raman induction first.');
	await officer.getByRole('button', { name: 'Refuse the request' }).click();
	await expect(officer.getByRole('status')).toContainText('Refused');
	await page.reload();
	await expect(page.getByText('refused', { exact: true }).first()).toBeVisible();
	await expect(page.getByText('Book the Raman induction first.')).toBeVisible();
	await officer.context().close();
});

test('an area lists who may be there, records a visit, and prints a one-page door list', async ({ page }) => {
	await signIn(page, priya);
	await page.goto('/lasers?q=Solace');
	await page.getByRole('link', { name: /Solace 5G/ }).click();
	await page.getByRole('link', { name: 'Spectroscopy LCA M1.07' }).first().click();
	await page.waitForURL(/\/areas\/[0-9a-f-]{36}$/);
	await expect(page.getByRole('heading', { level: 1, name: 'Spectroscopy LCA M1.07' })).toBeVisible();
	const who = page.locator('section', { has: page.getByRole('heading', { name: 'Who may be here' }) });
	await expect(who.getByRole('row', { name: /Priya Raman/ }).first()).toContainText('active');
	await expectAccessible(page);

	const visit = page.locator('form[action="?/visit"]');
	await visit.getByLabel('Visitor’s name').fill('Sam Auditor');
	await visit.getByRole('button', { name: 'Record the visit' }).click();
	await expect(visit.getByText('Name the authorised person who escorts them.')).toBeVisible();
	await expect(visit.getByLabel('Visitor’s name')).toHaveValue('Sam Auditor'); // nothing typed is lost
	await visit.getByLabel('Escorted by').fill('Priya Raman');
	await visit.getByLabel('Briefing given').fill('Hazards, eyewear SPX-S1, stays behind the curtain.');
	await visit.getByRole('button', { name: 'Record the visit' }).click();
	await expect(visit.getByRole('status')).toContainText('Visit of Sam Auditor recorded.');
	await expect(page.getByRole('row', { name: /Sam Auditor/ })).toContainText('Priya Raman');

	await page.getByRole('link', { name: 'Door list to print' }).click();
	await page.waitForURL(/\/door$/);
	await expect(page.getByRole('heading', { level: 1, name: 'Spectroscopy LCA M1.07' })).toBeVisible();
	await expect(page.getByRole('row', { name: /^Priya Raman the whole area/ })).toBeVisible();
	await expect(page.getByText(`Updated ${today}`)).toBeVisible();
	await expect(page.getByText(/Sam Auditor/)).toBeVisible(); // a visitor today
	await expectAccessible(page);
	const pdf = await page.pdf({ format: 'A4' });
	expect(pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g)?.length).toBe(1);
});

async function procedureOf(page: Page, name: string) {
	await page.goto('/procedures');
	await page.getByRole('link', { name }).click();
	await page.waitForURL(/\/procedures\/[0-9a-f-]{36}$/);
	return new URL(page.url()).pathname;
}

test('bad input: field messages and nothing saved; a PDF only as a PDF; another lab’s procedure is unknown', async ({ page, browser }) => {
	await signIn(page, priya);
	await page.goto('/procedures/new');
	await page.getByRole('button', { name: 'Save the draft' }).click();
	await expect(page.getByText('Choose a laser or an area.')).toBeVisible();
	await expect(page.getByText(/Give the procedure a title/)).toBeVisible();
	await expect(page).toHaveURL(/\/procedures\/new$/);

	const url = await procedureOf(page, 'Aurora compressor alignment');
	const upload = page.locator('form[action="?/attach"]');
	await upload.getByLabel('Attach a PDF').setInputFiles({ name: 'steps.pdf', mimeType: 'application/pdf', buffer: Buffer.from('<html>not a pdf</html>') });
	await upload.getByRole('button', { name: 'Upload' }).click();
	await expect(page.getByText('“steps.pdf” is not a PNG, JPEG, WebP or PDF file.')).toBeVisible();
	await page.goto(url);
	await page.locator('form[action="?/attach"]').getByLabel('Attach a PDF').setInputFiles({ name: 'photo.png', mimeType: 'image/png', buffer: Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010806000000', 'hex') });
	await page.locator('form[action="?/attach"]').getByRole('button', { name: 'Upload' }).click();
	await expect(page.getByText('“photo.png” is not a PDF file.')).toBeVisible();
	await page.goto(url);
	await page.locator('form[action="?/attach"]').getByLabel('Attach a PDF').setInputFiles({ name: 'alignment.pdf', mimeType: 'application/pdf', buffer: Buffer.from('%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n') });
	await page.locator('form[action="?/attach"]').getByRole('button', { name: 'Upload' }).click();
	await expect(page.getByRole('status')).toContainText('PDF attached');
	const pdfLink = page.getByRole('link', { name: 'alignment.pdf' }).first();
	const response = await page.request.get((await pdfLink.getAttribute('href'))!);
	expect(response.headers()['content-type']).toBe('application/pdf');
	expect(response.headers()['content-disposition']).toMatch(/^attachment;/);

	// Tomas is in other labs: the procedure and its PDF answer as if they did not exist.
	const other = await newPerson(browser, tomas);
	expect((await other.goto(url))!.status()).toBe(404);
	expect((await other.request.get((await pdfLink.getAttribute('href'))!)).status()).toBe(404);
	await other.context().close();
});

test('every form action of procedures, authorisations and areas answers 4xx to arbitrary input, never 5xx', async () => {
	const officer = await signedInClient(demo('officer'));
	const researcher = await signedInClient(priya);
	const sql = postgres(databaseUrl, { max: 1 });
	const [{ procedure_id }] = await sql`SELECT id AS procedure_id FROM procedure WHERE title = 'Aurora compressor alignment'`;
	const [{ area_id }] = await sql`SELECT id AS area_id FROM area WHERE name = 'Spectroscopy LCA M1.07'`;
	const [{ authorisation_id }] = await sql`SELECT a.id AS authorisation_id FROM authorisation a WHERE a.decision = 'requested' LIMIT 1`;
	const counts = async () =>
		(await sql`SELECT (SELECT count(*) FROM procedure)::int p, (SELECT count(*) FROM procedure_version)::int v, (SELECT count(*) FROM procedure_signoff)::int s, (SELECT count(*) FROM authorisation)::int a, (SELECT count(*) FROM visit)::int w, (SELECT count(*) FROM programme_setting)::int g`)[0];
	const before = await counts();
	const actions: [typeof officer, string][] = [
		[researcher, '/procedures/new?/create'],
		[officer, '/procedures?/interval'],
		...['save', 'submit', 'approve', 'return', 'sign', 'cover', 'confirm', 'detach'].map((a) => [officer, `/procedures/${procedure_id}?/${a}`] as [typeof officer, string]),
		[researcher, '/authorisations?/request'],
		[officer, '/authorisations?/grant'],
		[officer, `/authorisations/${authorisation_id}?/decide`],
		[officer, `/authorisations/${authorisation_id}?/withdraw`],
		[researcher, `/areas/${area_id}?/visit`]
	];
	const field = fc.oneof(fc.string({ maxLength: 300 }), fc.constant('\u0000'), fc.constant('x'.repeat(70_000)), fc.constant('laser:00000000-0000-4000-8000-000000000000'), fc.integer({ min: 1_000_001 }).map(String), fc.constant('2026-02-31'));
	const form = fc.dictionary(
		fc.oneof(fc.constantFrom('target', 'kind', 'title', 'body', 'pathIds', 'version', 'reviewBy', 'comment', 'versionId', 'understood', 'months', 'note', 'userId', 'trainingTopics', 'procedureIds', 'expiresOn', 'reason', 'decision', 'visitorName', 'escortName', 'briefing', 'startsOn', 'role', '__proto__', 'pathIds[0]'), fc.string({ maxLength: 20 })),
		field,
		{ maxKeys: 8 }
	);
	try {
		for (const [client, url] of actions)
			await fc.assert(
				fc.asyncProperty(form, async (data) => {
					const res = await client.post(url, { form: data, headers: { accept: 'application/json', 'x-sveltekit-action': 'true' }, maxRedirects: 0 });
					const what = `${url} ${JSON.stringify(data).slice(0, 200)}`;
					expect(res.status(), what).toBeLessThan(500);
					// An action answers a failure as { type: 'failure', status } and a thrown error with its status.
					const body = await res.json();
					expect(['failure', 'error'], what).toContain(body.type);
					const status = body.type === 'failure' ? body.status : res.status();
					expect(status, what).toBeGreaterThanOrEqual(400);
					expect(status, what).toBeLessThan(500);
				}),
				{ numRuns: 25 }
			);
		expect(await counts()).toEqual(before);
	} finally {
		await sql.end();
	}
});
