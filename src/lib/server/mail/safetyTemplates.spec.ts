import { describe, expect, it } from 'vitest';
import * as t from './safetyTemplates';

const appUrl = 'https://lasers.example.org';
const procedure = { id: 'p-1', title: 'Alignment\r\nBcc: victim@example.org', kindLabel: 'Alignment procedure', targetLabel: 'QS-850 <b>Nd:YAG</b>', labName: 'HEL' };
const authorisation = { id: 'a-1', personName: 'Tomas Weir', targetLabel: 'Processing bay K0.11', labName: 'MPC' };

describe('procedure and authorisation mails', () => {
	it('a record title can neither add a header nor markup', () => {
		const m = t.procedureToReview({ appUrl, procedure, pathName: 'Feed <script>', reason: 'You keep this procedure.' });
		expect(m.subject).toBe('Procedure to be reviewed: Alignment Bcc: victim@example.org');
		expect(m.subject).not.toMatch(/[\r\n]/);
		expect(m.html).not.toContain('<b>Nd:YAG</b>');
		expect(m.html).not.toContain('<script>');
		expect(m.text).toContain(`${appUrl}/procedures/p-1`);
	});

	it('a lapse says since when and every reason, and why this person got it', () => {
		const m = t.authorisationLapsed({ appUrl, authorisation, since: '2027-03-02', reasons: ['The training “Induction” expired on 2027-03-01.', 'Version 2 of “Bay SOP” is not signed yet.'], reason: 'This is your own authorisation.' });
		expect(m.subject).toBe('Authorisation lapsed: Tomas Weir, Processing bay K0.11');
		expect(m.text).toContain('Since 2 March 2027');
		expect(m.text).toContain('• The training “Induction” expired on 2027-03-01.');
		expect(m.text).toContain('• Version 2 of “Bay SOP” is not signed yet.');
		expect(m.text).toContain('Why you got this: This is your own authorisation.');
		expect(m.text).toContain(`${appUrl}/authorisations/a-1`);
	});

	it('a lapsing authorisation names the day and what ends; a waiting request counts the days', () => {
		const lapsing = t.authorisationLapsing({ appUrl, authorisation, validUntil: '2027-04-14', ending: ['“Induction” is current until 2027-04-14.'], reason: 'r' });
		expect(lapsing.subject).toBe('Authorisation lapses on 14 April 2027: Processing bay K0.11');
		expect(lapsing.text).toContain('• “Induction” is current until 2027-04-14.');
		const waiting = t.authorisationWaiting({ appUrl, authorisation, requestedOn: '2027-03-01', daysWaiting: 8, note: 'For the welding trials', reason: 'r' });
		expect(waiting.text).toContain('It has waited 8 days.');
		expect(waiting.text).toContain('Their note: For the welding trials');
	});

	it('review due and sign-off mails say which version and which date', () => {
		expect(t.procedureReviewDue({ appUrl, procedure, number: 3, reviewBy: '2027-01-01', daysUntil: -4, reason: 'r' }).subject).toMatch(/^Procedure review overdue: /);
		expect(t.procedureReviewDue({ appUrl, procedure, number: 3, reviewBy: '2027-01-01', daysUntil: 12, reason: 'r' }).text).toContain('is due on 1 January 2027');
		expect(t.signoffNeeded({ appUrl, procedure, number: 2, approvedOn: '2027-02-01', lapsing: null, reason: 'r' }).text).toContain('Version 2 of');
		expect(t.signoffNeeded({ appUrl, procedure, number: 2, approvedOn: '2027-02-01', lapsing: { validUntil: '2027-05-01' }, reason: 'r' }).subject).toMatch(/^Sign again: /);
	});
});
