// Reading a register CSV into rows the import can write: every row checked by the same schema as
// the laser and line forms and by the engine's line rules, each problem named by the line of the
// file, the column and a message. Pure: the labs are passed in, nothing is read from the database.
import { newLaserSchema, type LineValues } from '$lib/schemas/register';
import { readCsv, unneutralise } from '$lib/server/csv';
import { checkedLine } from '$lib/server/lineRules';
import { IMPORT_MAX_ROWS, registerColumns, type ImportProblem, type RegisterColumn } from '$lib/registerCsv';
import type { LaserClass, LaserStatus } from '$lib/enums';

export type LaserValues = { labId: string; maker: string; model: string; serial: string; laserClass: LaserClass; status: LaserStatus; notes: string };

/** A row of the file: its values when it is valid, else its problems. `key` groups the rows of one laser. */
export type ParsedRow = { line: number; key: string; laser: LaserValues | null; values: LineValues | null; problems: ImportProblem[] };

export type ParsedFile = { ok: true; rows: ParsedRow[] } | { ok: false; problems: ImportProblem[] };

const byField = new Map(registerColumns.map((c) => [c.field, c]));
const laserFieldNames = ['labId', 'maker', 'model', 'serial', 'laserClass', 'status', 'notes'] as const;
/** Stands in for an unknown lab's id while the rest of the row is checked (the lab has its own message). */
const NO_LAB = '00000000-0000-4000-8000-000000000000';

const headerName = (h: string) => h.trim().toLowerCase().replace(/[\s-]+/g, '_');

export function laserKey(labId: string, serial: string): string {
	return `${labId}/${serial}`; // a uuid has a fixed length: the key is unambiguous
}

function columnOf(path: readonly PropertyKey[]): RegisterColumn | undefined {
	return byField.get(path.map(String).join('.'));
}

function message(column: RegisterColumn | undefined, text: string): string {
	if (!column?.values) return text;
	return `${text} One of: ${column.values.join(', ')}.`;
}

export function parseRegisterFile(text: string, labs: readonly { id: string; code: string }[]): ParsedFile {
	const csv = readCsv(text, IMPORT_MAX_ROWS);
	if (!csv.ok) return { ok: false, problems: [{ line: csv.line, column: '', message: csv.message }] };

	// The header: known columns in any order and letter case; the required ones present.
	const problems: ImportProblem[] = [];
	const index = new Map<string, number>();
	csv.head.forEach((h, i) => {
		const name = headerName(h);
		if (name === '' && csv.records.every((r) => (r.cells[i] ?? '').trim() === '')) return; // a trailing empty column
		if (!registerColumns.some((c) => c.name === name)) problems.push({ line: 1, column: h, message: `“${h.slice(0, 40)}” is not a column of the register; the columns are listed on the import page.` });
		else if (index.has(name)) problems.push({ line: 1, column: h, message: `The column “${name}” appears twice.` });
		else index.set(name, i);
	});
	for (const c of registerColumns) if (c.required === 'always' && !index.has(c.name)) problems.push({ line: 1, column: c.name, message: `The column “${c.name}” is missing.` });
	if (problems.length) return { ok: false, problems };
	if (csv.records.length === 0) return { ok: false, problems: [{ line: 2, column: '', message: 'The file has a header but no rows.' }] };

	const labByCode = new Map(labs.map((l) => [l.code.trim().toLowerCase(), l.id]));
	const rows = csv.records.map((record) => parseRow(record.line, record.cells, csv.head.length, index, labByCode));
	checkLaserFieldsAgree(rows);
	return { ok: true, rows };
}

function parseRow(line: number, cells: string[], width: number, index: Map<string, number>, labByCode: Map<string, string>): ParsedRow {
	const problems: ImportProblem[] = [];
	if (cells.length > width) problems.push({ line, column: '', message: `The row has ${cells.length} fields; the header has ${width}. A value with a comma needs quotes.` });
	const cell = (name: string) => {
		const i = index.get(name);
		return i === undefined ? '' : unneutralise(cells[i] ?? '').trim();
	};

	const laser: Record<string, unknown> = {};
	const lineForm: Record<string, unknown> = {};
	for (const c of registerColumns) {
		const value = cell(c.name);
		// An empty cell of a column with a default (mode, class, …) takes the form's default.
		const v = value === '' && c.values ? undefined : value;
		if (c.field.startsWith('line.')) lineForm[c.field.slice(5)] = v;
		else laser[c.field] = v;
	}
	const labCode = cell('lab');
	const labId = labByCode.get(labCode.toLowerCase());
	if (labCode === '') problems.push({ line, column: 'lab', message: 'Enter the lab’s code.' });
	else if (!labId) problems.push({ line, column: 'lab', message: `No lab has the code “${labCode.slice(0, 40)}”.` });
	laser.labId = labId ?? NO_LAB;
	if (cell('serial') === '') problems.push({ line, column: 'serial', message: 'Enter the serial number (or a local asset number): a later import finds the laser by it.' });

	const parsed = newLaserSchema.safeParse({ ...laser, line: lineForm });
	let values: LineValues | null = null;
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const column = columnOf(issue.path);
			if (column?.name === 'lab' || (column?.name === 'serial' && cell('serial') === '')) continue;
			problems.push({ line, column: column?.name ?? '', message: message(column, issue.message) });
		}
	} else {
		const checked = checkedLine(parsed.data.line, 'line.');
		if (checked.ok) values = checked.value;
		else for (const [field, text] of Object.entries(checked.errors)) problems.push({ line, column: byField.get(field)?.name ?? '', message: text });
	}
	if (problems.length || !parsed.success || !values) return { line, key: '', laser: null, values: null, problems };
	const d = parsed.data;
	return { line, key: laserKey(d.labId, d.serial), laser: { labId: d.labId, maker: d.maker, model: d.model, serial: d.serial, laserClass: d.laserClass, status: d.status, notes: d.notes }, values, problems };
}

/** Rows of one laser (same lab and serial) must give it the same fields; the first row decides. */
function checkLaserFieldsAgree(rows: ParsedRow[]) {
	const first = new Map<string, ParsedRow>();
	for (const row of rows) {
		if (!row.laser) continue;
		const lead = first.get(row.key);
		if (!lead) {
			first.set(row.key, row);
			continue;
		}
		for (const f of laserFieldNames) {
			if (row.laser[f] === lead.laser![f]) continue;
			row.problems.push({ line: row.line, column: byField.get(f)!.name, message: `Differs from line ${lead.line}, which gives this laser’s ${byField.get(f)!.name} (rows with the same lab and serial are one laser).` });
		}
		if (row.problems.length) {
			row.laser = null;
			row.values = null;
		}
	}
}
