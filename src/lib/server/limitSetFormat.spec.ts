import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { demoLimits } from '../../../seed/demo';
import { schemaFile, schemaText } from '../../../scripts/limit-set-schema';
import { limitToSI, type LimitForm, type StoredLimit } from '$lib/schemas/limits';
import { MAX_LIMIT_SET_BYTES } from '$lib/schemas/limitSet';
import { changedFields, limitSetDocument, readLimitSet, type RowProblem } from './limitSetFormat';

const form = (l: (typeof demoLimits)[number]): Omit<LimitForm, 'version'> => ({ ...l, noTrainCorrection: false, demonstration: true, validFrom: '', validUntil: '' });
const library = (): { limitId: string; stored: StoredLimit }[] => demoLimits.map((l) => ({ limitId: randomUUID(), stored: limitToSI(form(l)) }));
const fileOf = (limits: unknown[]) => JSON.stringify({ format: 'beamwarden-limit-set', version: 1, exportedAt: '2026-12-01T09:00:00.000Z', limits });
const problemsOf = (text: string): RowProblem[] => {
	const read = readLimitSet(text);
	if (read.ok) throw new Error('expected a refusal');
	return read.problems;
};

describe('limit-set files', () => {
	it('round trip: export → parse → equal, every field of every limit, the factors and citations included', () => {
		const lib = library();
		const text = JSON.stringify(limitSetDocument(lib, new Date('2026-12-01T09:00:00Z')));
		const read = readLimitSet(text);
		if (!read.ok) throw new Error(JSON.stringify(read.problems.slice(0, 3)));
		expect(read.rows).toHaveLength(lib.length);
		read.rows.forEach((row, i) => {
			expect(row.id).toBe(lib[i].limitId);
			expect(changedFields(limitToSI(row), lib[i].stored)).toEqual([]);
		});
		// The file itself reads again to the very same rows.
		expect(JSON.parse(text).limits).toEqual(read.rows);
		const withFactor = JSON.parse(text).limits.find((r: LimitForm) => r.wavelengthFactorKind === 'exponential');
		expect(withFactor).toMatchObject({ wavelengthFactorSlope: expect.any(String), wavelengthFactorOrigin: expect.stringMatching(/nm$/), citation: expect.stringMatching(/recalled from memory/) });
	});

	it('keeps a value beyond the 12 digits the form shows exactly, in its SI unit', () => {
		const stored = { ...limitToSI(form(demoLimits[0])), k: '0.000150000000000123', wavelengthMin: '0.000000400000000000017' };
		const doc = limitSetDocument([{ limitId: randomUUID(), stored }]);
		expect(doc.limits[0].k).toBe('0.000150000000000123 J/m²');
		const read = readLimitSet(JSON.stringify(doc));
		if (!read.ok) throw new Error(read.message);
		expect(changedFields(limitToSI(read.rows[0]), stored)).toEqual([]);
	});

	it('names each bad row (counted from 1), its label and field, and refuses the whole file', () => {
		const good = limitSetDocument(library()).limits;
		const rows: unknown[] = [
			good[0],
			{ ...good[1], k: '-2 J/m²', wavelengthMin: 'blue' },
			good[2],
			{ ...good[3], colour: 'red' },
			{ ...good[4], n: '-5' }, // passes the form's pattern, refused by the engine's own rule
			'not a limit',
			{ ...good[6], id: good[0].id }
		];
		const read = readLimitSet(fileOf(rows));
		expect(read.ok).toBe(false);
		if (read.ok) return;
		expect(read.status).toBe(400);
		expect(read.message).toBe('5 of 7 limits need attention. Nothing was imported.');
		const at = (row: number) => read.problems.filter((p) => p.row === row).map((p) => `${p.label} | ${p.field}`);
		expect(at(2)).toEqual([`${good[1].label} | wavelengthMin`, `${good[1].label} | k`]);
		expect(at(4)).toEqual([`${good[3].label} | colour`]);
		expect(at(5)).toEqual([`${good[4].label} | n`]);
		expect(at(6)).toEqual([' | (row)']);
		expect(at(7)).toEqual([`${good[6].label} | id`]);
		expect(read.problems.find((p) => p.row === 2 && p.field === 'k')).toMatchObject({ fieldName: 'Coefficient k', message: 'The limit must be above zero.' });
		expect(read.problems.find((p) => p.row === 7)?.message).toBe('Row 1 has the same id; each limit may appear once.');
		expect(at(1)).toEqual([]);
	});

	it('refuses what is not a limit set of this version with a clear message', () => {
		const refusal = (text: string) => {
			const read = readLimitSet(text);
			return read.ok ? 'accepted' : `${read.status} ${read.message}`;
		};
		expect(refusal('{"format": "beamwarden-limit-set", "limits": [')).toMatch(/^400 The file is not valid JSON \(/);
		expect(refusal('[1, 2]')).toBe('400 This is not a Beamwarden limit set: its "format" must be "beamwarden-limit-set". Nothing was imported.');
		expect(refusal(JSON.stringify({ format: 'another-format', version: 1 }))).toMatch(/^400 This is not a Beamwarden limit set/);
		expect(refusal(JSON.stringify({ format: 'beamwarden-limit-set', version: 2, exportedAt: '2030-01-01T00:00:00Z', limits: [] }))).toBe(
			'400 This limit set is written in version 2 of the format; this Beamwarden reads version 1. Nothing was imported.'
		);
		expect(refusal(fileOf([]))).toBe('400 The file holds no limits. Nothing was imported.');
		expect(refusal(' '.repeat(MAX_LIMIT_SET_BYTES + 1))).toMatch(/^413 The file is larger than 2 MB/);
		const header = problemsOf(JSON.stringify({ format: 'beamwarden-limit-set', version: 1, limits: [], extra: 1 }));
		expect(header.map((p) => `${p.row} ${p.field}`).sort()).toEqual(['null exportedAt', 'null extra']);
	});

	it('publishes a JSON Schema generated from the same zod schema (regenerate with scripts/limit-set-schema.ts)', () => {
		expect(readFileSync(schemaFile, 'utf8')).toBe(schemaText());
		const schema = JSON.parse(schemaText());
		const row = schema.properties.limits.items;
		expect(row.additionalProperties).toBe(false);
		expect(Object.keys(row.properties)).toEqual(expect.arrayContaining(['id', 'label', 'k', 'wavelengthFactorSlope', 'extendedAlphaMin', 'pulseGroupingTime', 'limitingApertureExponent', 'citation']));
		expect(row.required).toEqual(expect.arrayContaining(['label', 'wavelengthMin', 'k', 'limitingAperture', 'citation']));
	});
});
