import { describe, expect, it } from 'vitest';
import { trainingStep } from '$lib/server/mail/schedule';
import { trainingState } from './trainingState';

describe('training state and reminder step', () => {
	const today = '2026-12-01';
	it('is valid through its expiry day, expires soon within 30 days, expired after', () => {
		expect(trainingState('2027-01-01', false, today)).toBe('current'); // 31 days
		expect(trainingState('2026-12-31', false, today)).toBe('expires_soon'); // 30 days
		expect(trainingState(today, false, today)).toBe('expires_soon');
		expect(trainingState('2026-11-30', false, today)).toBe('expired');
		expect(trainingState(null, false, today)).toBe('no_expiry');
		expect(trainingState('2026-11-30', true, today)).toBe('withdrawn');
	});
	it('reminds in the 30 days up to expiry and in the week after, never outside', () => {
		expect(trainingStep('2027-01-01', today)).toBeNull();
		expect(trainingStep('2026-12-31', today)).toEqual({ kind: 'training.expiring', daysUntil: 30 });
		expect(trainingStep(today, today)).toEqual({ kind: 'training.expiring', daysUntil: 0 });
		expect(trainingStep('2026-11-30', today)).toEqual({ kind: 'training.expired', daysUntil: -1 });
		expect(trainingStep('2026-11-24', today)).toEqual({ kind: 'training.expired', daysUntil: -7 });
		expect(trainingStep('2026-11-23', today)).toBeNull();
	});
});
