// The register's CSV: the lines export of the demo register, imported into empty labs, gives the
// same lasers and lines; importing it again updates rather than doubles; a changed line makes its
// paths stale; a file with problems imports only when the officer asks for the valid rows.
import { randomUUID } from 'node:crypto';
import { and, eq, inArray, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as lasers from '$lib/server/lasers';
import * as paths from '$lib/server/paths';
import * as registerImport from '$lib/server/registerImport';
import { linesCsv, lasersCsv, pathsCsv } from '$lib/server/registerExport';
import { readCsv, writeCsv } from '$lib/server/csv';
import type { Scope } from '$lib/server/auth/scope';
import { demoLabs, demoLasers } from '../../seed/demo';
import { makeLab, makeUser, scopeFor } from './factories';

let officer: Scope;
let researcher: Scope;
const source = new Map<string, { id: string; code: string }>();
const target = new Map<string, { id: string; code: string }>();
const suffix = randomUUID().slice(0, 4);

beforeAll(async () => {
	officer = await scopeFor(await makeUser('officer'));
	researcher = await scopeFor(await makeUser('researcher'));
	for (const l of demoLabs) {
		source.set(l.code, await makeLab(`${l.code}-s${suffix}`));
		target.set(l.code, await makeLab(`${l.code}-t${suffix}`));
	}
	// The demo register (lasers, their lines and paths) in the source labs.
	for (const d of demoLasers) {
		const created = await lasers.create(officer, { ...d.laser, labId: source.get(d.lab)!.id });
		if (!created.ok) throw new Error(JSON.stringify(created));
		const lineIds = [(await db.select({ id: table.emissionLine.id }).from(table.emissionLine).where(eq(table.emissionLine.laserId, created.id)))[0].id];
		for (const l of d.moreLines ?? []) {
			const more = await lasers.saveLine(officer, created.id, null, { ...l, version: 0 });
			if (!more.ok) throw new Error(JSON.stringify(more));
			lineIds.push(more.id);
		}
		for (const p of d.paths) {
			const saved = await paths.save(officer, created.id, null, { ...p, lineIds, lineChoiceReason: '', version: 0 });
			if (!saved.ok) throw new Error(JSON.stringify(saved));
		}
	}
	// A note a spreadsheet would take for a formula travels as text.
	await db.update(table.laser).set({ notes: '=HYPERLINK("http://example.invalid")' }).where(and(eq(table.laser.serial, demoLasers[0].laser.serial), eq(table.laser.labId, source.get(demoLasers[0].lab)!.id)));
});

const ids = (labs: Map<string, { id: string }>) => [...labs.values()].map((l) => l.id);

/** The file with every lab code of one set changed to the other's. */
function relabel(csv: string, from: Map<string, { code: string }>, to: Map<string, { code: string }>): string {
	const read = readCsv(csv, 100_000);
	if (!read.ok) throw new Error(read.message);
	const codes = new Map([...from].map(([k, v]) => [v.code, to.get(k)!.code]));
	return writeCsv(read.head, read.records.map((r) => r.cells.map((c, i) => (i === 0 ? codes.get(c) ?? c : c.replace(/^'(?=[=+\-@])/, '')))));
}

async function importFile(text: string, validOnly = false) {
	const staged = await registerImport.stage(officer, 'register.csv', text);
	if (!staged.ok) throw new Error(JSON.stringify(staged));
	const started = await registerImport.start(officer, staged.id, validOnly);
	if (!started.ok) throw new Error(JSON.stringify(started));
	await registerImport.runStarted();
	const found = await registerImport.find(officer, staged.id);
	if (!found.ok) throw new Error('import not found');
	return found.record;
}

async function counts(labIds: string[]) {
	const [{ lasers: l }] = await db.select({ lasers: sql<number>`count(*)::int` }).from(table.laser).where(inArray(table.laser.labId, labIds));
	const [{ lines }] = await db
		.select({ lines: sql<number>`count(*)::int` })
		.from(table.emissionLine)
		.innerJoin(table.laser, eq(table.laser.id, table.emissionLine.laserId))
		.where(inArray(table.laser.labId, labIds));
	return { lasers: l, lines };
}

describe('register CSV', () => {
	it('the lines export of the demo register imports into empty labs as the same lasers and lines', async () => {
		const exported = await linesCsv(officer, ids(source));
		expect(exported).toContain(`"'=HYPERLINK(""http://example.invalid"")"`);
		const file = relabel(exported, source, target);
		const before = await counts(ids(source));
		expect(before.lasers).toBe(demoLasers.length);
		const done = await importFile(file);
		expect(done).toMatchObject({ state: 'done', errorRows: 0, processedRows: before.lines, lasersCreated: before.lasers, linesAdded: before.lines, linesUpdated: 0 });
		expect(await counts(ids(target))).toEqual(before);
		// Same lasers and lines, value for value: the target's export, relabelled, is the source's.
		expect(relabel(await linesCsv(officer, ids(target)), target, source)).toBe(relabel(exported, source, source));
		// one batch, one audit record, in the batch's transaction
		const batches = await db.select().from(table.auditLog).where(and(eq(table.auditLog.action, 'register_import.batch'), eq(table.auditLog.entityId, done.id)));
		expect(batches).toHaveLength(1);
		// the wavelength span of each laser follows its lines (the band filter reads it)
		const spans = await db.select({ min: table.laser.wavelengthMin, max: table.laser.wavelengthMax }).from(table.laser).where(inArray(table.laser.labId, ids(target)));
		expect(spans.every((s) => s.min !== null && s.max !== null)).toBe(true);
	});

	it('importing the same file again updates nothing and doubles nothing', async () => {
		const file = relabel(await linesCsv(officer, ids(source)), source, target);
		const before = await counts(ids(target));
		const staged = await registerImport.stage(officer, 'again.csv', file);
		if (!staged.ok) throw new Error('not staged');
		const preview = await registerImport.find(officer, staged.id);
		expect(preview.ok && preview.record).toMatchObject({ newLasers: 0, existingLasers: demoLasers.length });
		await registerImport.start(officer, staged.id, false);
		await registerImport.runStarted();
		const again = await registerImport.find(officer, staged.id);
		expect(again.ok && again.record).toMatchObject({ state: 'done', lasersCreated: 0, lasersUpdated: 0, linesAdded: 0, linesUpdated: 0, linesUnchanged: before.lines });
		expect(await counts(ids(target))).toEqual(before);
	});

	it('a changed value updates the laser’s line of the same label, and the paths carrying it go stale', async () => {
		const exported = await linesCsv(officer, ids(source));
		const read = readCsv(exported, 1000);
		if (!read.ok) throw new Error(read.message);
		const power = read.head.indexOf('power');
		const serial = read.head.indexOf('serial');
		const row = read.records.find((r) => r.cells[serial] === 'VS5-20931')!;
		row.cells[power] = '4 W';
		const before = await counts(ids(source));
		const done = await importFile(writeCsv(read.head, read.records.map((r) => r.cells)));
		expect(done).toMatchObject({ state: 'done', lasersCreated: 0, lasersUpdated: 1, linesAdded: 0, linesUpdated: 1 });
		expect(await counts(ids(source))).toEqual(before);
		const [laser] = await db.select().from(table.laser).where(and(eq(table.laser.serial, 'VS5-20931'), eq(table.laser.labId, source.get('SPX')!.id)));
		const [line] = await db.select().from(table.emissionLine).where(eq(table.emissionLine.laserId, laser.id));
		expect(Number(line.power)).toBe(4);
		expect(line.version).toBe(2);
		const stale = await db.select({ stale: table.beamPath.stale }).from(table.beamPath).where(eq(table.beamPath.laserId, laser.id));
		expect(stale.length).toBeGreaterThan(0);
		expect(stale.every((p) => p.stale)).toBe(true);
	});

	it('a file with problems imports nothing, unless the officer chooses the valid rows only', async () => {
		const read = readCsv(relabel(await linesCsv(officer, ids(source)), source, source), 1000);
		if (!read.ok) throw new Error(read.message);
		const at = (name: string) => read.head.indexOf(name);
		const lab = source.get('MPC')!;
		const rows = [0, 1, 2].map((i) => {
			const cells = [...read.records[0].cells];
			cells[at('lab')] = lab.code;
			cells[at('serial')] = `NEW-${suffix}-${i}`;
			if (i === 1) cells[at('wavelength')] = 'green';
			return cells;
		});
		const staged = await registerImport.stage(officer, 'mixed.csv', writeCsv(read.head, rows));
		if (!staged.ok) throw new Error('not staged');
		expect(await registerImport.start(officer, staged.id, false)).toMatchObject({ ok: false, status: 400 });
		const before = await counts([lab.id]);
		expect(await registerImport.start(officer, staged.id, true)).toEqual({ ok: true });
		await registerImport.runStarted();
		expect(await counts([lab.id])).toEqual({ lasers: before.lasers + 2, lines: before.lines + 2 });
		const found = await registerImport.find(officer, staged.id);
		expect(found.ok && (found.record.problems as { line: number; column: string }[])).toEqual([expect.objectContaining({ line: 3, column: 'wavelength' })]);
	});

	it('only officers import; exports hold only the labs the reader may see, paths with their latest verdict', async () => {
		expect(await registerImport.stage(researcher, 'x.csv', 'lab\n')).toMatchObject({ ok: false, status: 403 });
		expect(readCsv(await lasersCsv(researcher), 10)).toMatchObject({ ok: true, records: [] });
		const csv = await pathsCsv(officer, ids(source));
		const read = readCsv(csv, 1000);
		if (!read.ok) throw new Error(read.message);
		expect(read.records.length).toBe(demoLasers.reduce((n, d) => n + d.paths.length, 0));
		const verdict = read.head.indexOf('latest verdict');
		expect(read.records.every((r) => r.cells[verdict] !== '')).toBe(true);
		expect(csv).toContain('not a substitute for measurement');
	});
});
