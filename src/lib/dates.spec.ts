import { describe, expect, it } from 'vitest';
import { day, moment } from './dates';

describe('dates as pages show them', () => {
	it('shows the UTC day and minute of a Date and of an ISO string alike', () => {
		const d = new Date('2026-03-09T23:45:12.345Z');
		expect(day(d)).toBe('2026-03-09');
		expect(moment(d)).toBe('2026-03-09 23:45 UTC');
		expect(day('2026-03-09T23:45:12.345Z')).toBe('2026-03-09');
		expect(moment('2026-03-10T01:02:00+02:00')).toBe('2026-03-09 23:02 UTC');
	});
	it('says what it was told for a missing date', () => {
		expect(day(null)).toBe('—');
		expect(moment(undefined, 'not given')).toBe('not given');
	});
});
