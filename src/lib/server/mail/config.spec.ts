import { describe, expect, it } from 'vitest';
import { readMailConfig } from './config';

describe('readMailConfig', () => {
	it('has local defaults', () => {
		expect(readMailConfig({})).toEqual({
			smtp: { host: '127.0.0.1', port: 2525, secure: false },
			from: 'Beamwarden <beamwarden@localhost>',
			appUrl: 'http://127.0.0.1:3000'
		});
	});

	it('reads every setting, APP_URL before ORIGIN', () => {
		const c = readMailConfig({ SMTP_HOST: 'smtp.example.org', SMTP_PORT: '465', SMTP_SECURE: '1', SMTP_USER: 'u', SMTP_PASSWORD: 'p', MAIL_FROM: 'Lasers <lasers@example.org>', APP_URL: 'https://lasers.example.org/', ORIGIN: 'https://other.example.org' });
		expect(c).toEqual({ smtp: { host: 'smtp.example.org', port: 465, secure: true, auth: { user: 'u', pass: 'p' } }, from: 'Lasers <lasers@example.org>', appUrl: 'https://lasers.example.org' });
		expect(readMailConfig({ ORIGIN: 'http://127.0.0.1:3100' }).appUrl).toBe('http://127.0.0.1:3100');
	});

	it('names the variable that is wrong', () => {
		expect(() => readMailConfig({ SMTP_PORT: 'abc' })).toThrow(/SMTP_PORT: must be a port number/);
		expect(() => readMailConfig({ SMTP_PORT: '70000' })).toThrow(/SMTP_PORT/);
		expect(() => readMailConfig({ SMTP_SECURE: 'yes' })).toThrow(/SMTP_SECURE/);
		expect(() => readMailConfig({ MAIL_FROM: 'nobody' })).toThrow(/MAIL_FROM/);
		expect(() => readMailConfig({ MAIL_FROM: 'a@b.c\r\nBcc: x@y.z' })).toThrow(/MAIL_FROM/);
		expect(() => readMailConfig({ APP_URL: 'javascript:alert(1)' })).toThrow(/APP_URL/);
		expect(() => readMailConfig({ SMTP_USER: 'u' })).toThrow(/SMTP_PASSWORD: must be set/);
	});

	it('never puts the password in a message', () => {
		let message = '';
		try {
			readMailConfig({ SMTP_USER: 'u', SMTP_PASSWORD: 'hunter2-secret', SMTP_PORT: 'x' });
		} catch (e) {
			message = (e as Error).message;
		}
		expect(message).toContain('SMTP_PORT');
		expect(message).not.toContain('hunter2-secret');
	});
});
