import { describe, expect, it } from 'vitest';
import * as t from './templates';

const appUrl = 'https://lasers.example.org';
const area = { id: 'a1', name: 'Bay 3 <b>', room: '2.14', building: 'North wing', labName: 'Ultrafast & Co' };

describe('cleanHeaderText', () => {
	it('turns CR, LF and other control characters into single spaces', () => {
		expect(t.cleanHeaderText('Path A\r\nBcc: victim@example.org')).toBe('Path A Bcc: victim@example.org');
		expect(t.cleanHeaderText('a\rb\nc\td\u0000e\u007ff\u0085g\u2028h\u2029i')).toBe('a b c d e f g h i');
		expect(t.cleanHeaderText('  lots   of\n\n\nspace  ')).toBe('lots of space');
	});

	it('cuts an overlong subject with an ellipsis and keeps it on one line', () => {
		const s = t.cleanHeaderText('x'.repeat(500));
		expect(s.length).toBe(160);
		expect(s.endsWith('…')).toBe(true);
		expect(/[\r\n]/.test(t.cleanHeaderText(`${'y\n'.repeat(300)}`))).toBe(false);
	});
});

describe('templates', () => {
	it('escape every inserted value in HTML and keep subjects to one line', () => {
		const m = t.reviewWaiting({
			appUrl,
			pathId: 'p-1',
			pathName: '<script>alert(1)</script>\r\nX-Evil: 1',
			laserLabel: 'Acme "Q" & sons',
			labName: "O'Brien lab",
			waitingSince: '2027-02-01',
			daysWaiting: 9,
			reason: 'You are an officer <i>.'
		});
		expect(m.subject).toBe('Awaiting review for 9 days: <script>alert(1)</script> X-Evil: 1');
		expect(m.html).not.toContain('<script>');
		expect(m.html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
		expect(m.html).toContain('Acme &quot;Q&quot; &amp; sons');
		expect(m.html).toContain('O&#39;Brien lab');
		expect(m.html).toContain('You are an officer &lt;i&gt;.');
		expect(m.text).toContain('https://lasers.example.org/reviews/p-1');
		expect(m.html).toContain('href="https://lasers.example.org/reviews/p-1"');
	});

	it('say why the mail was sent, link back, and point to the preferences', () => {
		const m = t.inspectionDue({ appUrl, inspectionId: 'i-9', area, dueOn: '2027-03-31', daysUntil: 30, reason: 'You are the inspector of this area.' });
		expect(m.subject).toBe('Inspection due in 30 days: Bay 3 <b> (room 2.14, North wing)');
		for (const body of [m.text, m.html]) {
			expect(body).toContain('Beamwarden');
			expect(body).toContain('Why you got this');
			expect(body).toContain('You are the inspector of this area.');
			expect(body).toContain('https://lasers.example.org/inspections/i-9');
			expect(body).toContain('https://lasers.example.org/preferences');
		}
		expect(m.text).toContain('31 March 2027');
	});

	it('word the due steps by the days left', () => {
		const base = { appUrl, inspectionId: 'i', area, dueOn: '2027-03-01', reason: 'r' };
		expect(t.inspectionDue({ ...base, daysUntil: 0 }).subject).toMatch(/^Inspection due today:/);
		expect(t.inspectionDue({ ...base, daysUntil: 1 }).subject).toMatch(/^Inspection due tomorrow:/);
		expect(t.inspectionDue({ ...base, daysUntil: -3 }).subject).toMatch(/^Inspection due since 1 March 2027:/);
		expect(t.inspectionOverdue({ ...base, weeksOverdue: 1, inspectorName: null }).subject).toMatch(/^Inspection overdue by 1 week:/);
		expect(t.inspectionOverdue({ ...base, weeksOverdue: 3, inspectorName: 'Ada' }).text).toContain('Ada');
	});

	it('encode record ids in links', () => {
		expect(t.link(appUrl + '/', 'paths', 'a/b?c')).toBe('https://lasers.example.org/paths/a%2Fb%3Fc');
	});

	it('send a password reset without the preferences line and with the one-time link', () => {
		const m = t.passwordReset({ appUrl, name: 'Ada', resetUrl: `${appUrl}/reset-password/tok`, expiresAt: new Date('2027-03-01T10:00:00Z') });
		expect(m.text).toContain(`${appUrl}/reset-password/tok`);
		expect(m.text).not.toContain('/preferences');
		expect(m.text).toContain('Why you got this');
	});

	it('list digest items with their links and reasons', () => {
		const m = t.digest({ appUrl, date: '2027-03-01', items: [{ subject: 'One\r\nTwo', reason: 'Because.', url: `${appUrl}/inspections/1` }] });
		expect(m.subject).toBe('Your Beamwarden digest for 1 March 2027: 1 item');
		expect(m.text).toContain('- One Two');
		expect(m.html).toContain(`href="${appUrl}/inspections/1"`);
	});
});
