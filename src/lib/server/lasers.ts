// The laser inventory: queries and transactions, each change with its audit row.
import { and, asc, desc, eq, gte, inArray, lte, sql, type SQL } from 'drizzle-orm';
import { db, type Tx } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { isUuid } from '$lib/server/db/ids';
import * as audit from '$lib/server/audit';
import { nudge, queues } from '$lib/server/jobs/queues';
import { canEdit, canRead, type Scope, inReadableLabs } from '$lib/server/auth/scope';
import { cannotChange, changedMeanwhile, fieldsNeedAttention, notFound, notYours, type Failure } from '$lib/server/http/failure';
import type { NewLaserForm } from '$lib/schemas/register';
import { checkedLine } from '$lib/server/lineRules';
import { lineFromRow } from '$lib/schemas/assessment';
import { lineProblems } from '$lib/server/hazard';
import type { LaserClass, LaserStatus } from '$lib/enums';
import type { z } from 'zod';
import { inventoryQuerySchema } from '$lib/schemas/inventory';
import type { editLaserSchema, lineSchema } from '$lib/schemas/register';

/** Wavelength bands of the inventory filter, m. */
export const bands = {
	uv: { label: 'Ultraviolet (180–400 nm)', min: '180e-9', max: '400e-9' },
	visible: { label: 'Visible (400–700 nm)', min: '400e-9', max: '700e-9' },
	nir: { label: 'Near infrared (700–1400 nm)', min: '700e-9', max: '1400e-9' },
	ir: { label: 'Infrared (1.4 µm – 1 mm)', min: '1400e-9', max: '1e-3' }
} as const;
export type Band = keyof typeof bands;

export const sortKeys = ['model', 'maker', 'class', 'lab', 'status', 'updated'] as const;
export type SortKey = (typeof sortKeys)[number];

export type InventoryQuery = {
	q?: string;
	labId?: string;
	laserClass?: LaserClass;
	status?: LaserStatus;
	band?: Band;
	sort: SortKey;
	dir: 'asc' | 'desc';
	page: number;
	pageSize: number;
};

export type InventoryRow = {
	id: string;
	maker: string;
	model: string;
	serial: string;
	laserClass: string;
	status: string;
	labCode: string;
	labName: string;
	areaName: string | null;
	wavelengthMin: string | null;
	wavelengthMax: string | null;
	lineCount: number;
	pathCount: number;
	flaggedCount: number;
	staleCount: number;
	/** Lines stored with values the engine cannot assess (saved before the line rules, or imported): said, never hidden. */
	linesNeedingAttention: number;
	/** An officer suspended it after an incident (laser_suspension): no new clearance until lifted. */
	suspended: boolean;
	updatedAt: string;
};

export type InventoryPage = { items: InventoryRow[]; total: number; page: number; pageSize: number };

const sortColumns: Record<SortKey, SQL | typeof table.laser.model> = {
	model: sql`${table.laser.model}`,
	maker: sql`${table.laser.maker}`,
	class: sql`${table.laser.laserClass}`,
	lab: sql`${table.lab.code}`,
	status: sql`${table.laser.status}`,
	updated: sql`${table.laser.updatedAt}`
};

/** One query for the page and one for the count, whatever the page size: no query per row. */
/** The inventory's filters from a query string (GET /api/lasers and the register page read the same). */
export function inventoryFromQuery(searchParams: URLSearchParams): { ok: true; query: InventoryQuery } | { ok: false; error: z.ZodError } {
	const raw = Object.fromEntries([...searchParams].filter(([, v]) => v !== ''));
	const parsed = inventoryQuerySchema.safeParse(raw);
	if (!parsed.success) return { ok: false, error: parsed.error };
	const q = parsed.data;
	return { ok: true, query: { q: q.q, labId: q.lab, laserClass: q.class, status: q.status, band: q.band, sort: q.sort, dir: q.dir, page: q.page, pageSize: q.pageSize } };
}

export async function inventory(scope: Scope, q: InventoryQuery): Promise<InventoryPage> {
	const where: SQL[] = [];
	const readable = inReadableLabs(scope, table.laser.labId);
	if (readable) where.push(readable);
	if (q.labId) where.push(eq(table.laser.labId, q.labId));
	if (q.laserClass) where.push(eq(table.laser.laserClass, q.laserClass));
	if (q.status) where.push(eq(table.laser.status, q.status));
	else where.push(sql`${table.laser.status} <> 'retired'`);
	if (q.band) {
		const b = bands[q.band];
		where.push(and(lte(table.laser.wavelengthMin, b.max), gte(table.laser.wavelengthMax, b.min))!);
	}
	if (q.q) {
		const pattern = `%${q.q.replace(/[\\%_]/g, (c) => '\\' + c)}%`;
		// The same expression as the trigram index laser_search_idx, so the index serves it.
		where.push(sql`(${table.laser.maker} || ' ' || ${table.laser.model} || ' ' || ${table.laser.serial}) ILIKE ${pattern}`);
	}
	const condition = where.length ? and(...where) : undefined;
	const order = sortColumns[q.sort];
	// 1) the page of ids (filtered, sorted, limited) and the total, in parallel;
	// 2) the rows of that page with their line and path counts, aggregated for those ids only.
	const [pageIds, [{ total }]] = await Promise.all([
		db
			.select({ id: table.laser.id })
			.from(table.laser)
			.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
			.where(condition)
			.orderBy(q.dir === 'asc' ? asc(order) : desc(order), asc(table.laser.id))
			.limit(q.pageSize)
			.offset((q.page - 1) * q.pageSize),
		db
			.select({ total: sql<number>`count(*)::int` })
			.from(table.laser)
			.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
			.where(condition)
	]);
	if (pageIds.length === 0) return { items: [], total, page: q.page, pageSize: q.pageSize };
	const ids = pageIds.map((r) => r.id);
	const counts = db
		.select({
			laserId: table.beamPath.laserId,
			pathCount: sql<number>`count(*)::int`.as('path_count'),
			flaggedCount: sql<number>`count(*) FILTER (WHERE ${table.beamPath.flagged})::int`.as('flagged_count'),
			staleCount: sql<number>`count(*) FILTER (WHERE ${table.beamPath.stale})::int`.as('stale_count')
		})
		.from(table.beamPath)
		.where(and(inArray(table.beamPath.laserId, ids), eq(table.beamPath.retired, false)))
		.groupBy(table.beamPath.laserId)
		.as('counts');
	const lines = db
		.select({ laserId: table.emissionLine.laserId, lineCount: sql<number>`count(*)::int`.as('line_count') })
		.from(table.emissionLine)
		.where(inArray(table.emissionLine.laserId, ids))
		.groupBy(table.emissionLine.laserId)
		.as('lines');
	const rows = await db
		.select({
			id: table.laser.id,
			maker: table.laser.maker,
			model: table.laser.model,
			serial: table.laser.serial,
			laserClass: table.laser.laserClass,
			status: table.laser.status,
			labCode: table.lab.code,
			labName: table.lab.name,
			areaName: table.area.name,
			wavelengthMin: table.laser.wavelengthMin,
			wavelengthMax: table.laser.wavelengthMax,
			lineCount: sql<number>`coalesce(${lines.lineCount}, 0)`,
			pathCount: sql<number>`coalesce(${counts.pathCount}, 0)`,
			flaggedCount: sql<number>`coalesce(${counts.flaggedCount}, 0)`,
			staleCount: sql<number>`coalesce(${counts.staleCount}, 0)`,
			suspended: sql<boolean>`EXISTS (SELECT 1 FROM laser_suspension s WHERE s.laser_id = ${table.laser.id} AND s.lifted_at IS NULL)`,
			updatedAt: table.laser.updatedAt
		})
		.from(table.laser)
		.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
		.leftJoin(table.area, eq(table.area.id, table.laser.areaId))
		.leftJoin(counts, eq(counts.laserId, table.laser.id))
		.leftJoin(lines, eq(lines.laserId, table.laser.id))
		.where(inArray(table.laser.id, ids));
	const byId = new Map(rows.map((r) => [r.id, r]));
	const attention = await linesNeedingAttention(ids);
	const items = ids.map((id) => byId.get(id)!).map((r) => ({ ...r, linesNeedingAttention: attention.get(r.id) ?? 0, updatedAt: r.updatedAt.toISOString() }));
	return { items, total, page: q.page, pageSize: q.pageSize };
}

/** Per laser, how many of its lines the engine's own rules refuse (the same rules the line form applies). */
async function linesNeedingAttention(laserIds: string[]): Promise<Map<string, number>> {
	const out = new Map<string, number>();
	if (laserIds.length === 0) return out;
	const rows = await db.select().from(table.emissionLine).where(inArray(table.emissionLine.laserId, laserIds));
	for (const row of rows) if (lineProblems(lineFromRow(row)).length) out.set(row.laserId, (out.get(row.laserId) ?? 0) + 1);
	return out;
}

/** The engine's objections to a stored line, by field ('' when it has none). */
export function lineObjections(row: typeof table.emissionLine.$inferSelect): string[] {
	return lineProblems(lineFromRow(row)).map((p) => p.reason);
}

export type LaserDetail = Awaited<ReturnType<typeof loadDetail>>;

async function loadDetail(laserId: string) {
	const [row] = await db
		.select({ laser: table.laser, lab: { id: table.lab.id, code: table.lab.code, name: table.lab.name }, areaName: table.area.name })
		.from(table.laser)
		.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
		.leftJoin(table.area, eq(table.area.id, table.laser.areaId))
		.where(eq(table.laser.id, laserId));
	if (!row) return null;
	const [lines, paths] = await Promise.all([
		db.select().from(table.emissionLine).where(eq(table.emissionLine.laserId, laserId)).orderBy(asc(table.emissionLine.createdAt)),
		db
			.select({
				id: table.beamPath.id,
				name: table.beamPath.name,
				lineIds: sql<string[]>`(SELECT coalesce(json_agg(pl.line_id ORDER BY pl.sequence), '[]'::json) FROM path_line pl WHERE pl.path_id = ${table.beamPath.id})`,
				verdict: table.beamPath.verdict,
				flagged: table.beamPath.flagged,
				stale: table.beamPath.stale,
				draft: table.beamPath.draft,
				reviewState: table.beamPath.reviewState,
				clearedAssessmentId: table.beamPath.clearedAssessmentId,
				updatedAt: table.beamPath.updatedAt
			})
			.from(table.beamPath)
			.where(and(eq(table.beamPath.laserId, laserId), eq(table.beamPath.retired, false)))
			.orderBy(asc(table.beamPath.name))
	]);
	return { ...row, lines, paths };
}

export async function find(scope: Scope, laserId: string): Promise<{ ok: true; detail: NonNullable<LaserDetail>; editable: boolean } | Failure> {
	if (!isUuid(laserId)) return notFound('laser');
	const detail = await loadDetail(laserId);
	if (!detail) return notFound('laser');
	if (!canRead(scope, detail.laser.labId)) return notYours('laser');
	return { ok: true, detail, editable: canEdit(scope, detail.laser.labId) };
}


/** Keep the laser's wavelength span (for the band filter) in step with its lines. */
async function refreshWavelengthSpan(tx: Tx, laserId: string) {
	await tx.execute(sql`
		UPDATE laser SET
			wavelength_min = (SELECT min(wavelength) FROM emission_line WHERE laser_id = ${laserId}),
			wavelength_max = (SELECT max(coalesce(wavelength_max, wavelength)) FROM emission_line WHERE laser_id = ${laserId})
		WHERE id = ${laserId}`);
}

export async function create(scope: Scope, input: NewLaserForm): Promise<{ ok: true; id: string } | Failure> {
	if (!canEdit(scope, input.labId)) return cannotChange('lab');
	const line = checkedLine(input.line, 'line.');
	if (!line.ok) return fieldsNeedAttention(line.errors);
	const [labRow] = await db.select({ id: table.lab.id }).from(table.lab).where(eq(table.lab.id, input.labId));
	if (!labRow) return fieldsNeedAttention({ labId: 'Unknown lab.' });
	return db.transaction(async (tx) => {
		const [created] = await tx
			.insert(table.laser)
			.values({
				labId: input.labId,
				maker: input.maker,
				model: input.model,
				serial: input.serial,
				laserClass: input.laserClass,
				status: input.status,
				notes: input.notes,
				ownerId: scope.userId
			})
			.returning();
		const [lineRow] = await tx.insert(table.emissionLine).values({ laserId: created.id, ...line.value }).returning();
		await refreshWavelengthSpan(tx, created.id);
		await audit.record(tx, { actorId: scope.userId, action: 'laser.create', entity: 'laser', entityId: created.id, after: { laser: created, line: lineRow } });
		return { ok: true, id: created.id } as const;
	});
}

export async function update(scope: Scope, laserId: string, input: z.infer<typeof editLaserSchema>): Promise<{ ok: true } | Failure> {
	const found = await find(scope, laserId);
	if (!found.ok) return found;
	if (!found.editable || !canEdit(scope, input.labId)) return cannotChange('laser');
	return db.transaction(async (tx) => {
		const [labRow] = await tx.select({ id: table.lab.id }).from(table.lab).where(eq(table.lab.id, input.labId));
		if (!labRow) return fieldsNeedAttention({ labId: 'Unknown lab.' });
		const { version, ...fields } = input;
		const [after] = await tx
			.update(table.laser)
			.set({ ...fields, version: version + 1, updatedAt: new Date() })
			.where(and(eq(table.laser.id, laserId), eq(table.laser.version, version)))
			.returning();
		if (!after) return changedMeanwhile('laser');
		await audit.record(tx, { actorId: scope.userId, action: 'laser.update', entity: 'laser', entityId: laserId, before: found.detail.laser, after });
		return { ok: true } as const;
	});
}

/** Add a line (version 0) or change one (its version); a changed line makes its paths' assessments stale. */
export async function saveLine(scope: Scope, laserId: string, lineId: string | null, input: z.infer<typeof lineSchema>): Promise<{ ok: true; id: string } | Failure> {
	const found = await find(scope, laserId);
	if (!found.ok) return found;
	if (!found.editable) return cannotChange('laser');
	const line = checkedLine(input);
	if (!line.ok) return fieldsNeedAttention(line.errors);
	const saved = await db.transaction(async (tx) => {
		if (lineId === null) {
			const [row] = await tx.insert(table.emissionLine).values({ laserId, ...line.value }).returning();
			await refreshWavelengthSpan(tx, laserId);
			await audit.record(tx, { actorId: scope.userId, action: 'line.create', entity: 'emission_line', entityId: row.id, after: row });
			return { ok: true, id: row.id } as const;
		}
		const before = found.detail.lines.find((l) => l.id === lineId);
		if (!before) return notFound('emission line');
		const [after] = await tx
			.update(table.emissionLine)
			.set({ ...line.value, version: input.version + 1, updatedAt: new Date() })
			.where(and(eq(table.emissionLine.id, lineId), eq(table.emissionLine.version, input.version)))
			.returning();
		if (!after) return changedMeanwhile('emission line');
		await refreshWavelengthSpan(tx, laserId);
		// Every path carrying the line goes stale (the re-evaluation job picks them up).
		await tx.execute(sql`UPDATE beam_path SET stale = true WHERE verdict IS NOT NULL AND id IN (SELECT path_id FROM path_line WHERE line_id = ${lineId})`);
		await audit.record(tx, { actorId: scope.userId, action: 'line.update', entity: 'emission_line', entityId: lineId, before, after });
		return { ok: true, id: lineId } as const;
	});
	// As a limit change does: re-evaluate now rather than at the next schedule.
	if (saved.ok && lineId !== null) await nudge(queues.reassessPaths);
	return saved;
}
