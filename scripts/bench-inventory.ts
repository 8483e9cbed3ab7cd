// Inventory benchmark (not a timed test): the inventory query of GET /api/lasers on a register
// multiplied to campus scale, timed in-process (server time) and over HTTP against the built app.
//   npm run bench:inventory            (npm run bench:inventory -- --reuse keeps the multiplied database)
import { execFileSync, spawn } from 'node:child_process';
import { performance } from 'node:perf_hooks';
import { freePort } from '../tests/free-port';

const port = process.env.BEAMWARDEN_PGPORT ?? '54329';
const dbName = 'beamwarden_scale';
const env = { ...process.env, DATABASE_URL: `postgres://beamwarden_app@127.0.0.1:${port}/${dbName}` };
execFileSync('bash', ['scripts/db.sh', 'start'], { stdio: 'inherit' });
if (!process.argv.includes('--reuse')) {
	execFileSync('npx', ['tsx', 'scripts/prepare-db.ts', dbName, '--fresh', '--seed'], { stdio: 'inherit' });
	execFileSync('npx', ['tsx', 'seed/multiply.ts', '5000', '4'], { stdio: 'inherit', env });
}

process.env.DATABASE_URL = env.DATABASE_URL;
const { db, client } = await import('../src/lib/server/db');
const lasers = await import('../src/lib/server/lasers');
const { sql } = await import('drizzle-orm');
const labs = await db.execute<{ id: string }>(sql`SELECT id FROM lab ORDER BY code`);
const all = { userId: 'bench', role: 'officer' as const, labIds: 'all' as const, editLabIds: 'all' as const };
const one = { userId: 'bench', role: 'researcher' as const, labIds: [labs[0].id], editLabIds: [labs[0].id] };

const queries: [string, Parameters<typeof lasers.inventory>[0], Parameters<typeof lasers.inventory>[1]][] = [
	['officer, first page, sort by model', all, { sort: 'model', dir: 'asc', page: 1, pageSize: 25 }],
	['officer, class 4 + visible band', all, { laserClass: '4', band: 'visible', sort: 'updated', dir: 'desc', page: 1, pageSize: 25 }],
	['officer, search "Cobalt", page 3', all, { q: 'Cobalt', sort: 'maker', dir: 'asc', page: 3, pageSize: 25 }],
	['officer, lab filter, in storage', all, { labId: labs[1].id, status: 'in_storage', sort: 'lab', dir: 'asc', page: 1, pageSize: 50 }],
	['researcher (one lab), NIR band, page 10', one, { band: 'nir', sort: 'model', dir: 'asc', page: 10, pageSize: 25 }]
];

const pct = (xs: number[], p: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor((p / 100) * xs.length))];
console.log('\nIn-process server time of lasers.inventory (20 runs each after 3 warm-up runs):');
for (const [label, scope, q] of queries) {
	for (let i = 0; i < 3; i++) await lasers.inventory(scope, q);
	const times: number[] = [];
	let total = 0;
	for (let i = 0; i < 20; i++) {
		const t = performance.now();
		total = (await lasers.inventory(scope, q)).total;
		times.push(performance.now() - t);
	}
	console.log(`  ${label.padEnd(44)} p50 ${pct(times, 50).toFixed(1)} ms  p95 ${pct(times, 95).toFixed(1)} ms  (${total} matching)`);
}
await client.end();

// Over HTTP, against the built server (build it first: npx vite build).
const appPort = await freePort();
const base = `http://127.0.0.1:${appPort}`;
const server = spawn('node', ['build'], { env: { ...env, HOST: '127.0.0.1', PORT: String(appPort), ORIGIN: base, BEAMWARDEN_JOBS: 'off' }, stdio: 'ignore' });
try {
	for (let i = 0; i < 50; i++) {
		try {
			if ((await fetch(`${base}/api/health`)).ok) break;
		} catch {
			/* not up yet */
		}
		await new Promise((r) => setTimeout(r, 200));
	}
	const signIn = await fetch(`${base}/signin`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: base, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
		body: 'email=helen.achter%40northgate.example&password=quiet-harbour-prism-63'
	});
	const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0];
	const times: number[] = [];
	for (let i = 0; i < 23; i++) {
		const t = performance.now();
		const r = await fetch(`${base}/api/lasers?class=4&band=visible&sort=updated&dir=desc&page=2`, { headers: { cookie } });
		await r.json();
		if (i >= 3) times.push(performance.now() - t);
	}
	console.log(`\nHTTP GET /api/lasers (filtered page, officer), round trip on loopback: p50 ${pct(times, 50).toFixed(1)} ms  p95 ${pct(times, 95).toFixed(1)} ms`);
} finally {
	server.kill('SIGTERM');
}
