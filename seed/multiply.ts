// Multiplies the demo register to campus scale for the benchmarks (the scale seed):
//   tsx seed/multiply.ts [lasers=5000] [elementsPerPath=4] [awaitingReview=0]
// awaitingReview: that many of the new paths wait on the review desk, each with an assessment
// snapshot copied from a flagged demo path's.
// Invented data in bulk (one INSERT per table per batch), in the database of DATABASE_URL.
import { sql } from 'drizzle-orm';
import { db, client } from '$lib/server/db';
import * as table from '$lib/server/db/schema';

const lasers = Number(process.argv[2] ?? 5000);
const perPath = Number(process.argv[3] ?? 4);
const awaiting = Number(process.argv[4] ?? 0);
const classes = ['3B', '4', '4', '3R', '4'] as const;
const statuses = ['active', 'active', 'active', 'in_storage', 'retired'] as const;
const lines = [
	{ wavelength: '5.32e-7', mode: 'continuous', power: '2' },
	{ wavelength: '8e-7', mode: 'repetitive', pulseEnergy: '0.002', pulseDuration: '5e-14', repetitionRate: '1000' },
	{ wavelength: '1.064e-6', mode: 'repetitive', pulseEnergy: '0.3', pulseDuration: '1e-8', repetitionRate: '10' },
	{ wavelength: '1.55e-6', mode: 'continuous', power: '10' },
	{ wavelength: '4.05e-7', mode: 'continuous', power: '0.1' },
	{ wavelength: '1.06e-5', mode: 'continuous', power: '40' }
] as const;

let seed = 42;
const rand = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);

const labs = await db.select().from(table.lab);
const [owner] = await db.select().from(table.user).limit(1);
const BATCH = 500;
let made = 0;
const started = Date.now();
while (made < lasers) {
	const n = Math.min(BATCH, lasers - made);
	await db.transaction(async (tx) => {
		const laserRows = await tx
			.insert(table.laser)
			.values(
				Array.from({ length: n }, (_, i) => ({
					labId: labs[(made + i) % labs.length].id,
					maker: ['Aster', 'Borealis', 'Cobalt', 'Dunmore', 'Eyrie'][(made + i) % 5] + ' Optics',
					model: `Model ${String.fromCharCode(65 + ((made + i) % 26))}-${(made + i) % 97}`,
					serial: `SCALE-${made + i}`,
					laserClass: classes[(made + i) % classes.length],
					status: statuses[Math.floor(rand() * statuses.length)],
					ownerId: owner.id
				}))
			)
			.returning({ id: table.laser.id });
		const lineRows = await tx
			.insert(table.emissionLine)
			.values(
				laserRows.map((l, i) => ({
					laserId: l.id,
					...lines[(made + i) % lines.length],
					beamDiameter: '0.002',
					beamDiameterDefinition: '1/e2' as const,
					divergence: '0.001',
					divergenceDefinition: '1/e2' as const
				}))
			)
			.returning({ id: table.emissionLine.id, laserId: table.emissionLine.laserId, wavelength: table.emissionLine.wavelength });
		await tx.execute(sql`UPDATE laser SET wavelength_min = l.wavelength, wavelength_max = l.wavelength FROM emission_line l WHERE l.laser_id = laser.id AND laser.serial LIKE 'SCALE-%' AND laser.wavelength_min IS NULL`);
		const pathRows = await tx
			.insert(table.beamPath)
			.values(lineRows.map((l, i) => ({ laserId: l.laserId, name: `Path ${made + i}`, verdict: rand() < 0.3 ? ('exceeds_limit' as const) : ('within_limit' as const), flagged: rand() < 0.3, stale: rand() < 0.05 })))
			.returning({ id: table.beamPath.id });
		await tx.insert(table.pathLine).values(pathRows.map((p, i) => ({ pathId: p.id, lineId: lineRows[i].id, sequence: 0 })));
		await tx.insert(table.pathElement).values(pathRows.flatMap((p) => Array.from({ length: perPath }, (_, s) => ({ pathId: p.id, sequence: s, kind: 'propagate' as const, length: '0.5' }))));
		await tx.insert(table.pointOfConcern).values(pathRows.map((p) => ({ pathId: p.id, sequence: 0, label: 'viewer', kind: 'intrabeam' as const, tissue: 'eye' as const, position: '1', exposureDuration: '0.25' })));
	});
	made += n;
}
if (awaiting > 0) {
	// Snapshots copied from a flagged demo path: the review desk shows each path's latest one.
	await db.execute(sql`
		WITH picked AS (
			SELECT p.id, row_number() OVER (ORDER BY p.id) AS n FROM beam_path p JOIN laser l ON l.id = p.laser_id
			WHERE l.serial LIKE 'SCALE-%' AND l.status <> 'retired' LIMIT ${awaiting}
		)
		UPDATE beam_path SET review_state = 'awaiting_review', flagged = true, stale = false, verdict = 'exceeds_limit',
			awaiting_since = now() - (picked.n || ' minutes')::interval
		FROM picked WHERE picked.id = beam_path.id`);
	await db.execute(sql`
		INSERT INTO assessment (path_id, path_version, engine_version, inputs, result, verdict, worst_ratio, required_od, limit_versions, cause, created_at)
		SELECT p.id, p.version, a.engine_version, a.inputs, a.result, a.verdict, a.worst_ratio, a.required_od, a.limit_versions, 'save', p.awaiting_since
		FROM beam_path p JOIN laser l ON l.id = p.laser_id,
			LATERAL (SELECT * FROM assessment WHERE verdict = 'exceeds_limit' ORDER BY created_at DESC LIMIT 1) a
		WHERE l.serial LIKE 'SCALE-%' AND p.review_state = 'awaiting_review'`);
}
await db.execute(sql`ANALYZE`);
const [{ lasers: nl, elements: ne, waiting }] = await db.execute<{ lasers: number; elements: number; waiting: number }>(
	sql`SELECT (SELECT count(*)::int FROM laser) AS lasers, (SELECT count(*)::int FROM path_element) AS elements, (SELECT count(*)::int FROM beam_path WHERE review_state = 'awaiting_review') AS waiting`
);
console.log(`Register multiplied: ${nl} lasers, ${ne} path elements, ${waiting} paths awaiting review (${((Date.now() - started) / 1000).toFixed(1)} s).`);
await client.end();
