// Two app instances on one PostgreSQL behave as one: a session made on one works on the other, the
// sign-in throttle counts across both, a limit revision's re-evaluation runs once, and each reminder
// is mailed once. Both instances run their job workers and carry the same bounded read load
// throughout (8 clients, at most 3000 requests). Needs a build (npx vite build).
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { expect, test } from '@playwright/test';
import PgBoss from 'pg-boss';
import postgres from 'postgres';
import { demoUsers } from '../../seed/demo';
import { startFakeMailServer, type FakeMailServer } from '../../scripts/fake-mail';
import { freePort } from '../free-port';

const pgPort = process.env.BEAMWARDEN_PGPORT ?? '54329';
const dbName = 'beamwarden_two_instances';
const appUrl = `postgres://beamwarden_app@127.0.0.1:${pgPort}/${dbName}`;
const ownerUrl = `postgres://postgres@127.0.0.1:${pgPort}/${dbName}`;
const officer = demoUsers.find((u) => u.role === 'officer')!;
const researcher = demoUsers.find((u) => u.role === 'researcher')!;

let mail: FakeMailServer;
let mailDir = '';
const instances: { url: string; proc: ChildProcess; log: string }[] = [];
let sql: postgres.Sql;

async function startInstance(smtpPort: number) {
	const port = await freePort();
	const url = `http://127.0.0.1:${port}`;
	const proc = spawn('node', ['build'], {
		env: { ...process.env, DATABASE_URL: appUrl, HOST: '127.0.0.1', PORT: String(port), ORIGIN: url, APP_URL: url, SMTP_HOST: '127.0.0.1', SMTP_PORT: String(smtpPort), BODY_SIZE_LIMIT: '40M' },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	const inst = { url, proc, log: '' };
	proc.stdout!.on('data', (d) => (inst.log += d));
	proc.stderr!.on('data', (d) => (inst.log += d));
	for (let i = 0; i < 150; i++) {
		if ((await fetch(`${url}/api/health`).catch(() => null))?.ok) return inst;
		await sleep(200);
	}
	throw new Error(`instance on ${url} did not start:\n${inst.log.slice(-2000)}`);
}

const signIn = (base: string, who: { email: string; password: string }) =>
	fetch(`${base}/signin`, { method: 'POST', redirect: 'manual', headers: { origin: base, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' }, body: new URLSearchParams(who) });
const cookieOf = (res: Response) => res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');

test.beforeAll(async () => {
	test.setTimeout(240_000);
	execFileSync('node_modules/.bin/tsx', ['scripts/prepare-db.ts', dbName, '--fresh', '--seed'], { stdio: 'pipe' });
	sql = postgres(ownerUrl, { max: 2, onnotice: () => {} });
	mailDir = mkdtempSync(join(tmpdir(), 'beamwarden-two-instances-'));
	mail = await startFakeMailServer({ port: await freePort(), dir: mailDir });
	instances.push(await startInstance(mail.port), await startInstance(mail.port));
});

test.afterAll(async () => {
	for (const i of instances) i.proc.kill('SIGTERM');
	await mail?.close();
	await sql?.end();
	rmSync(mailDir, { recursive: true, force: true });
});

test('two instances on one PostgreSQL behave as one under the same load', async () => {
	const [a, b] = instances;
	// The bounded background load: 8 readers, alternating instances, until the checks are done.
	const viewer = cookieOf(await signIn(a.url, researcher));
	let loading = true;
	const statuses: number[] = [];
	const load = Array.from({ length: 8 }, async (_, c) => {
		const pages = ['/lasers', '/reviews', '/overview', '/api/lasers', '/inspections'];
		for (let i = 0; loading && statuses.length < 3000; i++) {
			const base = (c + i) % 2 ? a.url : b.url;
			const res = await fetch(`${base}${pages[(c + i) % pages.length]}`, { headers: { cookie: viewer } });
			await res.arrayBuffer();
			statuses.push(res.status);
		}
	});

	// 1. A session made on one instance works on the other, and ends on both.
	const made = await signIn(a.url, officer);
	expect(made.status).toBe(303);
	const session = cookieOf(made);
	const me = await fetch(`${b.url}/api/me`, { headers: { cookie: session } });
	expect(me.status).toBe(200);
	expect((await me.json()).email).toBe(officer.email);
	const other = cookieOf(await signIn(b.url, officer));
	expect((await fetch(`${b.url}/signout`, { method: 'POST', redirect: 'manual', headers: { cookie: other, origin: b.url, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' } })).status).toBe(303);
	expect((await fetch(`${a.url}/api/me`, { headers: { cookie: other } })).status, 'signed out on one, gone on the other').toBe(401);

	// 2. The sign-in throttle counts failures on both instances together.
	const target = demoUsers.find((u) => u.role === 'manager')!;
	for (let i = 0; i < 5; i++) expect((await signIn(i % 2 ? a.url : b.url, { email: target.email, password: `wrong ${i}` })).status).toBe(400);
	expect((await signIn(a.url, target)).status, 'throttled on one instance').toBe(429);
	expect((await signIn(b.url, target)).status, 'throttled on the other').toBe(429);

	// 3. A limit revision's re-evaluation runs once: a new limit covering every path makes them all
	// stale; the two instances' workers re-assess each path exactly once.
	const since = new Date();
	const [{ paths }] = await sql`SELECT count(*)::int AS paths FROM beam_path`;
	const created = await fetch(`${a.url}/api/limits`, {
		method: 'POST',
		headers: { cookie: session, origin: a.url, 'content-type': 'application/json' },
		body: JSON.stringify({ label: 'Two-instance test limit', tissue: 'eye', wavelengthMin: '180 nm', wavelengthMax: '1 mm', durationMin: '1 fs', durationMax: '30000 s', quantity: 'irradiance', k: '10 W/m²', n: '0', limitingAperture: '7 mm', pulseBasis: 'continuous', pulseTrainExponent: '', citation: 'test fixture', demonstration: true, validFrom: '', validUntil: '', version: 0 })
	});
	expect(created.status).toBe(201);
	// both instances' workers poll the queue; whichever takes the job re-assesses
	for (let i = 0; i < 120; i++) {
		const [{ stale }] = await sql`SELECT count(*)::int AS stale FROM beam_path WHERE stale`;
		if (stale === 0) break;
		await sleep(500);
	}
	const perPath = await sql`SELECT path_id, count(*)::int AS n FROM assessment WHERE created_at >= ${since} AND cause <> 'save' GROUP BY path_id`;
	expect(perPath.length, 'every path re-assessed').toBe(paths);
	expect(perPath.filter((r) => r.n !== 1), 'no path assessed twice for one revision').toEqual([]);

	// 4. Each reminder is mailed once: the daily run asked of both instances' workers at once, and run
	// by two more processes at the same moment, all against one ledger.
	const boss = new PgBoss({ connectionString: appUrl, max: 2, supervise: false, schedule: false });
	boss.on('error', () => {});
	await boss.start();
	await Promise.all([boss.send('mail-daily', {}), boss.send('mail-deliver', {})]);
	const runner = () => new Promise<number>((resolve) => spawn('node_modules/.bin/tsx', ['scripts/run-reminders.ts', '--deliver'], { env: { ...process.env, DATABASE_URL: appUrl, SMTP_HOST: '127.0.0.1', SMTP_PORT: String(mail.port), APP_URL: a.url }, stdio: 'ignore' }).on('exit', (code) => resolve(code ?? 1)));
	expect(await Promise.all([runner(), runner()])).toEqual([0, 0]);
	await Promise.all([boss.send('mail-daily', {}), boss.send('mail-deliver', {})]);
	await boss.stop({ graceful: false, wait: true });
	let settled = -1;
	for (let i = 0; i < 60; i++) {
		const [{ pending }] = await sql`SELECT count(*)::int AS pending FROM mail_outbox WHERE status IN ('pending', 'sending')`;
		if (pending === 0 && mail.received() === settled) break;
		settled = mail.received();
		await sleep(1000);
	}
	const [{ sent }] = await sql`SELECT count(*)::int AS sent FROM mail_outbox WHERE status = 'sent'`;
	expect(sent, 'reminders were mailed').toBeGreaterThan(0);
	expect(mail.received(), 'no mail sent twice').toBe(mail.stored());
	expect(mail.stored()).toBe(sent);

	loading = false;
	await Promise.all(load);
	expect(statuses.length).toBeGreaterThan(50);
	expect(statuses.filter((s) => s !== 200), 'the background load was served').toEqual([]);
	for (const i of instances) expect(i.proc.exitCode, i.log.slice(-1000)).toBeNull();
	console.log(`two instances: ${statuses.length} background requests, ${paths} paths re-assessed once each, ${sent} mails sent once each`);
});
