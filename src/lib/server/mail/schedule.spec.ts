import { describe, expect, it } from 'vitest';
import { inspectionStep, reviewWaitStep, shiftDay, toIsoDay } from './schedule';

const today = '2027-03-01';
const due = (days: number) => inspectionStep(shiftDay(today, days), today);

describe('inspectionStep', () => {
	it('puts each day in exactly one window', () => {
		expect(due(31)).toBeNull();
		expect(due(30)).toMatchObject({ kind: 'inspection.due', step: '30', daysUntil: 30 });
		expect(due(8)).toMatchObject({ kind: 'inspection.due', step: '30' });
		expect(due(7)).toMatchObject({ kind: 'inspection.due', step: '7' });
		expect(due(1)).toMatchObject({ kind: 'inspection.due', step: '7' });
		expect(due(0)).toMatchObject({ kind: 'inspection.due', step: '0' });
		expect(due(-6)).toMatchObject({ kind: 'inspection.due', step: '0' });
		expect(due(-7)).toMatchObject({ kind: 'inspection.overdue', step: '1', escalate: false });
		expect(due(-13)).toMatchObject({ kind: 'inspection.overdue', step: '1' });
		expect(due(-14)).toMatchObject({ kind: 'inspection.overdue', step: '2', escalate: true });
		expect(due(-70)).toMatchObject({ kind: 'inspection.overdue', step: '10' });
	});

	it('counts calendar days across month ends and leap days', () => {
		expect(inspectionStep('2028-03-01', '2028-02-28')).toMatchObject({ step: '7', daysUntil: 2 });
		expect(inspectionStep('2027-03-31', '2027-03-01')).toMatchObject({ step: '30', daysUntil: 30 });
	});
});

describe('reviewWaitStep', () => {
	it('starts after more than seven days, then weekly', () => {
		expect(reviewWaitStep(shiftDay(today, -7), today)).toBeNull();
		expect(reviewWaitStep(shiftDay(today, -8), today)).toEqual({ step: '1', daysWaiting: 8 });
		expect(reviewWaitStep(shiftDay(today, -14), today)).toEqual({ step: '1', daysWaiting: 14 });
		expect(reviewWaitStep(shiftDay(today, -15), today)).toEqual({ step: '2', daysWaiting: 15 });
	});
});

describe('toIsoDay', () => {
	it('accepts real calendar days and reads dates in UTC', () => {
		expect(toIsoDay('2027-03-01')).toBe('2027-03-01');
		expect(toIsoDay(new Date('2027-03-01T23:30:00Z'))).toBe('2027-03-01');
		expect(() => toIsoDay('2027-02-30')).toThrow(/calendar date/);
		expect(() => toIsoDay('1 March')).toThrow(/calendar date/);
	});
});
