import { describe, expect, it } from 'vitest';
import { procedureState } from './procedureState';

const today = '2027-03-15';

describe('procedure state', () => {
	it('before the first approval, is its draft’s state', () => {
		expect(procedureState({ reviewNeeded: false, current: null, draftState: null }, today)).toBe('draft');
		expect(procedureState({ reviewNeeded: false, current: null, draftState: 'submitted' }, today)).toBe('submitted');
		// A path change before any approval leaves nothing approved to review.
		expect(procedureState({ reviewNeeded: true, current: null, draftState: 'draft' }, today)).toBe('draft');
	});
	it('once approved, follows its review-by date', () => {
		expect(procedureState({ reviewNeeded: false, current: { reviewBy: '2027-04-15' }, draftState: null }, today)).toBe('approved');
		expect(procedureState({ reviewNeeded: false, current: { reviewBy: '2027-04-14' }, draftState: 'draft' }, today)).toBe('review_due');
		expect(procedureState({ reviewNeeded: false, current: { reviewBy: today }, draftState: null }, today)).toBe('review_due');
		expect(procedureState({ reviewNeeded: false, current: { reviewBy: '2027-03-14' }, draftState: null }, today)).toBe('review_overdue');
	});
	it('a covered path that changed outweighs the date', () => {
		expect(procedureState({ reviewNeeded: true, current: { reviewBy: '2028-01-01' }, draftState: null }, today)).toBe('to_be_reviewed');
	});
});
