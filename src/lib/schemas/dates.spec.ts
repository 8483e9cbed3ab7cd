import { describe, expect, it } from 'vitest';
import { isCalendarDay } from './dates';
import { recordInspectionSchema } from './inspections';
import { updateUserSchema } from './users';

describe('calendar days', () => {
	it('accepts days that exist, leap days included (Gregorian rules, common practice)', () => {
		for (const d of ['2026-12-01', '2024-02-29', '2000-02-29', '1999-12-31']) expect(isCalendarDay(d), d).toBe(true);
	});
	it('refuses days that do not exist, which Date.parse would roll over into the next month', () => {
		expect(Number.isNaN(Date.parse('2024-02-31'))).toBe(false); // why a round trip is needed
		for (const d of ['2024-02-31', '2023-02-29', '1900-02-29', '2025-04-31', '2026-13-01', '2026-00-10', '2026-1-1', 'today', '']) expect(isCalendarDay(d), d).toBe(false);
	});
	it('an inspection dated 31 February is a field message, not a database error', () => {
		const r = recordInspectionSchema.safeParse({ completedOn: '2024-02-31' });
		expect(r.success).toBe(false);
		expect(r.error!.issues.some((i) => i.path[0] === 'completedOn')).toBe(true);
	});
});

describe('people', () => {
	it('a lab chosen twice is refused by the schema', () => {
		const lab = '7f1c2b3a-1111-4a2b-9c3d-0123456789ab';
		const r = updateUserSchema.safeParse({ role: 'researcher', disabled: false, labIds: [lab, lab], version: 1 });
		expect(r.success).toBe(false);
		expect(r.error!.issues.map((i) => i.path.join('.'))).toContain('labIds');
	});
});
