// The engine rebuild against the real database: paths last assessed by the 1.x engine are brought to
// 2.0 by the re-evaluation; a path whose answer changed goes back to the officer with the diff, one
// whose answer held keeps its clearance; stored snapshots stay as they were.
import { eq, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as paths from '$lib/server/paths';
import { ENGINE_VERSION } from '$lib/server/hazard';
import { diffInputs, diffResults } from '$lib/server/snapshotDiff';
import type { Scope } from '$lib/server/auth/scope';
import { lasers, laserForm, limitForm, limits, makeLab, makeUser, must, pathForm, scopeFor } from './factories';

const OLD = 'beamwarden-hazard 1.0.0';
let lab: { id: string };
let researcher: Scope;
let officer: Scope;

beforeAll(async () => {
	lab = await makeLab();
	researcher = await scopeFor(await makeUser('researcher', [lab.id]));
	officer = await scopeFor(await makeUser('officer'));
	// A band of its own (1300–1340 nm), so no other test's limits apply: a single-pulse limit entered
	// without a pulse-train rule, and a continuous one (test fixtures, not values from any code).
	const band = { wavelengthMin: '1300 nm', wavelengthMax: '1340 nm' };
	must(await limits.create(officer.userId, limitForm({ label: `Engine test single pulse ${Date.now()}`, ...band, durationMin: '1 ns', durationMax: '50 µs', k: '0.05 J/m²', n: '0', pulseBasis: 'single_pulse' })));
	must(await limits.create(officer.userId, limitForm({ label: `Engine test continuous ${Date.now()}`, ...band, durationMin: '1 ms', durationMax: '30000 s', quantity: 'irradiance', k: '50 W/m²', n: '0' })));
	await paths.reassessStale(1000);
});

/** A saved path of a 1320 nm line, then made to look as if the 1.x engine had assessed it. */
async function pathAssessedByOldEngine(line: Parameters<typeof laserForm>[1], oldVerdict: 'within_limit' | 'exceeds_limit', state: 'not_needed' | 'cleared') {
	const created = must(await lasers.create(researcher, laserForm(lab.id, { wavelength: '1320 nm', ...line })));
	const found = must(await lasers.find(researcher, created.id));
	const form = pathForm(found.detail.lines[0].id, { nohdExposureDuration: '10 s' });
	form.points = form.points.map((p) => ({ ...p, exposureDuration: '10 s' }));
	const saved = must(await paths.save(researcher, created.id, null, form));
	const detail = must(await paths.find(officer, saved.id)).detail;
	const snapshot = detail.latest!;
	const old = { ...(snapshot.result as Record<string, unknown>), engineVersion: OLD, verdict: oldVerdict };
	await db.update(table.assessment).set({ engineVersion: OLD, verdict: oldVerdict, result: old }).where(eq(table.assessment.id, snapshot.id));
	await db
		.update(table.beamPath)
		.set({ verdict: oldVerdict, flagged: oldVerdict !== 'within_limit', reviewState: state, awaitingSince: null, clearedAssessmentId: state === 'cleared' ? snapshot.id : null })
		.where(eq(table.beamPath.id, saved.id));
	return { pathId: saved.id, oldSnapshotId: snapshot.id, newVerdict: snapshot.verdict };
}

describe('bringing stored paths to the new engine', () => {
	it('marks every live path last assessed by another engine stale, re-evaluates it, and keeps the old snapshot as it was', async () => {
		// 100 Hz pulses whose single-pulse limit has no pulse-train rule: 1.x called this within limit
		// (the train check was skipped); 2.0 calls it incomplete.
		const changed = await pathAssessedByOldEngine({ mode: 'repetitive', power: '', pulseEnergy: '1 µJ', pulseDuration: '10 ns', repetitionRate: '100 Hz' }, 'within_limit', 'cleared');
		expect(changed.newVerdict).toBe('incomplete');
		// A continuous line whose answer is the same under both engines.
		const same = await pathAssessedByOldEngine({ mode: 'continuous', power: '5 W' }, 'exceeds_limit', 'cleared');
		expect(same.newVerdict).toBe('exceeds_limit');

		expect(await paths.markStaleByEngine()).toBeGreaterThanOrEqual(2);
		const staleNow = await db.select({ id: table.beamPath.id, stale: table.beamPath.stale }).from(table.beamPath).where(sql`${table.beamPath.id} IN (${changed.pathId}, ${same.pathId})`);
		expect(staleNow.every((r) => r.stale)).toBe(true);
		const [marked] = await db.select().from(table.assessment).where(eq(table.assessment.id, changed.oldSnapshotId));
		expect(marked.staleReason).toContain(ENGINE_VERSION);
		await paths.reassessStale(1000);

		// The changed verdict is back on the review desk, still pointing at the clearance, with the diff.
		const after = must(await paths.find(officer, changed.pathId)).detail;
		expect(after.path.stale).toBe(false);
		expect(after.latest!.engineVersion).toBe(ENGINE_VERSION);
		expect(after.latest!.cause).toBe('engine');
		expect(after.latest!.verdict).toBe('incomplete');
		expect(after.path.reviewState).toBe('awaiting_review');
		expect(after.path.clearedAssessmentId).toBe(changed.oldSnapshotId);
		const [old] = await db.select().from(table.assessment).where(eq(table.assessment.id, changed.oldSnapshotId));
		expect(old.engineVersion).toBe(OLD);
		expect(diffInputs(old.inputs, after.latest!.inputs)).toEqual([]);
		expect(diffResults(old.result, after.latest!.result)).toEqual(
			expect.arrayContaining([
				{ where: 'Hazard engine', before: OLD, after: ENGINE_VERSION },
				{ where: 'Verdict', before: 'within limit', after: 'incomplete' }
			])
		);

		// The unchanged answer keeps its clearance.
		const kept = must(await paths.find(officer, same.pathId)).detail;
		expect(kept.latest!.engineVersion).toBe(ENGINE_VERSION);
		expect(kept.path.reviewState).toBe('cleared');

		// Nothing left to bring over.
		expect(await paths.markStaleByEngine()).toBe(0);
	});

	it('leaves retired paths as they are', async () => {
		const p = await pathAssessedByOldEngine({ mode: 'continuous', power: '5 W' }, 'exceeds_limit', 'not_needed');
		await db.update(table.beamPath).set({ retired: true }).where(eq(table.beamPath.id, p.pathId));
		await paths.markStaleByEngine();
		const [row] = await db.select().from(table.beamPath).where(eq(table.beamPath.id, p.pathId));
		expect(row.stale).toBe(false);
	});
});
