// CSV in and out, through one library (papaparse). Every export goes through writeCsv, which keeps
// formula-like cells as text; every import through readCsv, which says on which line of the file
// each record starts (a quoted field may span lines).
import Papa from 'papaparse';

// CSV cells that spreadsheets will not run as formulas. A cell is checked after Unicode
// normalisation (a full-width ＝ becomes =) and with leading invisible characters (zero-width space,
// byte-order mark, other format characters and spaces) set aside, since spreadsheets ignore those.
// U+2212 (minus sign) stays itself under NFKC, so it is named.
const formulaStart = /^[=+\-\u2212@\t\r]/;

export function isFormulaLike(value: string): boolean {
	const visible = value.normalize('NFKC').replace(/^[\p{Cf}\p{Z}\s]+/u, '');
	return formulaStart.test(value) || formulaStart.test(visible);
}

type Cell = string | number | null | undefined;

function safe(v: Cell): string {
	const s = v === null || v === undefined ? '' : String(v);
	return isFormulaLike(s) ? `'${s}` : s;
}

/** One quoted CSV field; a formula-like value gets a leading apostrophe so it stays text. */
export function csvCell(v: string | number | null): string {
	return `"${safe(v).replace(/"/g, '""')}"`;
}

/** A whole CSV file: every field quoted, CRLF line ends, formula-like cells neutralised. */
export function writeCsv(head: readonly string[], rows: readonly (readonly Cell[])[]): string {
	const body = Papa.unparse({ fields: head.map(safe), data: rows.map((r) => r.map(safe)) }, { quotes: true, newline: '\r\n', escapeFormulae: false });
	return body + '\r\n';
}

/**
 * The apostrophe writeCsv puts before a formula-like value is taken off again on import, so an
 * export read back gives the same text (the value is still only ever stored as text).
 */
export function unneutralise(cell: string): string {
	return cell.startsWith("'") && isFormulaLike(cell.slice(1)) ? cell.slice(1) : cell;
}

export type CsvRecord = { line: number; cells: string[] };
export type ReadCsv = { ok: true; head: string[]; records: CsvRecord[] } | { ok: false; line: number; message: string };

/**
 * Records of a CSV text (header first), each with the line of the file it starts on. Blank lines
 * are skipped. A malformed file (an unclosed quote) answers with the line where it goes wrong.
 */
export function readCsv(text: string, maxRecords: number): ReadCsv {
	const source = text.replace(/^\ufeff/, '');
	const newline = source.includes('\n') ? '\n' : '\r';
	const records: CsvRecord[] = [];
	let start = 0;
	let line = 1;
	let problem: { line: number; message: string } | null = null;
	let tooMany = false;
	Papa.parse<string[]>(source, {
		skipEmptyLines: false,
		step: (result, handle) => {
			const end = result.meta.cursor;
			const startLine = line;
			// Lines the record spans (its own line end included) move the count on.
			for (let i = source.indexOf(newline, start); i !== -1 && i < end; i = source.indexOf(newline, i + 1)) line++;
			start = end;
			// A file of one column has no delimiter to detect: not a fault.
			const errors = result.errors.filter((e) => e.type !== 'Delimiter');
			if (errors.length && !problem) {
				const e = errors[0];
				problem = { line: startLine, message: e.code === 'MissingQuotes' ? 'A quoted field is not closed (a " is missing).' : e.code === 'InvalidQuotes' ? 'A quote (") inside a field that is not quoted; put the field in quotes and double the quote.' : e.message };
				handle.abort();
				return;
			}
			const cells = result.data;
			if (cells.length === 1 && cells[0].trim() === '') return;
			if (records.length >= maxRecords + 1) {
				tooMany = true;
				handle.abort();
				return;
			}
			records.push({ line: startLine, cells });
		}
	});
	if (problem) return { ok: false, ...(problem as { line: number; message: string }) };
	if (tooMany) return { ok: false, line: records[records.length - 1].line, message: `The file has more than ${maxRecords.toLocaleString('en')} rows; split it into smaller files.` };
	if (records.length === 0) return { ok: false, line: 1, message: 'The file is empty.' };
	const [head, ...rest] = records;
	return { ok: true, head: head.cells.map((c) => c.trim()), records: rest };
}
