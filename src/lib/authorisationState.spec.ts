import { describe, expect, it } from 'vitest';
import { authorisationState, isInForce, signoffState, signoffValidUntil, type AuthorisationFacts, type ProcedureFact, type TrainingFact } from './authorisationState';

const today = '2027-03-15';
const induction = (expiresOn: string | null, completedOn = '2026-03-01'): TrainingFact => ({ topic: 'Laser safety induction', latest: { completedOn, expiresOn } });
const sop = (p: Partial<ProcedureFact> = {}): ProcedureFact => ({ procedureId: 'p1', title: 'Alignment of the amplifier', current: { number: 2, approvedOn: '2027-01-10' }, signedCurrentOn: '2027-01-12', signedEarlier: 1, ...p });
const granted = (f: Partial<AuthorisationFacts> = {}): AuthorisationFacts => ({ decision: 'granted', grantedOn: '2027-01-11', expiresOn: null, accountDisabled: false, trainings: [], procedures: [], ...f });

describe('sign-offs', () => {
	it('hold for the interval, up to and including the same day months later', () => {
		expect(signoffValidUntil('2026-03-15', 12)).toBe('2027-03-15');
		expect(signoffValidUntil('2024-02-29', 12)).toBe('2025-02-28');
		expect(signoffState({ current: { number: 1, approvedOn: '2026-01-01' }, signedCurrentOn: '2026-03-15' }, 12, today)).toEqual({ state: 'signoff_lapses_soon', validUntil: '2027-03-15' });
		expect(signoffState({ current: { number: 1, approvedOn: '2026-01-01' }, signedCurrentOn: '2026-03-14' }, 12, today)).toEqual({ state: 'signoff_lapsed', validUntil: '2027-03-14' });
		expect(signoffState({ current: { number: 1, approvedOn: '2026-01-01' }, signedCurrentOn: '2026-03-14' }, 24, today)).toEqual({ state: 'signed', validUntil: '2028-03-14' });
	});
	it('ask for a signature when the current version is unsigned, and say when there is nothing to sign', () => {
		expect(signoffState({ current: { number: 3, approvedOn: '2027-03-01' }, signedCurrentOn: null }, 12, today).state).toBe('to_sign');
		expect(signoffState({ current: null, signedCurrentOn: null }, 12, today).state).toBe('no_approved_version');
	});
});

describe('authorisation state', () => {
	it('follows the officer’s word before any condition', () => {
		for (const decision of ['requested', 'refused', 'withdrawn'] as const) expect(authorisationState(granted({ decision, trainings: [induction('2026-01-01')] }), 12, today).state).toBe(decision);
	});

	it('is active with no conditions, and with every condition holding; it names the first day one ends', () => {
		expect(authorisationState(granted(), 12, today)).toMatchObject({ state: 'active', reasons: [], lapses: [], validUntil: null });
		const all = authorisationState(granted({ expiresOn: '2027-12-31', trainings: [induction('2027-09-30'), induction(null)], procedures: [sop()] }), 12, today);
		expect(all.state).toBe('active');
		expect(all.conditions.map((c) => c.holds)).toEqual([true, true, true, true]);
		expect(all.validUntil).toBe('2027-09-30');
	});

	it('lapses soon when a condition ends within 30 days, and is still in force', () => {
		const o = authorisationState(granted({ trainings: [induction('2027-04-14')] }), 12, today);
		expect(o).toMatchObject({ state: 'lapses_soon', validUntil: '2027-04-14' });
		expect(isInForce(o.state)).toBe(true);
		expect(authorisationState(granted({ trainings: [induction('2027-04-15')] }), 12, today).state).toBe('active');
		expect(authorisationState(granted({ expiresOn: today }), 12, today).state).toBe('lapses_soon');
	});

	// Each condition alone, failing after the grant: a lapse, with the reason and the day it began.
	const lapses: [string, Partial<AuthorisationFacts>, string, string][] = [
		['its end date passed', { expiresOn: '2027-03-14' }, 'The authorisation ended on 2027-03-14.', '2027-03-15'],
		['a training expired', { trainings: [induction('2027-03-01')] }, 'The training “Laser safety induction” expired on 2027-03-01.', '2027-03-02'],
		['a sign-off lapsed', { procedures: [sop({ signedCurrentOn: '2026-02-01', current: { number: 2, approvedOn: '2026-01-10' } })], grantedOn: '2026-01-11' }, 'lapsed after 2027-02-01', '2027-02-02'],
		['a new version was approved after the grant', { procedures: [sop({ signedCurrentOn: null, signedEarlier: 1, current: { number: 2, approvedOn: '2027-02-01' } })] }, 'is not signed yet (version 1 was)', '2027-02-01']
	];
	for (const [what, facts, reason, since] of lapses)
		it(`lapses when ${what}`, () => {
			const o = authorisationState(granted(facts), 12, today);
			expect(o.state).toBe('lapsed');
			expect(isInForce(o.state)).toBe(false);
			expect(o.reasons).toHaveLength(1);
			expect(o.reasons[0]).toContain(reason);
			expect(o.lapses.map((c) => c.since)).toEqual([since]);
			expect(o.validUntil).toBeNull();
		});

	it('is pending, not lapsed, while a condition was never met since the grant', () => {
		const cases: Partial<AuthorisationFacts>[] = [
			{ trainings: [{ topic: 'Class 4 user course', latest: null }] },
			{ procedures: [sop({ signedCurrentOn: null, signedEarlier: null })] },
			{ procedures: [sop({ current: null, signedCurrentOn: null, signedEarlier: null })] },
			// Granted although the training had already expired: it never held since.
			{ trainings: [induction('2027-01-01')], grantedOn: '2027-01-11' }
		];
		for (const c of cases) {
			const o = authorisationState(granted(c), 12, today);
			expect(o.state, JSON.stringify(c)).toBe('pending');
			expect(o.lapses).toEqual([]);
			expect(o.reasons).toHaveLength(1);
		}
	});

	it('a lapse outweighs a condition never met, and every failing reason is listed in order', () => {
		const o = authorisationState(granted({ expiresOn: '2027-03-01', trainings: [{ topic: 'Class 4 user course', latest: null }, induction('2027-06-01')], procedures: [sop({ signedCurrentOn: null, signedEarlier: null })] }), 12, today);
		expect(o.state).toBe('lapsed');
		expect(o.reasons).toEqual(['The authorisation ended on 2027-03-01.', 'No record of the training “Class 4 user course”.', 'Version 2 of “Alignment of the amplifier” is not signed yet.']);
		expect(o.lapses.map((c) => c.kind)).toEqual(['expiry']);
	});

	it('a disabled account is never in force', () => {
		const o = authorisationState(granted({ accountDisabled: true }), 12, today);
		expect(o.state).toBe('lapsed');
		expect(o.reasons).toEqual(['The person’s account is disabled.']);
	});

	it('every combination of the four conditions: active only when all hold', () => {
		// Bits: end date, training, sign-off current, current version signed.
		for (let mask = 0; mask < 16; mask++) {
			const ok = (bit: number) => (mask & (1 << bit)) === 0;
			const facts = granted({
				expiresOn: ok(0) ? '2028-01-01' : '2027-03-01',
				trainings: [induction(ok(1) ? '2028-01-01' : '2027-03-01')],
				procedures: [
					sop({ procedureId: 'a', title: 'Operating', current: { number: 1, approvedOn: '2026-06-01' }, signedCurrentOn: ok(2) ? '2027-02-01' : '2026-02-01', signedEarlier: null }),
					sop({ procedureId: 'b', title: 'Alignment', current: { number: 3, approvedOn: '2027-02-01' }, signedCurrentOn: ok(3) ? '2027-02-02' : null, signedEarlier: 2 })
				],
				grantedOn: '2026-06-02'
			});
			const o = authorisationState(facts, 12, today);
			const failing = [0, 1, 2, 3].filter((b) => !ok(b)).length;
			expect(o.state, `mask ${mask}`).toBe(failing === 0 ? 'active' : 'lapsed');
			expect(o.reasons, `mask ${mask}`).toHaveLength(failing);
			expect(o.lapses, `mask ${mask}`).toHaveLength(failing);
			expect(new Set(o.lapses.map((c) => c.key)).size).toBe(failing);
		}
	});

	it('the same failure keeps its key; a renewed training that expires again is a new cause', () => {
		const a = authorisationState(granted({ trainings: [induction('2027-03-01')] }), 12, today);
		const b = authorisationState(granted({ trainings: [induction('2027-03-01')] }), 12, '2027-03-20');
		const c = authorisationState(granted({ trainings: [induction('2027-03-10', '2027-03-02')] }), 12, '2027-03-20');
		expect(a.lapses[0].key).toBe(b.lapses[0].key);
		expect(c.lapses[0].key).not.toBe(a.lapses[0].key);
	});
});
