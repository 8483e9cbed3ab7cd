import { describe, expect, it } from 'vitest';
import { csvCell } from './csv';

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
