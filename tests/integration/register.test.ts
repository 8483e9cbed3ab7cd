import { eq, sql } from 'drizzle-orm';
import postgres from 'postgres';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as paths from '$lib/server/paths';
import * as lasers from '$lib/server/lasers';
import * as limits from '$lib/server/limits';
import { currentLimits } from '$lib/server/limits';
import { stopJobs } from '$lib/server/jobs/workers';
import type { Scope } from '$lib/server/auth/scope';
import { laserForm, limitForm, makeLab, makeUser, must, pathForm, scopeFor, startJobsForTest } from './factories';

let labA: { id: string };
let labB: { id: string };
let researcher: Scope;
let officer: Scope;
let officerId: string;

beforeAll(async () => {
	// Limits are global: start this file from an empty library so verdicts are predictable.
	await db.execute(sql`UPDATE exposure_limit SET retired = true`);
	labA = await makeLab();
	labB = await makeLab();
	const r = await makeUser('researcher', [labA.id]);
	const o = await makeUser('officer');
	officerId = o.id;
	researcher = await scopeFor(r);
	officer = await scopeFor(o);
});

async function newLaser(scope: Scope, labId: string) {
	const created = await lasers.create(scope, laserForm(labId));
	if (!created.ok) throw new Error(JSON.stringify(created));
	const found = await lasers.find(scope, created.id);
	if (!found.ok) throw new Error('not found');
	return found.detail;
}

describe('lasers', () => {
	it('a researcher registers a laser in their own lab, not in another', async () => {
		const laser = await newLaser(researcher, labA.id);
		expect(laser.lines).toHaveLength(1);
		expect(Number(laser.lines[0].power)).toBe(5); // "5 W" stored in SI
		expect(Number(laser.lines[0].wavelength)).toBe(5.32e-7);
		expect(Number(laser.laser.wavelengthMin)).toBe(5.32e-7);
		expect(await lasers.create(researcher, laserForm(labB.id))).toMatchObject({ ok: false, status: 403 });
		// another lab's laser answers exactly like an unknown id: its existence never leaks
		const theirs = await lasers.find(researcher, (await newLaser(officer, labB.id)).laser.id);
		expect(theirs).toMatchObject({ ok: false, status: 404 });
		expect(theirs).toEqual(await lasers.find(researcher, crypto.randomUUID()));
	});

	it('names the field of a value that does not parse, and saves nothing', async () => {
		const before = await db.$count(table.laser);
		const bad = await lasers.create(researcher, laserForm(labA.id, { power: '5 parsecs' }));
		expect(bad).toMatchObject({ ok: false, status: 400 });
		expect(Object.keys((bad as { fields: object }).fields)).toEqual(['line.power']);
		expect(await db.$count(table.laser)).toBe(before);
	});

	it('lists one page with filters, within the researcher’s labs', async () => {
		const page = await lasers.inventory(researcher, { sort: 'model', dir: 'asc', page: 1, pageSize: 50, band: 'visible' });
		expect(page.items.length).toBeGreaterThan(0);
		expect(page.items.every((i) => i.labCode === page.items[0].labCode)).toBe(true);
		const ir = await lasers.inventory(researcher, { sort: 'model', dir: 'asc', page: 1, pageSize: 50, band: 'ir' });
		expect(ir.total).toBe(0);
		const all = await lasers.inventory(officer, { sort: 'model', dir: 'asc', page: 1, pageSize: 1 });
		expect(all.items).toHaveLength(1);
		expect(all.total).toBeGreaterThanOrEqual(2);
	});
});

describe('beam paths and their assessment snapshots', () => {
	it('another lab’s laser is unknown to a path save; a retired laser’s paths are kept but not changed, saying why', async () => {
		const theirs = await newLaser(officer, labB.id);
		expect(await paths.save(researcher, theirs.laser.id, null, pathForm(theirs.lines[0].id))).toMatchObject({ ok: false, status: 404 });
		const mine = await newLaser(researcher, labA.id);
		await db.update(table.laser).set({ status: 'retired' }).where(eq(table.laser.id, mine.laser.id));
		expect(await paths.save(researcher, mine.laser.id, null, pathForm(mine.lines[0].id))).toMatchObject({ ok: false, status: 403, message: expect.stringMatching(/retired/) });
	});

	it('saves a path with a splitter and a lens; with no applicable limit it is flagged, never within limit', async () => {
		const laser = await newLaser(researcher, labA.id);
		const saved = await paths.save(researcher, laser.laser.id, null, pathForm(laser.lines[0].id));
		expect(saved).toMatchObject({ ok: true, verdict: 'no_applicable_limit' });
		const found = await paths.find(researcher, (saved as { id: string }).id);
		if (!found.ok) throw new Error('not found');
		expect(found.detail.path.flagged).toBe(true);
		expect(found.detail.elements.map((e) => e.kind)).toEqual(['propagate', 'transmission', 'propagate', 'lens', 'propagate']);
		expect(found.detail.latest?.verdict).toBe('no_applicable_limit');
		const [entry] = await db.select().from(table.auditLog).where(eq(table.auditLog.entityId, found.detail.path.id));
		expect(entry.action).toBe('path.create');
	});

	it('refuses values the engine cannot use, naming the field, and writes nothing', async () => {
		const laser = await newLaser(researcher, labA.id);
		const form = pathForm(laser.lines[0].id);
		form.elements[1].transmission = '1.5';
		const before = await db.$count(table.beamPath);
		const r = await paths.save(researcher, laser.laser.id, null, form);
		expect(r).toMatchObject({ ok: false, status: 400 });
		expect(Object.keys((r as { fields: object }).fields)).toContain('elements.1.transmission');
		expect(await db.$count(table.beamPath)).toBe(before);
	});

	it('refuses a stale save with 409 and keeps the first', async () => {
		const laser = await newLaser(researcher, labA.id);
		const first = await paths.save(researcher, laser.laser.id, null, pathForm(laser.lines[0].id));
		if (!first.ok) throw new Error('save');
		const a = await paths.save(researcher, laser.laser.id, first.id, pathForm(laser.lines[0].id, { name: 'Renamed once', version: first.version }));
		expect(a.ok).toBe(true);
		const b = await paths.save(researcher, laser.laser.id, first.id, pathForm(laser.lines[0].id, { name: 'Renamed twice', version: first.version }));
		expect(b).toMatchObject({ ok: false, status: 409 });
		const found = await paths.find(researcher, first.id);
		expect(found.ok && found.detail.path.name).toBe('Renamed once');
	});

	it('a point key naming another path’s point is not taken over', async () => {
		const laser = await newLaser(researcher, labA.id);
		const a = await paths.save(researcher, laser.laser.id, null, pathForm(laser.lines[0].id, { name: 'Path A' }));
		const b = await paths.save(researcher, laser.laser.id, null, pathForm(laser.lines[0].id, { name: 'Path B' }));
		if (!a.ok || !b.ok) throw new Error('save');
		const pointsOf = async (id: string) => (await db.select().from(table.pointOfConcern).where(eq(table.pointOfConcern.pathId, id))).map((p) => p.id).sort();
		const bPoints = await pointsOf(b.id);
		const form = pathForm(laser.lines[0].id, { name: 'Path A', version: a.version });
		form.points[0].key = bPoints[0];
		expect(await paths.save(researcher, laser.laser.id, a.id, form)).toMatchObject({ ok: true });
		form.points[1].key = bPoints[0]; // the same key twice: refused, not a failed insert
		expect(await paths.save(researcher, laser.laser.id, a.id, { ...form, version: a.version + 1 })).toMatchObject({ ok: false, status: 400 });
		expect(await pointsOf(b.id)).toEqual(bPoints);
		expect((await pointsOf(a.id)).filter((id) => bPoints.includes(id))).toEqual([]);
	});

	it('a save waits for a line edit in progress and snapshots the edited line', async () => {
		const laser = await newLaser(researcher, labA.id);
		const first = await paths.save(researcher, laser.laser.id, null, pathForm(laser.lines[0].id));
		if (!first.ok) throw new Error('save');
		const other = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
		let saving: ReturnType<typeof paths.save> | undefined;
		let settled = false;
		try {
			await other.begin(async (t) => {
				await t`SELECT id FROM emission_line WHERE id = ${laser.lines[0].id} FOR UPDATE`;
				saving = paths.save(researcher, laser.laser.id, first.id, pathForm(laser.lines[0].id, { name: 'Saved during a line edit', version: first.version }));
				void saving.then(() => (settled = true));
				await new Promise((r) => setTimeout(r, 300));
				expect(settled, 'the save waits for the line edit').toBe(false);
				await t`UPDATE emission_line SET power = 0.05 WHERE id = ${laser.lines[0].id}`;
			});
		} finally {
			await other.end();
		}
		expect(await saving).toMatchObject({ ok: true });
		const [latest] = await db.execute<{ power: string }>(sql`SELECT inputs->'path'->'lines'->0->>'power' AS power FROM assessment WHERE path_id = ${first.id} ORDER BY created_at DESC LIMIT 1`);
		expect(Number(latest.power)).toBe(0.05);
	});

	it('a save waits for a review decision in progress and reopens the review it would otherwise hide', async () => {
		const laser = await newLaser(researcher, labA.id);
		const first = await paths.save(researcher, laser.laser.id, null, pathForm(laser.lines[0].id));
		if (!first.ok) throw new Error('save');
		const [before] = await db.select().from(table.beamPath).where(eq(table.beamPath.id, first.id));
		expect(before.reviewState).toBe('awaiting_review');
		const other = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
		let saving: ReturnType<typeof paths.save> | undefined;
		try {
			// An officer's decision, committed while the researcher's save is under way.
			await other.begin(async (t) => {
				await t`UPDATE beam_path SET review_state = 'cleared' WHERE id = ${first.id}`;
				saving = paths.save(researcher, laser.laser.id, first.id, pathForm(laser.lines[0].id, { name: 'Changed while being cleared', version: first.version }));
				await new Promise((r) => setTimeout(r, 300));
			});
		} finally {
			await other.end();
		}
		expect(await saving).toMatchObject({ ok: true });
		const [after] = await db.select().from(table.beamPath).where(eq(table.beamPath.id, first.id));
		expect(after.reviewState, 'the change after the clearance is back on the desk').toBe('awaiting_review');
	});

	it('a new limit makes covered paths stale; the re-evaluation snapshots them against it', async () => {
		const laser = await newLaser(researcher, labA.id);
		const saved = await paths.save(researcher, laser.laser.id, null, pathForm(laser.lines[0].id));
		if (!saved.ok) throw new Error('save');
		const created = must(await limits.create(officerId, limitForm()));
		expect(created.staleMarked).toBeGreaterThanOrEqual(1);
		let found = await paths.find(officer, saved.id);
		expect(found.ok && found.detail.path.stale).toBe(true);
		expect(found.ok && found.detail.latest?.stale).toBe(true);

		const { reassessed } = await paths.reassessStale();
		expect(reassessed).toBeGreaterThanOrEqual(1);
		found = await paths.find(officer, saved.id);
		if (!found.ok) throw new Error('not found');
		expect(found.detail.path.stale).toBe(false);
		// 5 W at 532 nm through a 10 % splitter is still far above any visible-band eye limit
		expect(found.detail.latest?.verdict).toBe('exceeds_limit');
		expect(found.detail.latest?.cause).toBe('reassess');
		expect(found.detail.latest?.limitVersions).toContainEqual({ id: created.id, version: '1' });

		// a revision: the officer must be looking at the current version
		expect(await limits.revise(officerId, created.id, limitForm({ version: 0 }))).toMatchObject({ ok: false, status: 409 });
		const revised = await limits.revise(officerId, created.id, limitForm({ version: 1, k: '10 J/m²' }));
		expect(revised).toMatchObject({ ok: true, version: 2 });
		found = await paths.find(officer, saved.id);
		expect(found.ok && found.detail.path.stale).toBe(true);
		await paths.reassessStale();
		found = await paths.find(officer, saved.id);
		expect(found.ok && found.detail.latest?.limitVersions).toContainEqual({ id: created.id, version: '2' });
	});

	it('a changed line makes its paths stale and asks the re-evaluation to run now, as a limit change does', { timeout: 90_000 }, async () => {
		const laser = await newLaser(researcher, labA.id);
		const saved = must(await paths.save(researcher, laser.laser.id, null, pathForm(laser.lines[0].id)));
		const staleOf = async () => (await db.select({ stale: table.beamPath.stale }).from(table.beamPath).where(eq(table.beamPath.id, saved.id)))[0].stale;
		const until = async (check: () => Promise<boolean>, ms: number) => {
			const end = Date.now() + ms;
			while (Date.now() < end) {
				if (await check()) return true;
				await new Promise((r) => setTimeout(r, 250));
			}
			return false;
		};
		await startJobsForTest();
		try {
			// The start-up run clears whatever earlier tests left stale; wait until it has finished and the queue is idle.
			const idle = async () => {
				const [q] = await db.execute<{ waiting: number; done: number }>(
					sql`SELECT count(*) FILTER (WHERE state IN ('created', 'retry', 'active'))::int AS waiting, count(*) FILTER (WHERE state = 'completed')::int AS done FROM pgboss.job WHERE name = 'reassess-paths'`
				);
				return q.waiting === 0 && q.done > 0;
			};
			expect(await until(idle, 40_000)).toBe(true);
			// Keep clear of the five-minute schedule, so only a nudge can explain a prompt run.
			const toBoundary = 300_000 - (Date.now() % 300_000);
			if (toBoundary < 30_000) await new Promise((r) => setTimeout(r, toBoundary + 2_000));
			const { version, id } = laser.lines[0];
			const changed = await lasers.saveLine(researcher, laser.laser.id, id, { ...laserForm(labA.id, { power: '6 W' }).line, version });
			expect(changed).toMatchObject({ ok: true });
			expect(await staleOf(), 'the change made the path stale').toBe(true);
			expect(await until(async () => !(await staleOf()), 20_000), 're-evaluated within 20 s of the change').toBe(true);
		} finally {
			await stopJobs();
		}
	});

	it('a malformed limit id is “no such limit”, not a database error', async () => {
		expect(await limits.revise(officerId, 'abc', limitForm())).toMatchObject({ ok: false, status: 404 });
		expect(await limits.retire(officerId, 'abc', 1)).toMatchObject({ ok: false, status: 404 });
	});

	it('a limit that lapses or comes into force by date makes the paths it covers stale, once', async () => {
		await paths.reassessStale(1000);
		// A narrow band of its own, so that only this test's path is covered.
		const band = { wavelengthMin: '455 nm', wavelengthMax: '456 nm' };
		const lapsing = must(await limits.create(officerId, limitForm({ label: 'Test fixture: lapses', ...band, validUntil: '2030-01-01' })));
		const coming = must(await limits.create(officerId, limitForm({ label: 'Test fixture: comes into force', ...band, validFrom: '2030-06-01' })));
		const laser = await newLaser(researcher, labA.id);
		const lineId = laser.lines[0].id;
		await db.update(table.emissionLine).set({ wavelength: '4.555e-7' }).where(eq(table.emissionLine.id, lineId));
		const saved = await paths.save(researcher, laser.laser.id, null, pathForm(lineId));
		if (!saved.ok) throw new Error(JSON.stringify(saved));
		const stale = async () => (await db.select({ stale: table.beamPath.stale }).from(table.beamPath).where(eq(table.beamPath.id, saved.id)))[0].stale;
		// In force through its last day (UTC), gone the day after.
		const inForce = async (iso: string) => (await currentLimits(db, new Date(iso))).map((l) => l.limitId);
		expect(await inForce('2030-01-01T23:59:00Z')).toContain(lapsing.id);
		expect(await inForce('2030-01-02T00:00:01Z')).not.toContain(lapsing.id);
		expect(await inForce('2030-05-31T23:59:00Z')).not.toContain(coming.id);

		// The path was assessed now (2026 or so): both boundaries lie ahead.
		await paths.markStaleByLimitDates(new Date('2030-01-01T12:00:00Z'));
		expect(await stale()).toBe(false);
		expect(await paths.markStaleByLimitDates(new Date('2030-01-02T00:00:01Z'))).toBeGreaterThanOrEqual(1);
		expect(await stale()).toBe(true);
		expect(await paths.markStaleByLimitDates(new Date('2030-01-02T00:00:01Z'))).toBe(0); // already stale: nothing new
		const [entry] = await db.select().from(table.auditLog).where(eq(table.auditLog.action, 'limits.dates-passed'));
		expect(entry.after).toMatchObject({ paths: expect.arrayContaining([saved.id]) });
		for (const id of [lapsing.id, coming.id]) await limits.retire(officerId, id, 1);
	});

	it('an infrared limit leaves a green path alone', async () => {
		await paths.reassessStale();
		const r = must(await limits.create(officerId, limitForm({ label: 'Test fixture: far infrared', wavelengthMin: '1.4 µm', wavelengthMax: '1 mm' })));
		expect(r.staleMarked).toBe(0);
	});
});
