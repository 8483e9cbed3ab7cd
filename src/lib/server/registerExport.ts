// The register as CSV, through the one CSV writer (csv.ts): lasers, lines (in the import's own
// layout, so a lines export imports again), and beam paths with their latest verdict. Only the
// labs the reader may see; values with their unit, written exactly (no rounding), so nothing is
// lost on the way back in.
import { and, asc, eq, inArray, sql, type SQL } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { inReadableLabs, type Scope } from '$lib/server/auth/scope';
import { writeCsv } from '$lib/server/csv';
import { registerColumns } from '$lib/registerCsv';
import { asEntered, fieldQuantityKinds } from '$lib/units';
import { pathStateOf } from '$lib/pathState';
import { pathStateWords, verdictWords } from '$lib/words';

export const exportKinds = ['lasers', 'lines', 'paths'] as const;
export type ExportKind = (typeof exportKinds)[number];

function visible(scope: Scope, labIds?: string[]): SQL | undefined {
	const where: SQL[] = [];
	const readable = inReadableLabs(scope, table.laser.labId);
	if (readable) where.push(readable);
	if (labIds) where.push(labIds.length ? inArray(table.laser.labId, labIds) : sql`false`);
	return where.length ? and(...where) : undefined;
}


const laserOrder = [asc(table.lab.code), asc(table.laser.maker), asc(table.laser.model), asc(table.laser.serial), asc(table.laser.id)];

/** One row per emission line, the laser's fields repeated: the import's layout (registerCsv.ts). */
export async function linesCsv(scope: Scope, labIds?: string[]): Promise<string> {
	const rows = await db
		.select({ labCode: table.lab.code, laser: table.laser, line: table.emissionLine })
		.from(table.emissionLine)
		.innerJoin(table.laser, eq(table.laser.id, table.emissionLine.laserId))
		.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
		.where(visible(scope, labIds))
		.orderBy(...laserOrder, asc(table.emissionLine.createdAt), asc(table.emissionLine.id));
	const cells = rows.map(({ labCode, laser, line }) =>
		registerColumns.map((c) => {
			if (c.field === 'labId') return labCode;
			if (!c.field.startsWith('line.')) return laser[c.field as keyof typeof laser] as string;
			const f = c.field.slice(5) as keyof typeof line;
			const value = line[f];
			// Numbers (strings from numeric columns, or null) with their unit where they have one; words as they are.
			const kind = fieldQuantityKinds[f];
			if (value === null) return '';
			return typeof value === 'string' ? (kind ? asEntered(value, kind) : value) : String(value);
		})
	);
	return writeCsv(
		registerColumns.map((c) => c.name),
		cells
	);
}

export async function lasersCsv(scope: Scope, labIds?: string[]): Promise<string> {
	const rows = await db
		.select({
			labCode: table.lab.code,
			laser: table.laser,
			areaName: table.area.name,
			lines: sql<number>`(SELECT count(*)::int FROM emission_line l WHERE l.laser_id = ${table.laser.id})`,
			paths: sql<number>`(SELECT count(*)::int FROM beam_path p WHERE p.laser_id = ${table.laser.id} AND NOT p.retired)`
		})
		.from(table.laser)
		.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
		.leftJoin(table.area, eq(table.area.id, table.laser.areaId))
		.where(visible(scope, labIds))
		.orderBy(...laserOrder);
	return writeCsv(
		['lab', 'maker', 'model', 'serial', 'class', 'status', 'area', 'lines', 'shortest wavelength', 'longest wavelength', 'beam paths', 'notes', 'updated at'],
		rows.map((r) => [
			r.labCode,
			r.laser.maker,
			r.laser.model,
			r.laser.serial,
			r.laser.laserClass,
			r.laser.status,
			r.areaName,
			r.lines,
			asEntered(r.laser.wavelengthMin, 'wavelength'),
			asEntered(r.laser.wavelengthMax, 'wavelength'),
			r.paths,
			r.laser.notes,
			r.laser.updatedAt.toISOString()
		])
	);
}

/** Beam paths (not retired) with the verdict of their latest assessment; a path never assessed says so. */
export async function pathsCsv(scope: Scope, labIds?: string[]): Promise<string> {
	const latest = sql`(SELECT a.id FROM assessment a WHERE a.path_id = ${table.beamPath.id} ORDER BY a.created_at DESC, a.id DESC LIMIT 1)`;
	const rows = await db
		.select({
			labCode: table.lab.code,
			maker: table.laser.maker,
			model: table.laser.model,
			serial: table.laser.serial,
			path: table.beamPath,
			lines: sql<{ label: string; wavelength: string }[] | null>`(SELECT json_agg(json_build_object('label', l.label, 'wavelength', l.wavelength::text) ORDER BY pl.sequence) FROM path_line pl JOIN emission_line l ON l.id = pl.line_id WHERE pl.path_id = ${table.beamPath.id})`,
			verdict: table.assessment.verdict,
			worstRatio: table.assessment.worstRatio,
			engineVersion: table.assessment.engineVersion,
			assessedAt: table.assessment.createdAt
		})
		.from(table.beamPath)
		.innerJoin(table.laser, eq(table.laser.id, table.beamPath.laserId))
		.innerJoin(table.lab, eq(table.lab.id, table.laser.labId))
		.leftJoin(table.assessment, sql`${table.assessment.id} = ${latest}`)
		.where(and(eq(table.beamPath.retired, false), visible(scope, labIds)))
		.orderBy(...laserOrder, asc(table.beamPath.name), asc(table.beamPath.id));
	return writeCsv(
		['lab', 'maker', 'model', 'serial', 'path', 'lines', 'latest verdict', 'worst ratio to the limit', 'state', 'assessed at', 'engine version', 'caution'],
		rows.map((r) => [
			r.labCode,
			r.maker,
			r.model,
			r.serial,
			r.path.name,
			(r.lines ?? []).map((l) => l.label || asEntered(l.wavelength, 'wavelength')).join('; '),
			r.verdict ? verdictWords[r.verdict].word : 'not assessed',
			r.worstRatio,
			pathStateWords[pathStateOf(r.path)].word,
			r.assessedAt?.toISOString() ?? '',
			r.engineVersion,
			'Computed from entered data; not a substitute for measurement. The laser safety officer and the local code decide.'
		])
	);
}

export function csvOf(kind: ExportKind, scope: Scope, labIds?: string[]): Promise<string> {
	return kind === 'lasers' ? lasersCsv(scope, labIds) : kind === 'lines' ? linesCsv(scope, labIds) : pathsCsv(scope, labIds);
}

/** The download of an export, for the readers the route's policy lets through. */
export async function csvResponse(kind: ExportKind, scope: Scope, url: URL): Promise<Response> {
	const lab = url.searchParams.get('lab');
	const labIds = lab && /^[0-9a-f-]{36}$/i.test(lab) ? [lab] : undefined;
	const today = new Date().toISOString().slice(0, 10);
	return new Response(await csvOf(kind, scope, labIds), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="register-${kind}-${today}.csv"`,
			'cache-control': 'no-store'
		}
	});
}
