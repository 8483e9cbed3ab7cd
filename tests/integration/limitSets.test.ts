// Limit sets out and in against PostgreSQL: the demonstration set exported and imported again is a
// draft of unchanged rows whose publication changes nothing; a changed row revises exactly one limit
// and makes its paths stale as an edit by hand does; a file with errors leaves nothing behind.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, count, eq, inArray } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as limitSets from '$lib/server/limitSets';
import * as paths from '$lib/server/paths';
import { readLimitSet } from '$lib/server/limitSetFormat';
import type { LimitSetRow } from '$lib/schemas/limitSet';
import { limitFormValues } from '$lib/schemas/limits';
import type { Scope } from '$lib/server/auth/scope';
import { demoLimits } from '../../seed/demo';
import { lasers, laserForm, limits, makeLab, makeUser, must, pathForm, scopeFor } from './factories';

let officer: Scope;
let researcher: Scope;
let labId: string;

const versionCount = async () => (await db.select({ n: count() }).from(table.exposureLimitVersion))[0].n;
const importCount = async () => (await db.select({ n: count() }).from(table.limitImport))[0].n;
/** The library as data, without the export time. */
const libraryFile = async () => {
	const { exportedAt: _, ...rest } = await limitSets.document();
	return rest;
};
const stageText = async (text: string, name = 'set.json') => {
	const read = readLimitSet(text);
	if (!read.ok) throw new Error(`${read.message} ${JSON.stringify(read.problems.slice(0, 3))}`);
	return must(await limitSets.stage(officer.userId, name, read.rows)).id;
};

let inForceBefore: Set<string>;

beforeAll(async () => {
	inForceBefore = new Set((await limits.list()).filter((l) => !l.retired).map((l) => l.limitId));
	officer = await scopeFor(await makeUser('officer'));
	labId = (await makeLab()).id;
	researcher = await scopeFor(await makeUser('researcher', [labId]));
	for (const l of demoLimits) must(await limits.create(officer.userId, { ...l, noTrainCorrection: false, demonstration: true, validFrom: '', validUntil: '', version: 0 }));
});

// The test database is shared by the integration files: withdraw the limits these tests added, so
// the next file sees the library it expects.
afterAll(async () => {
	for (const l of await limits.list()) if (!l.retired && !inForceBefore.has(l.limitId)) must(await limits.retire(officer.userId, l.limitId, l.version));
});

describe('limit sets', () => {
	it('export the demonstration set, import it again: every row unchanged, and publishing changes nothing', async () => {
		const before = await libraryFile();
		expect(before.limits.length).toBeGreaterThanOrEqual(demoLimits.length);
		const versions = await versionCount();
		const id = await stageText(JSON.stringify(await limitSets.document()));
		const draft = must(await limitSets.find(id)).limitImport;
		expect(draft.state).toBe('draft');
		expect(draft.plan.counts).toEqual({ new: 0, changed: 0, unchanged: before.limits.length });
		expect(draft.plan.rows.every((r) => r.status === 'unchanged' && r.changes.length === 0)).toBe(true);

		const published = must(await limitSets.publish(officer.userId, id, draft.plan.stamp));
		expect(published).toMatchObject({ created: 0, revised: 0, unchanged: before.limits.length, staleMarked: 0 });
		expect(await versionCount()).toBe(versions);
		expect(await libraryFile()).toEqual(before); // identical
		expect(must(await limitSets.find(id)).limitImport.state).toBe('published');
		const [trail] = await db.select().from(table.auditLog).where(and(eq(table.auditLog.action, 'limit_import.publish'), eq(table.auditLog.entityId, id)));
		expect(trail.actorId).toBe(officer.userId);
		// Published once only.
		expect(await limitSets.publish(officer.userId, id, draft.plan.stamp)).toMatchObject({ ok: false, status: 409 });
	});

	it('a changed row revises that one limit through the ordinary path: a new version, its beam paths stale', async () => {
		// An assessed path at 532 nm, which the visible thermal limit covers.
		const laser = must(await lasers.create(researcher, laserForm(labId, { wavelength: '532 nm' })));
		const lineId = must(await lasers.find(researcher, laser.id)).detail.lines[0].id;
		const path = must(await paths.save(researcher, laser.id, null, pathForm(lineId)));
		await db.update(table.beamPath).set({ stale: false }).where(eq(table.beamPath.id, path.id));

		const file = await limitSets.document();
		const target = file.limits.find((r) => r.label.startsWith('Eye, 400–1050 nm, 10 s – 8 h'))!;
		const rows: LimitSetRow[] = file.limits.map((r) => (r === target ? { ...r, k: '9 W/m²', citation: `${r.citation} (revised)` } : r));
		const versionsBefore = await db.select().from(table.exposureLimitVersion);
		const id = await stageText(JSON.stringify({ ...file, limits: rows }));
		const draft = must(await limitSets.find(id)).limitImport;
		expect(draft.plan.counts).toEqual({ new: 0, changed: 1, unchanged: rows.length - 1 });
		const changed = draft.plan.rows.find((r) => r.status === 'changed')!;
		expect(changed).toMatchObject({ limitId: target.id, label: target.label, changes: ['Coefficient k', 'Citation of the local code'] });

		const published = must(await limitSets.publish(officer.userId, id, draft.plan.stamp));
		expect(published).toMatchObject({ created: 0, revised: 1 });
		expect(published.staleMarked).toBeGreaterThanOrEqual(1);
		const versionsAfter = await db.select().from(table.exposureLimitVersion);
		expect(versionsAfter.length).toBe(versionsBefore.length + 1);
		const added = versionsAfter.filter((v) => !versionsBefore.some((b) => b.limitId === v.limitId && b.version === v.version));
		expect(added).toHaveLength(1);
		expect(added[0]).toMatchObject({ limitId: target.id, version: 2, k: '9', createdBy: officer.userId });
		const [pathNow] = await db.select({ stale: table.beamPath.stale }).from(table.beamPath).where(eq(table.beamPath.id, path.id));
		expect(pathNow.stale).toBe(true);
		const [snapshot] = await db.select({ stale: table.assessment.stale, reason: table.assessment.staleReason }).from(table.assessment).where(eq(table.assessment.pathId, path.id));
		expect(snapshot).toEqual({ stale: true, reason: `Limit “${target.label}” revised to version 2` });
		const trail = await db.select().from(table.auditLog).where(and(eq(table.auditLog.entityId, target.id!), eq(table.auditLog.action, 'limit.revise')));
		expect(trail).toHaveLength(1);
	});

	it('a row without an id and a new name adds a limit; one matching a name in force revises that limit', async () => {
		const file = await limitSets.document();
		const mine = file.limits.filter((r) => !inForceBefore.has(r.id!));
		const { id: _, ...fresh } = mine[0];
		const { id: __, ...byName } = mine[1];
		const id = await stageText(JSON.stringify({ ...file, limits: [{ ...fresh, label: `${fresh.label} (second copy)` }, { ...byName, n: '0.5' }] }));
		const draft = must(await limitSets.find(id)).limitImport;
		expect(draft.plan.rows.map((r) => [r.status, r.limitId])).toEqual([
			['new', null],
			['changed', mine[1].id]
		]);
		expect(draft.plan.untouched).toBe(file.limits.length - 1);
		const published = must(await limitSets.publish(officer.userId, id, draft.plan.stamp));
		expect(published).toMatchObject({ created: 1, revised: 1, unchanged: 0 });
		const names = (await limits.list()).map((l) => l.label);
		expect(names).toContain(`${fresh.label} (second copy)`);
	});

	it('a file with errors leaves nothing; a draft reviewed before the library changed publishes nothing', async () => {
		const versions = await versionCount();
		const imports = await importCount();
		const file = await limitSets.document();
		const broken = { ...file, limits: file.limits.map((r, i) => (i === 2 ? { ...r, wavelengthMax: '1 parsec' } : r)) };
		const read = readLimitSet(JSON.stringify(broken));
		expect(read.ok).toBe(false);
		if (!read.ok) expect(read.problems).toEqual([expect.objectContaining({ row: 3, label: file.limits[2].label, field: 'wavelengthMax' })]);
		expect(await versionCount()).toBe(versions);
		expect(await importCount()).toBe(imports);

		// Reviewed, then someone edits the library by hand: publishing the old review is refused, whole.
		const id = await stageText(JSON.stringify({ ...file, limits: file.limits.map((r) => ({ ...r, citation: `${r.citation} (v2)` })) }));
		const reviewed = must(await limitSets.find(id)).limitImport.plan.stamp;
		const one = must(await limits.find(file.limits.find((r) => !inForceBefore.has(r.id!))!.id!)).limit;
		must(await limits.revise(officer.userId, one.id, { ...limitFormValues(one.current, one.currentVersion), n: '0.8' }));
		const versionsNow = await versionCount();
		expect(await limitSets.publish(officer.userId, id, reviewed)).toMatchObject({ ok: false, status: 409 });
		expect(await versionCount()).toBe(versionsNow);
		expect(must(await limitSets.find(id)).limitImport.state).toBe('draft');

		must(await limitSets.discard(officer.userId, id));
		expect(must(await limitSets.find(id)).limitImport.state).toBe('discarded');
		expect(await limitSets.publish(officer.userId, id, must(await limitSets.find(id)).limitImport.plan.stamp)).toMatchObject({ ok: false, status: 409 });
		expect(await versionCount()).toBe(versionsNow);
		const trail = await db.select().from(table.auditLog).where(and(eq(table.auditLog.entityId, id), inArray(table.auditLog.action, ['limit_import.stage', 'limit_import.discard'])));
		expect(trail).toHaveLength(2);
	});
});
