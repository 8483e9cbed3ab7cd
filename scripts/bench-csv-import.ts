// Register import benchmark (not a timed test): a generated 5,000-row CSV (lasers of one to three
// lines) checked and staged in-process, then imported through the pg-boss job as the app runs it,
// the progress read the way the import page reads it. Target: under 30 s from start to done.
//   npm run bench:csv-import           (-- --rows=N for another size)
import { execFileSync } from 'node:child_process';
import { performance } from 'node:perf_hooks';

const rows = Number(process.argv.find((a) => a.startsWith('--rows='))?.slice(7) ?? 5000);
const port = process.env.BEAMWARDEN_PGPORT ?? '54329';
const dbName = 'beamwarden_bench_csv';
execFileSync('bash', ['scripts/db.sh', 'start'], { stdio: 'inherit' });
execFileSync('npx', ['tsx', 'scripts/prepare-db.ts', dbName, '--fresh', '--seed'], { stdio: 'inherit' });
process.env.DATABASE_URL = `postgres://beamwarden_app@127.0.0.1:${port}/${dbName}`;

const { db, client } = await import('../src/lib/server/db');
const table = await import('../src/lib/server/db/schema');
const { eq, sql } = await import('drizzle-orm');
const registerImport = await import('../src/lib/server/registerImport');
const jobs = await import('../src/lib/server/jobs');
const { queues } = await import('../src/lib/server/jobs/queues');
const { writeCsv } = await import('../src/lib/server/csv');
const { registerColumnNames } = await import('../src/lib/registerCsv');

const [officer] = await db.select().from(table.user).where(eq(table.user.role, 'officer')).limit(1);
const labs = await db.select({ code: table.lab.code }).from(table.lab);
const scope = { userId: officer.id, role: 'officer' as const, labIds: 'all' as const, editLabIds: 'all' as const };

// Invented lasers: a third carry two or three lines (a harmonic with its fundamental).
const kinds = [
	{ mode: 'continuous', wavelength: '532 nm', power: '50 mW' },
	{ mode: 'repetitive', wavelength: '1064 nm', pulse_energy: '10 mJ', pulse_duration: '8 ns', repetition_rate: '10 Hz' },
	{ mode: 'continuous', wavelength: '633 nm', power: '5 mW' }
];
const data: string[][] = [];
for (let laser = 0; data.length < rows; laser++) {
	const lines = laser % 3 === 0 ? 1 + (laser % 2) + 1 : 1;
	for (let l = 0; l < lines && data.length < rows; l++) {
		const cell: Record<string, string> = {
			lab: labs[laser % labs.length].code,
			maker: `Bench Optics ${laser % 17}`,
			model: `Model ${laser % 41}`,
			serial: `BENCH-${String(laser).padStart(6, '0')}`,
			class: laser % 5 === 0 ? '3B' : '4',
			line_label: `line ${l + 1}`,
			emission_group: lines > 1 ? 'head' : '',
			beam_diameter: `${1 + (laser % 7)} mm`,
			divergence: '1 mrad',
			...kinds[(laser + l) % kinds.length]
		};
		data.push(registerColumnNames.map((c) => cell[c] ?? ''));
	}
}
const text = writeCsv(registerColumnNames, data);
console.log(`\nGenerated ${rows} rows (${(text.length / 1024).toFixed(0)} kB).`);

// Reading and checking alone (the same work stage() does before it writes the staging rows).
const { parseRegisterFile } = await import('../src/lib/server/registerRows');
let t = performance.now();
parseRegisterFile(text, await db.select({ id: table.lab.id, code: table.lab.code }).from(table.lab));
const readMs = performance.now() - t;
t = performance.now();
const staged = await registerImport.stage(scope, 'bench.csv', text);
if (!staged.ok) throw new Error(JSON.stringify(staged));
const checkMs = performance.now() - t;
const found = await registerImport.find(scope, staged.id);
if (!found.ok || found.record.errorRows !== 0) throw new Error(`rows with problems: ${found.ok ? found.record.errorRows : '?'}`);
console.log(`Checked and staged in ${(checkMs / 1000).toFixed(2)} s (every row through the form schemas and the engine's line rules; reading and checking alone ${(readMs / 1000).toFixed(2)} s).`);

// The job as the app runs it: pg-boss workers polling every 2 s, woken by the start.
await jobs.startJobs(process.env.DATABASE_URL);
t = performance.now();
const started = await registerImport.start(scope, staged.id, false);
if (!started.ok) throw new Error(JSON.stringify(started));
await jobs.nudge(queues.registerImport);
const seen: { at: number; processed: number; state: string }[] = [];
for (;;) {
	const p = await registerImport.progress(scope, staged.id);
	if (!p.ok) throw new Error(p.message);
	const last = seen[seen.length - 1];
	if (!last || last.processed !== p.progress.processedRows || last.state !== p.progress.state) seen.push({ at: performance.now() - t, processed: p.progress.processedRows, state: p.progress.state });
	if (p.progress.state === 'done' || p.progress.state === 'failed') break;
	if (performance.now() - t > 120_000) throw new Error('no end after 120 s');
	await new Promise((r) => setTimeout(r, 250));
}
const totalMs = performance.now() - t;
const done = await registerImport.find(scope, staged.id);
await jobs.stopJobs();
if (!done.ok) throw new Error('gone');
const r = done.record;
console.log(`Imported through the job in ${(totalMs / 1000).toFixed(2)} s (from start to done, pick-up by the worker included): ${r.state}, ${r.lasersCreated} lasers and ${r.linesAdded} lines added.`);
console.log('Progress seen (polled every 250 ms):');
for (const s of seen) console.log(`  ${(s.at / 1000).toFixed(2).padStart(6)} s  ${s.state.padEnd(8)} ${s.processed} / ${rows}`);
const [{ batches }] = await db.execute<{ batches: number }>(sql`SELECT count(*)::int AS batches FROM audit_log WHERE action = 'register_import.batch' AND entity_id = ${staged.id}`);
console.log(`Batches (one transaction and one audit record each): ${batches}.`);
console.log(`Target under 30 s: ${totalMs + checkMs < 30_000 ? 'met' : 'NOT met'} (check ${(checkMs / 1000).toFixed(2)} s + import ${(totalMs / 1000).toFixed(2)} s).`);
await client.end();
