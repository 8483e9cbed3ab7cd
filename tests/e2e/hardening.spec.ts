// Limits a prober would test: body sizes by kind of route (413, never 400 or 500), what an upload
// may be (pixel count, file names), and the device cookie that keeps an owner signing in.
import { request as http } from 'node:http';
import sharp from 'sharp';
import postgres from 'postgres';
import { expect, test } from '@playwright/test';
import { png } from '../../seed/png';
import { anonymousClient, baseURL, demo, signIn, signedInClient } from './helpers';
import { e2eDatabaseUrl, sampleIds } from './routes';

/** A POST whose body is streamed in chunks with no Content-Length, as a client may send it. */
function chunkedPost(path: string, headers: Record<string, string>, chunk: Buffer, times: number): Promise<{ status: number; body: string }> {
	return new Promise((resolve, reject) => {
		const req = http(`${baseURL}${path}`, { method: 'POST', headers: { ...headers, origin: baseURL, 'transfer-encoding': 'chunked', connection: 'close' } }, (res) => {
			let body = '';
			res.on('data', (d) => (body += d));
			res.on('end', () => resolve({ status: res.statusCode!, body }));
		});
		req.on('error', (e) => ((e as NodeJS.ErrnoException).code === 'EPIPE' || (e as NodeJS.ErrnoException).code === 'ECONNRESET' ? undefined : reject(e)));
		let sent = 0;
		const next = () => {
			while (sent < times) {
				sent++;
				if (!req.write(chunk)) return void req.once('drain', next);
			}
			req.end();
		};
		next();
	});
}

test('JSON and form bodies over a few hundred kB answer 413, declared or streamed; uploads have their own, larger limit', async () => {
	test.setTimeout(120_000); // a 1 MB noisy PNG is drawn and posted twice: slow on a busy machine
	const officer = await signedInClient(demo('officer'));
	const cookie = (await officer.storageState()).cookies.map((c) => `${c.name}=${c.value}`).join('; ');
	const big = JSON.stringify({ maker: 'x'.repeat(600 * 1024) });
	const declared = await officer.post('/api/lasers', { data: big, headers: { 'content-type': 'application/json' } });
	expect(declared.status()).toBe(413);
	expect((await declared.json()).message).toMatch(/too large/);

	const streamed = await chunkedPost('/api/lasers', { cookie, 'content-type': 'application/json' }, Buffer.from('x'.repeat(64 * 1024)), 8);
	expect(streamed.status).toBe(413);
	expect(JSON.parse(streamed.body).message).toMatch(/too large/);

	const form = await officer.post('/lasers/new', { form: { maker: 'x'.repeat(400 * 1024) }, headers: { accept: 'application/json' } });
	expect(form.status()).toBe(413);
	const streamedForm = await chunkedPost('/preferences?/save', { cookie, 'content-type': 'application/x-www-form-urlencoded', accept: 'application/json' }, Buffer.from('a'.repeat(64 * 1024)), 8);
	expect(streamedForm.status).toBe(413);

	// A 1 MB photo is fine for the upload action (not for a JSON endpoint); one over 10 MB is a 413.
	const sample = await sampleIds(await signedInClient(demo('admin')));
	const photo = await sharp({ create: { width: 1200, height: 900, channels: 3, background: '#808080', noise: { type: 'gaussian', mean: 128, sigma: 60 } } }).png().toBuffer();
	expect(photo.length).toBeGreaterThan(600 * 1024);
	const ok = await officer.post(`/inspections/${sample.inspectionId}?/photos`, { multipart: { photos: { name: 'bench.png', mimeType: 'image/png', buffer: photo } }, headers: { accept: 'application/json' } });
	expect(ok.status()).toBe(200);
	expect(await ok.text()).toContain('photosAdded');
	const huge = await officer.post(`/inspections/${sample.inspectionId}?/photos`, { multipart: { photos: { name: 'huge.png', mimeType: 'image/png', buffer: Buffer.concat([photo, Buffer.alloc(11 * 1024 * 1024)]) } }, headers: { accept: 'application/json' } });
	expect(huge.status() === 413 || (await huge.text()).includes('"status":413')).toBe(true);
});

test('an upload that claims a huge picture is refused before decoding; file names lose bidi overrides', async () => {
	const officer = await signedInClient(demo('officer'));
	const sample = await sampleIds(await signedInClient(demo('admin')));
	const bomb = png(10000, 10000);
	expect(bomb.length).toBeLessThan(200 * 1024);
	const refused = await officer.post(`/inspections/${sample.inspectionId}?/photos`, { multipart: { photos: { name: 'bomb.png', mimeType: 'image/png', buffer: bomb } }, headers: { accept: 'text/html' } });
	expect(refused.status()).toBe(400);
	expect(await refused.text()).toContain('10000 × 10000 pixels; at most 50 megapixels');

	const named = await officer.post(`/inspections/${sample.inspectionId}?/photos`, { multipart: { photos: { name: 'door\u202Egnp.exe', mimeType: 'image/png', buffer: png(8, 8) } }, headers: { accept: 'application/json' } });
	expect(named.status()).toBe(200);
	const sql = postgres(e2eDatabaseUrl(), { max: 1 });
	try {
		const [doc] = await sql`SELECT id, file_name FROM document WHERE entity_id = ${sample.inspectionId} ORDER BY created_at DESC LIMIT 1`;
		expect(doc.file_name).toBe('doorgnp.exe');
		const served = await officer.get(`/documents/${doc.id}`);
		expect(served.headers()['content-disposition']).toBe('inline; filename="doorgnp.exe"');
		expect(served.headers()['content-type']).toBe('image/png');
	} finally {
		await sql.end();
	}
});

test('signing in leaves a device cookie (HttpOnly, SameSite=Lax, Secure); with it the owner signs in while strangers have the account throttled', async () => {
	const owner = demo('manager');
	const browser = await anonymousClient();
	const first = await browser.post('/signin', { form: { email: owner.email, password: owner.password }, headers: { accept: 'text/html' }, maxRedirects: 0 });
	expect(first.status()).toBe(303);
	const device = first.headersArray().find((h) => h.name.toLowerCase() === 'set-cookie' && h.value.startsWith('bw_device='))!.value;
	expect(device).toMatch(/HttpOnly/i);
	expect(device).toMatch(/SameSite=Lax/i);
	expect(device).toMatch(/Secure/i);
	const sql = postgres(e2eDatabaseUrl(), { max: 1 });
	try {
		// Strangers from this same address fail on the account until it is throttled for new browsers…
		const stranger = await anonymousClient();
		let last = 0;
		for (let i = 0; i < 6; i++) last = (await stranger.post('/signin', { form: { email: owner.email, password: `wrong guess ${i}` }, headers: { accept: 'text/html' }, maxRedirects: 0 })).status();
		expect(last).toBe(429);
		const newBrowser = await anonymousClient();
		expect((await newBrowser.post('/signin', { form: { email: owner.email, password: owner.password }, headers: { accept: 'text/html' }, maxRedirects: 0 })).status()).toBe(429);
		// …while the browser that signed in before still signs in.
		expect((await browser.post('/signin', { form: { email: owner.email, password: owner.password }, headers: { accept: 'text/html' }, maxRedirects: 0 })).status()).toBe(303);
	} finally {
		// the other tests sign in from this address too
		await sql`DELETE FROM sign_in_throttle WHERE key LIKE ${'%' + owner.email + '%'} OR key LIKE 'address:%'`;
		await sql.end();
	}
});

test('the register arrives with its first page of lasers in one request; filters load it again without the JSON API', async ({ page }) => {
	const officer = await signedInClient(demo('officer'));
	const html = await (await officer.get('/lasers')).text();
	expect(html).toContain('Solace');
	expect(html).toMatch(/\d+ lasers? · page 1 of \d+/);

	const apiCalls: string[] = [];
	page.on('request', (r) => r.url().includes('/api/lasers') && apiCalls.push(r.url()));
	await signIn(page, demo('officer'));
	await page.goto('/lasers');
	await expect(page.getByRole('link', { name: /Solace/ }).first()).toBeVisible();
	await page.getByLabel('Search maker, model or serial').fill('Solace');
	await expect(page).toHaveURL(/q=Solace/);
	await expect(page.getByRole('table').getByRole('row')).toHaveCount(2);
	expect(apiCalls).toEqual([]);
});
