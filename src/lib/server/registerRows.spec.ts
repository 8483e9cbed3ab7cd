import { describe, expect, it } from 'vitest';
import { writeCsv } from './csv';
import { parseRegisterFile } from './registerRows';
import { registerColumnNames } from '$lib/registerCsv';

const labs = [
	{ id: '11111111-1111-4111-8111-111111111111', code: 'SPX' },
	{ id: '22222222-2222-4222-8222-222222222222', code: 'UFL' }
];

/** A valid row of the template's columns, with changes. */
function row(changes: Record<string, string> = {}): string[] {
	const base: Record<string, string> = { lab: 'SPX', maker: 'Northlight Optics', model: 'Beacon 532', serial: 'NB-1', class: '3B', status: 'active', mode: 'continuous', wavelength: '532 nm', power: '50 mW', beam_diameter: '1.5 mm', divergence: '1.2 mrad' };
	return registerColumnNames.map((c) => ({ ...base, ...changes })[c] ?? '');
}
const file = (rows: string[][], head = registerColumnNames) => writeCsv(head, rows);

describe('reading a register CSV', () => {
	it('reads valid rows into SI values, one laser per lab and serial', () => {
		const parsed = parseRegisterFile(file([row(), row({ line_label: 'second', wavelength: '1064', power: '0.2 W' }), row({ serial: 'NB-2' })]), labs);
		expect(parsed.ok).toBe(true);
		if (!parsed.ok) return;
		expect(parsed.rows.map((r) => r.problems)).toEqual([[], [], []]);
		expect(parsed.rows.map((r) => r.line)).toEqual([2, 3, 4]);
		expect(parsed.rows[0].key).toBe(parsed.rows[1].key);
		expect(parsed.rows[2].key).not.toBe(parsed.rows[0].key);
		expect(parsed.rows[1].values).toMatchObject({ wavelength: '0.000001064', power: '0.2' });
		expect(parsed.rows[0].laser).toMatchObject({ labId: labs[0].id, laserClass: '3B', serial: 'NB-1' });
	});

	it('a file with 50 bad rows among 200 reports exactly those 50, by line and column', () => {
		const rows: string[][] = [];
		const bad = new Set<number>();
		for (let i = 0; i < 200; i++) {
			const kind = i % 4 === 1 ? i % 5 : -1;
			const changes: Record<string, string> = { serial: `SN-${i}` };
			if (kind === 0) changes.power = '5 parsecs';
			else if (kind === 1) changes.lab = 'NOPE';
			else if (kind === 2) changes.class = '5';
			else if (kind === 3) changes.maker = '';
			else if (kind === 4) changes.mode = 'single_pulse'; // needs a pulse energy and duration
			if (kind >= 0) bad.add(i + 2);
			rows.push(row(changes));
		}
		const parsed = parseRegisterFile(file(rows), labs);
		if (!parsed.ok) throw new Error(JSON.stringify(parsed.problems));
		const failing = parsed.rows.filter((r) => r.problems.length);
		expect(failing).toHaveLength(50);
		expect(new Set(failing.map((r) => r.line))).toEqual(bad);
		const byLine = new Map(failing.map((r) => [r.line, r.problems]));
		expect(byLine.get(3)).toEqual([{ line: 3, column: 'lab', message: 'No lab has the code “NOPE”.' }]);
		expect(byLine.get(7)).toEqual([{ line: 7, column: 'power', message: expect.stringContaining('parsecs') }]);
		expect(byLine.get(11)!.map((p) => p.column).sort()).toEqual(['pulse_duration', 'pulse_energy']);
		expect(byLine.get(15)).toEqual([{ line: 15, column: 'maker', message: 'Enter the maker.' }]);
		expect(byLine.get(19)).toEqual([{ line: 19, column: 'class', message: expect.stringContaining('One of: 1, 1M, 2, 2M, 3R, 3B, 4.') }]);
		expect(parsed.rows.filter((r) => r.values).length).toBe(150);
	});

	it('counts lines of the file, not records, when a quoted field spans lines', () => {
		const parsed = parseRegisterFile(file([row({ notes: 'first\nsecond\nthird' }), row({ serial: 'X', power: 'lots' })]), labs);
		if (!parsed.ok) throw new Error('not read');
		expect(parsed.rows.map((r) => r.line)).toEqual([2, 5]);
		expect(parsed.rows[1].problems[0]).toMatchObject({ line: 5, column: 'power' });
	});

	it('refuses a line the engine cannot assess, naming the column', () => {
		const parsed = parseRegisterFile(file([row({ wavelength: '10 nm' })]), labs);
		if (!parsed.ok) throw new Error('not read');
		expect(parsed.rows[0].problems).toHaveLength(1);
		expect(parsed.rows[0].problems[0].column).toBe('wavelength');
	});

	it('names unknown and missing columns, an unclosed quote and an empty file', () => {
		const head = [...registerColumnNames.filter((c) => c !== 'divergence'), 'colour'];
		const r = parseRegisterFile(file([], head), labs);
		expect(r).toEqual({ ok: false, problems: [expect.objectContaining({ line: 1, column: 'colour' }), expect.objectContaining({ line: 1, column: 'divergence', message: 'The column “divergence” is missing.' })] });
		expect(parseRegisterFile(file([]), labs)).toMatchObject({ ok: false, problems: [{ message: 'The file has a header but no rows.' }] });
		expect(parseRegisterFile('', labs)).toMatchObject({ ok: false, problems: [{ line: 1, message: 'The file is empty.' }] });
		const broken = registerColumnNames.join(',') + '\nSPX,"Northlight,Beacon\n';
		expect(parseRegisterFile(broken, labs)).toMatchObject({ ok: false, problems: [{ line: 2, message: expect.stringContaining('not closed') }] });
	});

	it('takes letter case and spaces in the header, a byte-order mark and the apostrophe of our own exports', () => {
		const head = registerColumnNames.map((c) => c.toUpperCase().replace(/_/g, ' '));
		const parsed = parseRegisterFile('\ufeff' + file([row({ notes: '=1+1' })], head), labs);
		if (!parsed.ok) throw new Error(JSON.stringify(parsed.problems));
		expect(parsed.rows[0].problems).toEqual([]);
		expect(parsed.rows[0].laser!.notes).toBe('=1+1');
	});

	it('rows of one laser must agree on its fields', () => {
		const parsed = parseRegisterFile(file([row(), row({ model: 'Other', line_label: 'b' })]), labs);
		if (!parsed.ok) throw new Error('not read');
		expect(parsed.rows[1].problems).toEqual([{ line: 3, column: 'model', message: expect.stringContaining('Differs from line 2') }]);
	});
});
