// Page benchmark (not a timed test): the signed-in pages people wait for, under 20 connections on
// loopback, as requests per second relative to the bare health endpoint measured in the same run,
// and p95 latency. On the scale seed: 5,000 lasers and 2,000 paths awaiting review.
//   npm run bench:pages                 (build first: npx vite build)
//   npm run bench:pages -- --reuse      keep the multiplied database of a previous run
//   npm run bench:pages -- --seconds=20 the duration of each measurement (default 10)
import { execFileSync, spawn } from 'node:child_process';
import { setTimeout as sleep } from 'node:timers/promises';
import autocannon from 'autocannon';
import { demoUsers } from '../seed/demo';
import { freePort } from '../tests/free-port';

const pgPort = process.env.BEAMWARDEN_PGPORT ?? '54329';
const dbName = 'beamwarden_bench';
const seconds = Number(process.argv.find((a) => a.startsWith('--seconds='))?.slice(10) ?? 10);
const connections = 20;
const env = { ...process.env, DATABASE_URL: `postgres://beamwarden_app@127.0.0.1:${pgPort}/${dbName}` };

execFileSync('bash', ['scripts/db.sh', 'start'], { stdio: 'inherit' });
if (!process.argv.includes('--reuse')) {
	execFileSync('npx', ['tsx', 'scripts/prepare-db.ts', dbName, '--fresh', '--seed'], { stdio: 'inherit' });
	execFileSync('npx', ['tsx', 'seed/multiply.ts', '5000', '4', '2000'], { stdio: 'inherit', env });
}

const port = await freePort();
const base = `http://127.0.0.1:${port}`;
const server = spawn('node', ['build'], { env: { ...env, HOST: '127.0.0.1', PORT: String(port), ORIGIN: base, BEAMWARDEN_JOBS: 'off' }, stdio: 'ignore' });

type Figure = { path: string; rps: number; p50: number; p95: number; non2xx: number };

/** One bounded measurement: `connections` connections for `seconds` s, every latency kept for the p95. */
async function measure(path: string, cookie: string, duration = seconds): Promise<Figure> {
	const latencies: number[] = [];
	const instance = autocannon({ url: `${base}${path}`, connections, duration, headers: cookie ? { cookie } : {} });
	instance.on('response', (_client: unknown, _status: number, _bytes: number, ms: number) => latencies.push(ms));
	const result = await instance;
	latencies.sort((a, b) => a - b);
	const at = (p: number) => latencies[Math.min(latencies.length - 1, Math.floor(p * latencies.length))] ?? NaN;
	return { path, rps: result.requests.average, p50: at(0.5), p95: at(0.95), non2xx: result.non2xx };
}

try {
	for (let i = 0; i < 100 && !(await fetch(`${base}/api/health`).catch(() => null))?.ok; i++) await sleep(200);
	const officer = demoUsers.find((u) => u.role === 'officer')!;
	const signIn = await fetch(`${base}/signin`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: base, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams({ email: officer.email, password: officer.password })
	});
	const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
	const first = await (await fetch(`${base}/lasers`, { headers: { cookie } })).text();
	const rows = (first.match(/<tr>/g) ?? []).length;
	console.log(`\nThe register page is server-rendered with its first page of lasers: ${rows - 1} rows in the first response.`);

	const pages = ['/api/health', '/lasers', '/reviews', '/api/lasers', '/overview'];
	for (const p of pages) await measure(p, p === '/api/health' ? '' : cookie, 2); // warm-up
	const figures: Figure[] = [];
	for (const p of pages) figures.push(await measure(p, p === '/api/health' ? '' : cookie));
	const health = figures[0].rps;
	console.log(`\n${connections} connections, ${seconds} s each, officer signed in (every lab), 5,000 lasers, 2,000 paths awaiting review:`);
	console.log('  page            req/s   ratio to /api/health   p50 ms   p95 ms   non-2xx');
	for (const f of figures)
		console.log(`  ${f.path.padEnd(14)} ${f.rps.toFixed(0).padStart(6)}   ${(f.rps / health).toFixed(2).padStart(20)}   ${f.p50.toFixed(0).padStart(6)}   ${f.p95.toFixed(0).padStart(6)}   ${String(f.non2xx).padStart(7)}`);
	console.log('\nTargets: /lasers and /reviews at ≥ 0.30 of /api/health and p95 under 100 ms.');
} finally {
	server.kill('SIGTERM');
}
