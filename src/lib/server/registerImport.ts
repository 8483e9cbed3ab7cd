// Register imports: an officer uploads a CSV (checked row by row, the valid rows staged), looks at
// the problems, then starts the import; the job writes it in batches of about IMPORT_BATCH_ROWS
// rows, each batch in one transaction with its audit record, a laser's rows always in one batch.
// A row whose lab and serial match a registered laser updates that laser (and its line of the same
// label, in order) rather than adding a second one. A batch marks its rows done as it commits, so a
// job that runs twice, or resumes after a fault, writes nothing twice.
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import Decimal from 'decimal.js';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as audit from '$lib/server/audit';
import type { Scope } from '$lib/server/auth/scope';
import { failure, notFound, type Failure } from '$lib/server/http/failure';
import { cleanFileName, MAX_UPLOAD_BYTES } from '$lib/server/uploads';
import { fileTypeFromBuffer } from 'file-type';
import { isUuid } from '$lib/server/db/ids';
import { laserKey, parseRegisterFile, type LaserValues, type ParsedRow } from '$lib/server/registerRows';
import { IMPORT_BATCH_ROWS, type ImportProblem, type ImportProgress } from '$lib/registerCsv';
import type { LineValues } from '$lib/schemas/register';
import { can } from '$lib/abilities';

type StagedData = { laser: LaserValues; line: LineValues };

const officerOnly = (scope: Scope) => can(scope, 'importRegister') && scope.editLabIds === 'all';

/**
 * The uploaded file as text. Its kind comes from its bytes: a workbook, PDF or image is refused
 * with a word on saving it as CSV, and so is text that is not UTF-8.
 */
export async function readUpload(entry: FormDataEntryValue | null): Promise<{ ok: true; fileName: string; text: string } | Failure> {
	if (!entry || typeof entry === 'string' || entry.size === 0) return failure(400, 'Choose a CSV file to upload.');
	const fileName = cleanFileName(entry.name);
	if (entry.size > MAX_UPLOAD_BYTES) return failure(413, `“${fileName}” is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MB; split it into smaller files.`);
	const bytes = Buffer.from(await entry.arrayBuffer());
	const kind = await fileTypeFromBuffer(bytes);
	if (kind) return failure(400, `“${fileName}” is a ${kind.ext.toUpperCase()} file, not CSV. In the spreadsheet, save it as “CSV UTF-8” and upload that.`);
	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
	} catch {
		return failure(400, `“${fileName}” is not UTF-8 text. In the spreadsheet, save it as “CSV UTF-8” and upload that.`);
	}
	if (text.includes('\u0000')) return failure(400, `“${fileName}” is not a text file.`);
	return { ok: true, fileName, text };
}

/** The latest imports, newest first, for the import page. */
export async function recent(limit = 10) {
	const rows = await db
		.select({ record: table.registerImport, uploader: table.user.name })
		.from(table.registerImport)
		.innerJoin(table.user, eq(table.user.id, table.registerImport.createdBy))
		.orderBy(desc(table.registerImport.createdAt))
		.limit(limit);
	return rows.map((r) => ({ id: r.record.id, fileName: r.record.fileName, state: r.record.state, uploader: r.uploader, createdAt: r.record.createdAt, totalRows: r.record.totalRows, errorRows: r.record.errorRows }));
}

/** Check a file and stage its valid rows. A file that cannot be read as the register's CSV stages nothing. */
export async function stage(scope: Scope, fileName: string, text: string): Promise<{ ok: true; id: string } | (Failure & { problems?: ImportProblem[] })> {
	if (!officerOnly(scope)) return failure(403, 'Only a laser safety officer imports into the register.');
	const labs = await db.select({ id: table.lab.id, code: table.lab.code }).from(table.lab);
	const parsed = parseRegisterFile(text, labs);
	if (!parsed.ok) return { ...failure(400, 'The file could not be read as the register’s CSV. Nothing was staged.'), problems: parsed.problems };
	const rows = parsed.rows;
	const valid = rows.filter((r): r is ParsedRow & { laser: LaserValues; values: LineValues } => r.laser !== null && r.values !== null && r.problems.length === 0);
	const problems = rows.flatMap((r) => r.problems);
	const keys = [...new Set(valid.map((r) => r.key))];
	const existing = await existingLasers(db, valid.map((r) => r.laser));
	return db.transaction(async (tx) => {
		const [created] = await tx
			.insert(table.registerImport)
			.values({
				createdBy: scope.userId,
				fileName,
				totalRows: rows.length,
				errorRows: rows.length - valid.length,
				newLasers: keys.filter((k) => !existing.has(k)).length,
				existingLasers: keys.filter((k) => existing.has(k)).length,
				problems
			})
			.returning({ id: table.registerImport.id });
		for (let i = 0; i < valid.length; i += 1000) {
			const chunk = valid.slice(i, i + 1000);
			await tx.insert(table.registerImportRow).values(chunk.map((r) => ({ importId: created.id, line: r.line, laserKey: r.key, data: { laser: r.laser, line: r.values } satisfies StagedData })));
		}
		await audit.record(tx, { actorId: scope.userId, action: 'register_import.stage', entity: 'register_import', entityId: created.id, after: { fileName, totalRows: rows.length, validRows: valid.length } });
		return { ok: true, id: created.id } as const;
	});
}

/** Registered lasers by lab and serial (the oldest, if a serial was registered twice in a lab). */
async function existingLasers(q: typeof db | Tx, lasers: { labId: string; serial: string }[]) {
	const out = new Map<string, typeof table.laser.$inferSelect>();
	const pairs = [...new Map(lasers.map((l) => [laserKey(l.labId, l.serial), l])).values()];
	for (let i = 0; i < pairs.length; i += 1000) {
		const chunk = pairs.slice(i, i + 1000);
		const rows = await q
			.select()
			.from(table.laser)
			.where(sql`(${table.laser.labId}, ${table.laser.serial}) IN (${sql.join(chunk.map((p) => sql`(${p.labId}::uuid, ${p.serial})`), sql`, `)})`)
			.orderBy(asc(table.laser.createdAt), asc(table.laser.id));
		for (const r of rows) if (!out.has(laserKey(r.labId, r.serial))) out.set(laserKey(r.labId, r.serial), r);
	}
	return out;
}

export async function find(scope: Scope, id: string): Promise<{ ok: true; record: table.RegisterImport; uploader: string; mine: boolean } | Failure> {
	if (!officerOnly(scope)) return failure(403, 'Only a laser safety officer imports into the register.');
	if (!isUuid(id)) return notFound('import');
	const [row] = await db
		.select({ record: table.registerImport, uploader: table.user.name })
		.from(table.registerImport)
		.innerJoin(table.user, eq(table.user.id, table.registerImport.createdBy))
		.where(eq(table.registerImport.id, id));
	if (!row) return notFound('import');
	return { ok: true, record: row.record, uploader: row.uploader, mine: row.record.createdBy === scope.userId };
}

export function progressOf(r: table.RegisterImport): ImportProgress {
	return {
		id: r.id,
		state: r.state,
		rowsToImport: r.totalRows - r.errorRows,
		processedRows: r.processedRows,
		lasersCreated: r.lasersCreated,
		lasersUpdated: r.lasersUpdated,
		linesAdded: r.linesAdded,
		linesUpdated: r.linesUpdated,
		linesUnchanged: r.linesUnchanged,
		message: r.message
	};
}

export async function progress(scope: Scope, id: string): Promise<{ ok: true; progress: ImportProgress } | Failure> {
	const found = await find(scope, id);
	return found.ok ? { ok: true, progress: progressOf(found.record) } : found;
}

/** Start the import: every row, or (when the file has problems) only if the officer chose the valid rows only. */
export async function start(scope: Scope, id: string, validOnly: boolean): Promise<{ ok: true } | Failure> {
	const found = await find(scope, id);
	if (!found.ok) return found;
	const r = found.record;
	if (!found.mine) return failure(403, 'Only the officer who uploaded the file starts its import.');
	if (r.state !== 'preview' && r.state !== 'failed') return failure(409, `This import is already ${r.state === 'discarded' ? 'discarded' : 'started'}.`);
	if (r.errorRows > 0 && !validOnly) return failure(400, `${r.errorRows} ${r.errorRows === 1 ? 'row has' : 'rows have'} problems. Correct the file and upload it again, or choose to import the valid rows only.`);
	if (r.totalRows - r.errorRows === 0) return failure(400, 'No row of this file is valid: nothing to import.');
	return db.transaction(async (tx) => {
		const [after] = await tx
			.update(table.registerImport)
			.set({ state: 'queued', validOnly, queuedAt: new Date(), message: '' })
			.where(and(eq(table.registerImport.id, id), inArray(table.registerImport.state, ['preview', 'failed'])))
			.returning({ id: table.registerImport.id });
		if (!after) return failure(409, 'This import was started meanwhile.');
		await audit.record(tx, { actorId: scope.userId, action: 'register_import.start', entity: 'register_import', entityId: id, after: { validOnly } });
		return { ok: true } as const;
	});
}

/** Drop a checked file that will not be imported (its staged rows go with it). */
export async function discard(scope: Scope, id: string): Promise<{ ok: true } | Failure> {
	const found = await find(scope, id);
	if (!found.ok) return found;
	if (!found.mine) return failure(403, 'Only the officer who uploaded the file discards it.');
	if (found.record.state !== 'preview' && found.record.state !== 'failed') return failure(409, 'This import has started; it can no longer be discarded.');
	return db.transaction(async (tx) => {
		await tx.update(table.registerImport).set({ state: 'discarded', finishedAt: new Date() }).where(eq(table.registerImport.id, id));
		await tx.delete(table.registerImportRow).where(eq(table.registerImportRow.importId, id));
		await audit.record(tx, { actorId: scope.userId, action: 'register_import.discard', entity: 'register_import', entityId: id });
		return { ok: true } as const;
	});
}

/** The job: every started import, oldest first. Returns whether any line changed (paths to reassess). */
export async function runStarted(): Promise<{ imports: number; linesChanged: boolean }> {
	const started = await db
		.select({ id: table.registerImport.id })
		.from(table.registerImport)
		.where(inArray(table.registerImport.state, ['queued', 'running']))
		.orderBy(asc(table.registerImport.queuedAt));
	let linesChanged = false;
	for (const { id } of started) {
		try {
			if ((await run(id)).linesChanged) linesChanged = true;
		} catch (e) {
			// What committed stays (its batches are audited and marked done); the officer may start it again.
			await db.update(table.registerImport).set({ state: 'failed', message: 'The import stopped on a fault; the rows written so far are kept. Start it again to write the rest.' }).where(eq(table.registerImport.id, id));
			console.error('register import failed:', (e as Error).message);
		}
	}
	return { imports: started.length, linesChanged };
}

/** Write one import's remaining rows, batch by batch. */
export async function run(id: string): Promise<{ linesChanged: boolean }> {
	await db.update(table.registerImport).set({ state: 'running' }).where(and(eq(table.registerImport.id, id), eq(table.registerImport.state, 'queued')));
	const pending = await db
		.select({ line: table.registerImportRow.line, laserKey: table.registerImportRow.laserKey })
		.from(table.registerImportRow)
		.where(and(eq(table.registerImportRow.importId, id), eq(table.registerImportRow.done, false)))
		.orderBy(asc(table.registerImportRow.line));
	// A laser's rows stay together; batches close once they hold IMPORT_BATCH_ROWS rows.
	const groups = new Map<string, number[]>();
	for (const r of pending) groups.set(r.laserKey, [...(groups.get(r.laserKey) ?? []), r.line]);
	const batches: number[][] = [];
	let current: number[] = [];
	for (const lines of groups.values()) {
		current.push(...lines);
		if (current.length >= IMPORT_BATCH_ROWS) {
			batches.push(current);
			current = [];
		}
	}
	if (current.length) batches.push(current);
	let linesChanged = false;
	for (const lines of batches) if ((await writeBatch(id, lines)).linesChanged) linesChanged = true;
	await db
		.update(table.registerImport)
		.set({ state: 'done', finishedAt: new Date() })
		.where(and(eq(table.registerImport.id, id), eq(table.registerImport.state, 'running')));
	return { linesChanged };
}

const laserFields = ['labId', 'maker', 'model', 'serial', 'laserClass', 'status', 'notes'] as const;
const lineTextFields = ['label', 'emissionGroup', 'mode', 'beamProfile', 'beamDiameterDefinition', 'divergenceDefinition'] as const;
const lineNumberFields = ['wavelength', 'wavelengthMax', 'power', 'pulseEnergy', 'pulseDuration', 'repetitionRate', 'beamDiameter', 'divergence', 'beamQuality', 'hotSpotFactor'] as const;

function sameNumber(a: string | null, b: string | null): boolean {
	if (a === null || b === null) return a === b;
	return new Decimal(a).eq(b);
}

function sameLine(row: typeof table.emissionLine.$inferSelect, v: LineValues): boolean {
	return lineTextFields.every((f) => row[f] === v[f]) && lineNumberFields.every((f) => sameNumber(row[f], v[f]));
}

async function writeBatch(importId: string, lines: number[]): Promise<{ linesChanged: boolean }> {
	return db.transaction(async (tx) => {
		// The import row is locked for the batch: two workers never write the same rows.
		const [imp] = await tx.select().from(table.registerImport).where(eq(table.registerImport.id, importId)).for('update');
		if (!imp || imp.state !== 'running') return { linesChanged: false };
		const rows = await tx
			.select({ line: table.registerImportRow.line, data: table.registerImportRow.data })
			.from(table.registerImportRow)
			.where(and(eq(table.registerImportRow.importId, importId), eq(table.registerImportRow.done, false), inArray(table.registerImportRow.line, lines)))
			.orderBy(asc(table.registerImportRow.line));
		if (rows.length === 0) return { linesChanged: false };
		const staged = rows.map((r) => ({ fileLine: r.line, ...(r.data as StagedData) }));
		const groups = new Map<string, typeof staged>();
		for (const r of staged) {
			const k = laserKey(r.laser.labId, r.laser.serial);
			groups.set(k, [...(groups.get(k) ?? []), r]);
		}
		const existing = await existingLasers(tx, staged.map((r) => r.laser));
		const existingIds = [...existing.values()].map((l) => l.id);
		const lineRows = existingIds.length
			? await tx.select().from(table.emissionLine).where(inArray(table.emissionLine.laserId, existingIds)).orderBy(asc(table.emissionLine.createdAt), asc(table.emissionLine.id))
			: [];

		const created: { id: string; serial: string; fileLine: number }[] = [];
		const updated: { id: string; serial: string; before: unknown; after: unknown }[] = [];
		const changedLines: { id: string; before: unknown; after: LineValues }[] = [];
		const newLines: (LineValues & { laserId: string; createdAt: Date })[] = [];
		// A laser's lines are listed by creation time: lines added together keep the file's order, a millisecond apart.
		const now = Date.now();
		let unchanged = 0;
		const touched = new Set<string>();

		// New lasers in one insert, their lines after.
		const fresh = [...groups.entries()].filter(([k]) => !existing.has(k));
		if (fresh.length) {
			const inserted = await tx
				.insert(table.laser)
				.values(fresh.map(([, g]) => ({ ...g[0].laser, ownerId: imp.createdBy })))
				.returning({ id: table.laser.id, labId: table.laser.labId, serial: table.laser.serial });
			const idOf = new Map(inserted.map((l) => [laserKey(l.labId, l.serial), l.id]));
			for (const [k, g] of fresh) {
				const id = idOf.get(k)!;
				created.push({ id, serial: g[0].laser.serial, fileLine: g[0].fileLine });
				touched.add(id);
				g.forEach((r, j) => newLines.push({ laserId: id, ...r.line, createdAt: new Date(now + j) }));
			}
		}

		for (const [k, g] of groups) {
			const laser = existing.get(k);
			if (!laser) continue;
			let changed = false;
			const wanted = g[0].laser;
			if (laserFields.some((f) => laser[f] !== wanted[f])) {
				await tx
					.update(table.laser)
					.set({ maker: wanted.maker, model: wanted.model, laserClass: wanted.laserClass, status: wanted.status, notes: wanted.notes, version: laser.version + 1, updatedAt: new Date() })
					.where(eq(table.laser.id, laser.id));
				updated.push({ id: laser.id, serial: laser.serial, before: laser, after: wanted });
				changed = true;
			}
			// The file's lines meet the laser's lines of the same label, in the order both list them.
			const byLabel = new Map<string, (typeof lineRows)[number][]>();
			for (const l of lineRows) if (l.laserId === laser.id) byLabel.set(l.label, [...(byLabel.get(l.label) ?? []), l]);
			for (const [j, r] of g.entries()) {
				const match = byLabel.get(r.line.label)?.shift();
				if (!match) {
					newLines.push({ laserId: laser.id, ...r.line, createdAt: new Date(now + j) });
					changed = true;
				} else if (sameLine(match, r.line)) unchanged++;
				else {
					await tx
						.update(table.emissionLine)
						.set({ ...r.line, version: match.version + 1, updatedAt: new Date() })
						.where(eq(table.emissionLine.id, match.id));
					changedLines.push({ id: match.id, before: match, after: r.line });
					changed = true;
				}
			}
			if (changed) {
				touched.add(laser.id);
				if (!updated.some((u) => u.id === laser.id)) updated.push({ id: laser.id, serial: laser.serial, before: null, after: null });
			}
		}

		for (let i = 0; i < newLines.length; i += 1000) await tx.insert(table.emissionLine).values(newLines.slice(i, i + 1000));
		if (touched.size) {
			const ids = sql.join([...touched].map((id) => sql`${id}::uuid`), sql`, `);
			await tx.execute(sql`
				UPDATE laser SET
					wavelength_min = (SELECT min(wavelength) FROM emission_line WHERE laser_id = laser.id),
					wavelength_max = (SELECT max(coalesce(wavelength_max, wavelength)) FROM emission_line WHERE laser_id = laser.id)
				WHERE id IN (${ids})`);
		}
		if (changedLines.length) {
			// Every path carrying a changed line goes stale (the re-evaluation job picks them up).
			const ids = sql.join(changedLines.map((l) => sql`${l.id}::uuid`), sql`, `);
			await tx.execute(sql`UPDATE beam_path SET stale = true WHERE verdict IS NOT NULL AND id IN (SELECT path_id FROM path_line WHERE line_id IN (${ids}))`);
		}
		await tx
			.update(table.registerImportRow)
			.set({ done: true })
			.where(and(eq(table.registerImportRow.importId, importId), inArray(table.registerImportRow.line, rows.map((r) => r.line))));
		await tx
			.update(table.registerImport)
			.set({
				processedRows: sql`${table.registerImport.processedRows} + ${rows.length}`,
				lasersCreated: sql`${table.registerImport.lasersCreated} + ${created.length}`,
				lasersUpdated: sql`${table.registerImport.lasersUpdated} + ${updated.length}`,
				linesAdded: sql`${table.registerImport.linesAdded} + ${newLines.length}`,
				linesUpdated: sql`${table.registerImport.linesUpdated} + ${changedLines.length}`,
				linesUnchanged: sql`${table.registerImport.linesUnchanged} + ${unchanged}`
			})
			.where(eq(table.registerImport.id, importId));
		await audit.record(tx, {
			actorId: imp.createdBy,
			action: 'register_import.batch',
			entity: 'register_import',
			entityId: importId,
			after: {
				fileLines: [rows[0].line, rows[rows.length - 1].line],
				rows: rows.length,
				lasersCreated: created,
				lasersUpdated: updated,
				linesAdded: newLines.length,
				linesUpdated: changedLines
			}
		});
		return { linesChanged: changedLines.length > 0 };
	});
}
