// The SMTP transport. One transporter per delivery run (pooled, so a batch shares a connection),
// closed at the end, so a run leaves no sockets behind and picks up changed settings.
import nodemailer from 'nodemailer';
import { readMailConfig, type MailConfig } from './config';

export type OutgoingMail = {
	/** Fixed per ledger row: a resend of the same row carries the same Message-ID. */
	messageId: string;
	to: string;
	subject: string;
	text: string;
	html: string;
	kind: string;
};

export type MailSender = {
	send(mail: OutgoingMail): Promise<void>;
	close(): void;
};

export function createSender(config: MailConfig = readMailConfig()): MailSender {
	const transporter = nodemailer.createTransport({
		pool: true,
		maxConnections: 2,
		host: config.smtp.host,
		port: config.smtp.port,
		secure: config.smtp.secure,
		auth: config.smtp.auth,
		// Well below the ledger's 10-minute reclaim time, so a slow server never looks like a crash.
		connectionTimeout: 15_000,
		greetingTimeout: 15_000,
		socketTimeout: 60_000,
		logger: false,
		debug: false
	});
	return {
		async send(mail) {
			await transporter.sendMail({
				from: config.from,
				to: mail.to,
				subject: mail.subject,
				text: mail.text,
				html: mail.html,
				messageId: mail.messageId,
				headers: {
					'Auto-Submitted': 'auto-generated',
					'X-Auto-Response-Suppress': 'All',
					'X-Beamwarden-Kind': mail.kind
				}
			});
		},
		close() {
			transporter.close();
		}
	};
}

/** Errors that mean the server could not be reached at all: the rest of a batch would fail the same way. */
export function isConnectionError(e: unknown): boolean {
	const code = (e as { code?: string } | null)?.code;
	return code === 'ECONNECTION' || code === 'ETIMEDOUT' || code === 'ESOCKET' || code === 'EDNS' || code === 'ETLS' || code === 'EAUTH' || code === 'ECONNREFUSED';
}

/** A short, single-line error for the ledger; SMTP replies never contain our password. */
export function describeError(e: unknown): string {
	const err = e as { code?: string; responseCode?: number; message?: string } | null;
	const parts = [err?.code, err?.responseCode ? String(err.responseCode) : undefined, err?.message ?? String(e)].filter(Boolean);
	return parts.join(' ').replace(/[\r\n\t]+/g, ' ').slice(0, 500);
}
