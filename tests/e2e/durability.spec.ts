// Acknowledged writes survive a database restart under load. A second PostgreSQL cluster and a
// second server (the built app) are started for this test alone, so that stopping the database
// disturbs no other test. While the database is down the app answers 503 with a message, never a
// 500, and does not exit; once it is back the app recovers by itself; every write it acknowledged
// (201) is in the database afterwards, each with its audit row.
import { execFile, execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { promisify } from 'node:util';
import { rmSync } from 'node:fs';
import { setTimeout as sleep } from 'node:timers/promises';
import { expect, test } from '@playwright/test';
import postgres from 'postgres';
import { demoUsers } from '../../seed/demo';
import { freePort } from '../free-port';

const PG_DIR = '.data/durability';
// Both ports are free ones, chosen when the test starts.
let PG_PORT = '';
let APP_PORT = 0;
let app = '';
let pgEnv: NodeJS.ProcessEnv = {};
const db = (cmd: 'start' | 'stop') => execFileSync('bash', ['scripts/db.sh', cmd], { env: pgEnv, stdio: 'pipe' });
/** The same, without blocking this process: the clients keep timing their answers meanwhile. */
const dbAsync = (cmd: 'start' | 'stop') => promisify(execFile)('bash', ['scripts/db.sh', cmd], { env: pgEnv });

let server: ChildProcess;
let serverLog = '';
let cookie = '';
let labId = '';

async function waitForHealth(status: number, seconds: number) {
	for (let i = 0; i < seconds * 5; i++) {
		const res = await fetch(`${app}/api/health`).catch(() => null);
		if (res?.status === status) return;
		await sleep(200);
	}
	throw new Error(`/api/health never answered ${status}; server log:\n${serverLog.slice(-2000)}`);
}

test.describe.configure({ timeout: 180_000 });

test.beforeAll(async () => {
	test.setTimeout(180_000);
	PG_PORT = String(await freePort());
	APP_PORT = await freePort();
	app = `http://127.0.0.1:${APP_PORT}`;
	pgEnv = { ...process.env, BEAMWARDEN_PGPORT: PG_PORT, BEAMWARDEN_PGDIR: `${process.cwd()}/${PG_DIR}` };
	rmSync(PG_DIR, { recursive: true, force: true });
	db('start');
	execFileSync('node_modules/.bin/tsx', ['scripts/prepare-db.ts', 'beamwarden_durability', '--fresh', '--seed'], { env: pgEnv, stdio: 'pipe' });
	server = spawn('node', ['build'], {
		env: {
			...process.env,
			HOST: '127.0.0.1',
			PORT: String(APP_PORT),
			ORIGIN: app,
			APP_URL: app,
			DATABASE_URL: `postgres://beamwarden_app@127.0.0.1:${PG_PORT}/beamwarden_durability`,
			// No mail server here: deliveries stay pending, which is not what this test is about.
			SMTP_HOST: '127.0.0.1',
			SMTP_PORT: '9'
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	server.stdout!.on('data', (d) => (serverLog += d));
	server.stderr!.on('data', (d) => (serverLog += d));
	await waitForHealth(200, 60);
	const researcher = demoUsers.find((u) => u.email.startsWith('priya'))!;
	const signIn = await fetch(`${app}/signin`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: app, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams({ email: researcher.email, password: researcher.password })
	});
	expect(signIn.status).toBe(303);
	cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
	const me = await (await fetch(`${app}/api/me`, { headers: { cookie } })).json();
	labId = me.labs.find((l: { code: string }) => l.code === 'UFL').id;
});

test.afterAll(async () => {
	if (server?.exitCode !== null) console.log(`the app exited (${server?.exitCode}); its log:\n${serverLog.slice(-3000)}`);
	server?.kill('SIGTERM');
	try {
		db('stop');
	} finally {
		rmSync(PG_DIR, { recursive: true, force: true });
	}
});

interface Answer {
	status: number;
	at: number;
	took: number;
	kind: 'write' | 'page';
	serial: string;
	id?: string;
	message?: string;
}

test('writes acknowledged before, during and after a database restart are all kept', async () => {
	const line = { label: '', mode: 'continuous', wavelength: '532 nm', wavelengthMax: '', power: '50 mW', pulseEnergy: '', pulseDuration: '', repetitionRate: '', beamDiameter: '1 mm', beamDiameterDefinition: '1/e2', divergence: '1 mrad', divergenceDefinition: '1/e2', beamQuality: '' };
	const answers: Answer[] = [];
	const t0 = Date.now();
	let running = true;
	let n = 0;
	// The same 20-way load as a busy hour: 14 writers and 6 readers of pages, each one request at a
	// time, until told to stop (bounded: at most 6000 requests).
	const writer = async (w: number) => {
		while (running && answers.length < 6000) {
			const serial = `durability-${w}-${n++}`;
			const started = Date.now();
			const res = await fetch(`${app}/api/lasers`, {
				method: 'POST',
				headers: { cookie, origin: app, 'content-type': 'application/json' },
				body: JSON.stringify({ labId, maker: 'Durability', model: 'DPSS 50', serial, laserClass: '3B', status: 'active', notes: '', line })
			}).catch(() => null);
			const body = res ? await res.json().catch(() => ({})) : {};
			answers.push({ status: res?.status ?? 0, at: Date.now() - t0, took: Date.now() - started, kind: 'write', serial, id: body.id, message: body.message });
			if (res?.status !== 201) await sleep(50);
		}
	};
	const reader = async (r: number) => {
		const pages = ['/lasers', '/reviews', '/overview'];
		for (let i = 0; running && answers.length < 6000; i++) {
			const started = Date.now();
			const res = await fetch(`${app}${pages[(r + i) % pages.length]}`, { headers: { cookie } }).catch(() => null);
			await res?.arrayBuffer().catch(() => null);
			answers.push({ status: res?.status ?? 0, at: Date.now() - t0, took: Date.now() - started, kind: 'page', serial: '' });
			if (res?.status !== 200) await sleep(50);
		}
	};
	const writers = [...Array.from({ length: 14 }, (_, w) => writer(w)), ...Array.from({ length: 6 }, (_, r) => reader(r))];

	await sleep(2000);
	const stoppedAt = Date.now() - t0;
	await dbAsync('stop'); // fast shutdown: open transactions are aborted, connections cut
	await sleep(500);
	const asked = Date.now();
	const health = await fetch(`${app}/api/health`);
	expect(health.status, 'health while the database is down').toBe(503);
	expect(Date.now() - asked, 'the 503 comes at once, not after a reconnect backoff').toBeLessThan(1000);
	const page = await fetch(`${app}/lasers`, { headers: { cookie } });
	expect(page.status, 'a page while the database is down').toBe(503);
	expect(await page.text()).toContain('unavailable for a moment');
	await sleep(2500);
	await dbAsync('start');
	const restartedAt = Date.now() - t0;
	await waitForHealth(200, 30);
	// Keep writing until every writer has been acknowledged again after the restart, then 2 s more.
	for (let i = 0; i < 150 && !answers.some((a) => a.at > restartedAt && a.status === 201); i++) await sleep(200);
	await sleep(2000);
	running = false;
	await Promise.all(writers);

	const count = (f: (a: Answer) => boolean) => answers.filter(f).length;
	const statuses = [...new Set(answers.map((a) => a.status))].sort();
	// How long each 503 kept its client waiting on the outage: from the later of its own start and
	// the moment the test asked the database to stop (time queued under load before that is not the outage's).
	const waited = (a: Answer) => a.at - Math.max(a.at - a.took, stoppedAt);
	const refused = answers.filter((a) => a.status === 503).sort((a, b) => waited(b) - waited(a));
	const slowest503 = refused.length ? waited(refused[0]) : 0;
	console.log(`slowest 503s (waited on the outage ms / whole request ms @ answered at ms): ${refused.slice(0, 5).map((a) => `${waited(a)}/${a.took}@${a.at}`).join(', ')}`);
	console.log(`durability: ${answers.length} requests, ${count((a) => a.status === 201)} writes acknowledged, ${count((a) => a.status === 503)} answered 503 (slowest ${slowest503} ms); database stopped at ${stoppedAt} ms, back at ${restartedAt} ms`);
	expect(statuses, 'only 200/201 (served, acknowledged) or 503 (unavailable), never a 500 or a dropped connection').toEqual(statuses.filter((s) => s === 200 || s === 201 || s === 503));
	// The clock starts when the test asks pg_ctl to stop, which on a busy machine takes a few hundred
	// ms more to reach the backends; the app's own part is the 300 ms grace after it notices. Typical:
	// 0.5–0.7 s; the defect this guards against was 12 s.
	expect(slowest503, 'under 20-way load each 503 comes within a second or so of the outage').toBeLessThan(2000);
	expect(count((a) => a.kind === 'page' && a.status === 503), 'pages refused while the database was down').toBeGreaterThan(0);
	expect(count((a) => a.status === 201 && a.at < stoppedAt), 'writes acknowledged before the stop').toBeGreaterThan(0);
	expect(count((a) => a.status === 503), 'writes refused while the database was down').toBeGreaterThan(0);
	expect(answers.filter((a) => a.kind === 'write' && a.status === 503).every((a) => a.message === 'The register is unavailable for a moment; try again shortly.')).toBe(true);
	expect(count((a) => a.status === 201 && a.at > restartedAt), 'writes acknowledged after the restart (recovered by itself)').toBeGreaterThan(0);
	expect(server.exitCode, 'the server kept running').toBeNull();

	// Every acknowledged write is in the database, with its audit row.
	const acknowledged = answers.filter((a) => a.kind === 'write' && a.status === 201);
	const owner = postgres(`postgres://postgres@127.0.0.1:${PG_PORT}/beamwarden_durability`, { max: 1, onnotice: () => {} });
	try {
		const ids = acknowledged.map((a) => a.id!);
		const stored = await owner`SELECT id::text, serial FROM laser WHERE id::text = ANY(${ids})`;
		const audited = await owner`SELECT DISTINCT entity_id::text AS id FROM audit_log WHERE entity_id::text = ANY(${ids})`;
		expect(new Map(stored.map((r) => [r.id, r.serial]))).toEqual(new Map(acknowledged.map((a) => [a.id, a.serial])));
		expect(audited.length).toBe(ids.length);
	} finally {
		await owner.end();
	}
});
