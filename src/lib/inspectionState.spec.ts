import { describe, expect, it } from 'vitest';
import { inspectionState } from './inspectionState';

describe('inspection state', () => {
	it('is overdue from the day after the due date, due soon within 30 days, else scheduled', () => {
		expect(inspectionState('2026-12-01', null, '2026-12-02')).toBe('overdue');
		expect(inspectionState('2026-12-01', null, '2026-12-01')).toBe('due_soon');
		expect(inspectionState('2026-12-31', null, '2026-12-01')).toBe('due_soon');
		expect(inspectionState('2027-01-01', null, '2026-12-01')).toBe('scheduled');
		expect(inspectionState('2026-01-01', '2026-01-05', '2026-12-01')).toBe('done');
	});
});
