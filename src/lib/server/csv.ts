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
	const parsed = Papa.parse<string[]>(source, { skipEmptyLines: false, preview: maxRecords + 2 });
	// A file of one column has no delimiter to detect: not a fault.
	const errors = parsed.errors.filter((e) => e.type !== 'Delimiter');
	// Each record starts on the line after the previous one ended: one line end, plus those inside its quoted fields.
	const newline = parsed.meta.linebreak === '\r' ? '\r' : '\n';
	const records: CsvRecord[] = [];
	let line = 1;
	for (let i = 0; i < parsed.data.length; i++) {
		const cells = parsed.data[i];
		const start = line;
		for (const c of cells) for (let at = c.indexOf(newline); at !== -1; at = c.indexOf(newline, at + 1)) line++;
		line++;
		const fault = errors.find((e) => e.row === i);
		if (fault) {
			const message = fault.code === 'MissingQuotes' ? 'A quoted field is not closed (a " is missing).' : fault.code === 'InvalidQuotes' ? 'A quote (") inside a field that is not quoted; put the field in quotes and double the quote.' : fault.message;
			return { ok: false, line: start, message };
		}
		if (cells.length === 1 && cells[0].trim() === '') continue;
		records.push({ line: start, cells });
	}
	if (records.length > maxRecords + 1) return { ok: false, line: records[maxRecords + 1].line, message: `The file has more than ${maxRecords.toLocaleString('en')} rows; split it into smaller files.` };
	if (records.length === 0) return { ok: false, line: 1, message: 'The file is empty.' };
	const [head, ...rest] = records;
	return { ok: true, head: head.cells.map((c) => c.trim()), records: rest };
}
