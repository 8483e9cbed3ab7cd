import { describe, expect, it } from 'vitest';
import { csvCell, readCsv, unneutralise, writeCsv } from './csv';

describe('CSV cells', () => {
	it('keep formula-like values as text, however they are disguised', () => {
		for (const v of ['=1+1', '+1', '-1', '@SUM(A1)', '\t=1', '\r=1', '\u200b=HYPERLINK("x")', '\ufeff=1', '\uff1d1+1', ' \u200b\uff0bcmd', '\u2060@x'])
			expect(csvCell(v), JSON.stringify(v)).toBe(`"'${v.replace(/"/g, '""')}"`);
	});

	it('leave ordinary values alone and quote every field', () => {
		expect(csvCell('Room 1.12 "north"')).toBe('"Room 1.12 ""north"""');
		expect(csvCell(12)).toBe('"12"');
		expect(csvCell(null)).toBe('""');
		expect(csvCell('a=b')).toBe('"a=b"');
	});
});

describe('CSV files', () => {
	it('neutralise every formula-leading character in every cell, header included', () => {
		for (const c of ['=', '+', '-', '\u2212', '@', '\t', '\r', '\uff1d', '\uff0b', '\uff0d']) {
			const csv = writeCsv([`${c}head`], [[`${c}cmd`], [`\u200b${c}=1`]]);
			expect(csv, JSON.stringify(c)).toBe(`"'${c}head"\r\n"'${c}cmd"\r\n"'\u200b${c}=1"\r\n`);
			// and the importer takes the apostrophe off again
			const read = readCsv(csv, 10);
			if (!read.ok) throw new Error(read.message);
			expect(unneutralise(read.records[0].cells[0])).toBe(`${c}cmd`);
		}
	});

	it('quote fields with commas, quotes and line ends', () => {
		expect(writeCsv(['a', 'b'], [['x, "y"', 'two\nlines'], [null, 3]])).toBe('"a","b"\r\n"x, ""y""","two\nlines"\r\n"","3"\r\n');
		expect(unneutralise("'ordinary")).toBe("'ordinary");
	});
});
