// CSV cells that spreadsheets will not run as formulas. A cell is checked after Unicode
// normalisation (a full-width ＝ becomes =) and with leading invisible characters (zero-width space,
// byte-order mark, other format characters and spaces) set aside, since spreadsheets ignore those.
const formulaStart = /^[=+\-@\t\r]/;

export function isFormulaLike(value: string): boolean {
	const visible = value.normalize('NFKC').replace(/^[\p{Cf}\p{Z}\s]+/u, '');
	return formulaStart.test(value) || formulaStart.test(visible);
}

/** One quoted CSV field; a formula-like value gets a leading apostrophe so it stays text. */
export function csvCell(v: string | number | null): string {
	let s = v === null ? '' : String(v);
	if (isFormulaLike(s)) s = `'${s}`;
	return `"${s.replace(/"/g, '""')}"`;
}
