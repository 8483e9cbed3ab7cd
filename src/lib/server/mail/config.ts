// Mail settings from the environment, read when mail is about to be built or sent (never at import),
// each bad value reported with the name of its variable.
import { z } from 'zod';

const noLineBreaks = (s: string) => !/[\r\n]/.test(s);

const schema = z.object({
	SMTP_HOST: z
		.string()
		.trim()
		.min(1, { error: 'must be a host name or address, e.g. 127.0.0.1' })
		.refine((s) => /^[A-Za-z0-9.:[\]-]+$/.test(s), { error: 'must be a host name or address, e.g. smtp.example.org' })
		.default('127.0.0.1'),
	SMTP_PORT: z
		.string()
		.trim()
		.regex(/^\d{1,5}$/, { error: 'must be a port number between 1 and 65535' })
		.transform(Number)
		.refine((n) => n >= 1 && n <= 65535, { error: 'must be a port number between 1 and 65535' })
		.default(2525),
	SMTP_SECURE: z
		.enum(['1', '0'], { error: "must be '1' (TLS from the first byte, usually port 465) or '0' (plain, with STARTTLS when offered)" })
		.transform((v) => v === '1')
		.default(false),
	SMTP_USER: z.string().optional(),
	SMTP_PASSWORD: z.string().optional(),
	MAIL_FROM: z
		.string()
		.trim()
		.refine(noLineBreaks, { error: 'must be one line' })
		.refine((s) => /^(?:[^<>@]*<[^<>\s@]+@[^<>\s@]+>|[^<>\s@]+@[^<>\s@]+)$/.test(s), {
			error: 'must be an address, e.g. "Beamwarden <beamwarden@example.org>" or beamwarden@example.org'
		})
		.default('Beamwarden <beamwarden@localhost>'),
	APP_URL: z.url({ protocol: /^https?$/, error: 'must be the public http(s) URL of the app, e.g. https://lasers.example.org' }).optional(),
	ORIGIN: z.url({ protocol: /^https?$/, error: 'must be the public http(s) URL of the app, e.g. https://lasers.example.org' }).optional()
});

export type MailConfig = {
	smtp: { host: string; port: number; secure: boolean; auth?: { user: string; pass: string } };
	from: string;
	/** Base URL for links in mail, without a trailing slash. */
	appUrl: string;
};

export class MailConfigError extends Error {
	constructor(lines: string[]) {
		super(`Mail settings are not usable; fix these environment variables:\n${lines.map((l) => `  ${l}`).join('\n')}`);
		this.name = 'MailConfigError';
	}
}

/** Empty strings count as unset, so `SMTP_USER=` in a shell file means "no user". */
function present(env: Record<string, string | undefined>) {
	const out: Record<string, string> = {};
	for (const key of Object.keys(schema.shape)) {
		const v = env[key];
		if (v !== undefined && v !== '') out[key] = v;
	}
	return out;
}

export function readMailConfig(env: Record<string, string | undefined> = process.env): MailConfig {
	const parsed = schema.safeParse(present(env));
	if (!parsed.success) throw new MailConfigError(parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`));
	const c = parsed.data;
	if ((c.SMTP_USER === undefined) !== (c.SMTP_PASSWORD === undefined)) {
		throw new MailConfigError([c.SMTP_USER === undefined ? 'SMTP_USER: must be set when SMTP_PASSWORD is set' : 'SMTP_PASSWORD: must be set when SMTP_USER is set']);
	}
	const base = (c.APP_URL ?? c.ORIGIN ?? 'http://127.0.0.1:3000').replace(/\/+$/, '');
	return {
		smtp: {
			host: c.SMTP_HOST,
			port: c.SMTP_PORT,
			secure: c.SMTP_SECURE,
			...(c.SMTP_USER !== undefined && c.SMTP_PASSWORD !== undefined ? { auth: { user: c.SMTP_USER, pass: c.SMTP_PASSWORD } } : {})
		},
		from: c.MAIL_FROM,
		appUrl: base
	};
}
