// The several-lines and drafts migrations on a database holding paths from before them: each path keeps
// its line, its snapshots and its review history; an incomplete one becomes a draft. Runs on a database
// of its own, migrated in two steps.
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { drizzle } from 'drizzle-orm/postgres-js';
import { migrate } from 'drizzle-orm/postgres-js/migrator';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDatabase } from './database';

const name = 'beamwarden_migration_test';
const url = testDatabase.ownerUrl.replace(/\/[^/]+$/, `/${name}`);
let folder: string;

/** A copy of the migrations folder that stops before the migration with this tag. */
function migrationsBefore(tag: string): string {
	const dir = mkdtempSync(join(tmpdir(), 'bw-migrations-'));
	cpSync('drizzle', dir, { recursive: true });
	const journalPath = join(dir, 'meta', '_journal.json');
	const journal = JSON.parse(readFileSync(journalPath, 'utf8')) as { entries: { tag: string }[] };
	const at = journal.entries.findIndex((e) => e.tag === tag);
	if (at < 0) throw new Error(`no migration ${tag}`);
	journal.entries = journal.entries.slice(0, at);
	writeFileSync(journalPath, JSON.stringify(journal));
	return dir;
}

async function migrated(migrationsFolder: string) {
	const sql = postgres(url, { max: 1, onnotice: () => {} });
	try {
		await migrate(drizzle(sql), { migrationsFolder });
	} finally {
		await sql.end();
	}
}

beforeAll(async () => {
	const admin = postgres(testDatabase.adminUrl, { max: 1, onnotice: () => {} });
	await admin.unsafe(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
	await admin.unsafe(`CREATE DATABASE ${name}`);
	await admin.end();
	folder = migrationsBefore('0007_several_lines');
});

afterAll(async () => {
	rmSync(folder, { recursive: true, force: true });
	const admin = postgres(testDatabase.adminUrl, { max: 1, onnotice: () => {} });
	await admin.unsafe(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
	await admin.end();
});

describe('migration to paths with several lines', () => {
	it('keeps every existing path on its line, with its snapshots and review history', async () => {
		await migrated(folder);
		const sql = postgres(url, { max: 1, onnotice: () => {} });
		try {
			const [lab] = await sql`INSERT INTO lab (code, name) VALUES ('MIG', 'Migration lab') RETURNING id`;
			await sql`INSERT INTO "user" (id, email, name, password_hash) VALUES ('officer-m', 'officer@migration.example', 'Officer', 'x')`;
			const [laser] = await sql`INSERT INTO laser (lab_id, maker, model, laser_class) VALUES (${lab.id}, 'Old', 'Two-path laser', '4') RETURNING id`;
			const lines = await sql`
				INSERT INTO emission_line (laser_id, mode, wavelength, power, beam_diameter, beam_diameter_definition, divergence, divergence_definition)
				VALUES (${laser.id}, 'continuous', 5.32e-7, 1, 0.002, '1/e2', 0.001, '1/e2'), (${laser.id}, 'continuous', 1.064e-6, 2, 0.002, '1/e2', 0.001, '1/e2')
				RETURNING id`;
			const paths = await sql`
				INSERT INTO beam_path (laser_id, line_id, name) VALUES (${laser.id}, ${lines[0].id}, 'green path'), (${laser.id}, ${lines[1].id}, 'infrared path')
				RETURNING id, line_id`;
			const [snapshot] = await sql`
				INSERT INTO assessment (path_id, path_version, engine_version, inputs, result, verdict, limit_versions)
				VALUES (${paths[0].id}, 1, '2.0.0', '{}'::jsonb, '{}'::jsonb, 'exceeds_limit', '[]'::jsonb) RETURNING id`;
			const [decision] = await sql`
				INSERT INTO review_decision (path_id, assessment_id, decision, decided_by, comments)
				VALUES (${paths[0].id}, ${snapshot.id}, 'cleared', 'officer-m', 'enclosed') RETURNING id`;
			await sql`INSERT INTO required_control (decision_id, kind, min_od, wavelength) VALUES (${decision.id}, 'eyewear', 4, 5.32e-7)`;
			// The second path waits for review although a point of it lacks its reflectance: it becomes a draft.
			const incomplete = { points: [{ accessible: true, missing: ['points.0.reflectance'] }, { accessible: false, missing: [] }] };
			await sql`UPDATE beam_path SET review_state = 'awaiting_review', flagged = true, awaiting_since = now() WHERE id = ${paths[1].id}`;
			await sql`INSERT INTO assessment (path_id, path_version, engine_version, inputs, result, verdict, limit_versions) VALUES (${paths[1].id}, 1, '2.0.0', '{}'::jsonb, ${sql.json(incomplete)}, 'incomplete', '[]'::jsonb)`;

			await migrated('drizzle');

			const kept = await sql`SELECT path_id, line_id, sequence FROM path_line ORDER BY sequence, line_id`;
			expect(kept.map((k) => [k.path_id, k.line_id, k.sequence]).sort()).toEqual(paths.map((p) => [p.id, p.line_id, 0]).sort());
			const [{ n }] = await sql`SELECT count(*)::int AS n FROM information_schema.columns WHERE table_name = 'beam_path' AND column_name = 'line_id'`;
			expect(n).toBe(0);
			const history = await sql`SELECT d.decision, d.comments, c.kind, c.min_od, c.wavelength, c.wavelength_max FROM review_decision d JOIN required_control c ON c.decision_id = d.id WHERE d.path_id = ${paths[0].id}`;
			expect(history).toEqual([{ decision: 'cleared', comments: 'enclosed', kind: 'eyewear', min_od: '4', wavelength: '0.000000532', wavelength_max: null }]);
			const states = await sql`SELECT id, draft, flagged, review_state FROM beam_path ORDER BY name`;
			expect(states.map((s) => [s.id, s.draft, s.flagged, s.review_state])).toEqual([
				[paths[0].id, false, false, 'not_needed'],
				[paths[1].id, true, false, 'not_needed']
			]);
			const [kept1] = await sql`SELECT count(*)::int AS n FROM assessment WHERE path_id = ${paths[0].id}`;
			expect(kept1.n).toBe(1);
			// Old limit versions read as before: no wavelength factor, an aperture that does not grow with time.
			const [cols] = await sql`SELECT column_default FROM information_schema.columns WHERE table_name = 'exposure_limit_version' AND column_name = 'wavelength_factor_kind'`;
			expect(cols.column_default).toMatch(/'none'/);
		} finally {
			await sql.end();
		}
	});
});
