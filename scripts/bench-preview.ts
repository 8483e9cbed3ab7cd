/**
 * Server time of POST /api/assessments/preview for a 6-element, 3-point path, measured in-process:
 * the route's own handler is called with a real Request against a real PostgreSQL holding the demo
 * limit library (the limits are read from the database on every call, as in production), and the
 * time runs until its Response (JSON written) is ready. Not a timed test: the figures go in the notes.
 *
 *   npm run bench:preview            (-- --runs=400 --reuse keeps the prepared database)
 * Target: p95 under 20 ms.
 */
import { execFileSync } from 'node:child_process';
import { performance } from 'node:perf_hooks';
import os from 'node:os';

const args = process.argv.slice(2);
const RUNS = Number(args.find((a) => a.startsWith('--runs='))?.slice(7) ?? 400);
const port = process.env.BEAMWARDEN_PGPORT ?? '54329';
const dbName = 'beamwarden_bench';
execFileSync('bash', ['scripts/db.sh', 'start'], { stdio: 'inherit' });
if (!args.includes('--reuse')) execFileSync('npx', ['tsx', 'scripts/prepare-db.ts', dbName, '--fresh', '--seed'], { stdio: 'inherit' });
process.env.DATABASE_URL = `postgres://beamwarden_app@127.0.0.1:${port}/${dbName}`;

const { POST } = await import('../src/routes/api/assessments/preview/+server');
const { client } = await import('../src/lib/server/db');

const blank = { label: '', length: null, transmission: null, reflectance: null, magnification: null, focalLength: null, coreDiameter: null, numericalAperture: null, couplingTransmission: null };
const body = JSON.stringify({
	path: {
		lines: [{ mode: 'repetitive', wavelength: '1.064e-6', pulseEnergy: '0.85', pulseDuration: '8e-9', repetitionRate: '10', beamDiameter: '0.009', beamDiameterDefinition: '1/e2', divergence: '0.0005', divergenceDefinition: '1/e2', beamQuality: '2' }],
		elements: [
			{ ...blank, kind: 'propagate', length: '0.5' },
			{ ...blank, kind: 'expander', magnification: '2' },
			{ ...blank, kind: 'propagate', length: '1.5' },
			{ ...blank, kind: 'transmission', transmission: '0.5', label: 'splitter' },
			{ ...blank, kind: 'lens', focalLength: '0.5' },
			{ ...blank, kind: 'enclosure', length: '2' }
		],
		points: [
			{ id: 'a', label: 'beside the expander', kind: 'intrabeam', tissue: 'eye', position: '1', exposureDuration: '10' },
			{ id: 'b', label: 'at the splitter', kind: 'intrabeam', tissue: 'skin', position: '2', exposureDuration: '10' },
			{ id: 'c', label: 'wall', kind: 'diffuse', tissue: 'eye', position: '2', exposureDuration: '10', reflectance: '0.5', viewingAngle: '0.3', viewingDistance: '1' }
		],
		nohdExposureDuration: '10'
	}
});
const locals = { user: { id: 'bench', email: 'bench@example', name: 'Bench', role: 'researcher', disabled: false }, session: null } as unknown as App.Locals;
const call = async () => {
	const request = new Request('http://127.0.0.1/api/assessments/preview', { method: 'POST', headers: { 'content-type': 'application/json' }, body });
	const t = performance.now();
	const res = await POST({ locals, request, route: { id: '/api/assessments/preview' } } as never);
	const text = await res.text();
	const ms = performance.now() - t;
	if (res.status !== 200) throw new Error(`preview answered ${res.status}: ${text.slice(0, 300)}`);
	return { ms, bytes: text.length };
};

for (let i = 0; i < 30; i++) await call(); // warm-up
const times: number[] = [];
let bytes = 0;
for (let i = 0; i < RUNS; i++) {
	const r = await call();
	times.push(r.ms);
	bytes = r.bytes;
}
await client.end();
times.sort((a, b) => a - b);
const at = (p: number) => times[Math.min(times.length - 1, Math.floor((p / 100) * times.length))];
console.log(`POST /api/assessments/preview, 6 elements, 3 points, demo limit library (${RUNS} calls in-process after 30 warm-up; ${(bytes / 1024).toFixed(0)} kB answer)`);
console.log(`machine: ${os.cpus().length} × ${os.cpus()[0]?.model ?? '?'}, load ${os.loadavg().map((l) => l.toFixed(2)).join(' ')}`);
console.log(`  p50 ${at(50).toFixed(1)} ms, p95 ${at(95).toFixed(1)} ms, p99 ${at(99).toFixed(1)} ms, max ${times[times.length - 1].toFixed(1)} ms; target p95 < 20 ms: ${at(95) < 20 ? 'met' : 'NOT met'}`);
