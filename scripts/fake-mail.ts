// A real SMTP server on loopback for local use and tests: it accepts every message (with or without
// AUTH), parses it and keeps one JSON file per Message-ID in the mailbox folder, so a message sent
// again with the same Message-ID is seen once, as a reader would.
//
//   npx tsx scripts/fake-mail.ts          FAKE_SMTP_PORT (2525), BEAMWARDEN_MAILBOX_DIR (.data/mailbox)
import { randomUUID } from 'node:crypto';
import { link, mkdir, unlink, writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { simpleParser, type AddressObject, type HeaderValue } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { DEFAULT_MAILBOX_DIR, mailFileId, type StoredMail } from '../src/lib/server/mail/mailbox';

export type FakeMailServer = {
	host: string;
	port: number;
	dir: string;
	/** Messages accepted over SMTP, resends included. */
	received(): number;
	/** Messages stored (one per Message-ID). */
	stored(): number;
	close(): Promise<void>;
};

const keptHeaders = ['message-id', 'date', 'from', 'to', 'cc', 'subject', 'auto-submitted', 'x-beamwarden-kind'];

function headerText(v: HeaderValue | undefined): string | undefined {
	if (v === undefined) return undefined;
	if (typeof v === 'string') return v;
	if (v instanceof Date) return v.toISOString();
	if (Array.isArray(v)) return v.map((x) => headerText(x as HeaderValue) ?? '').join(', ');
	if (typeof v === 'object' && 'text' in v) return (v as AddressObject).text;
	if (typeof v === 'object' && 'value' in v) return String((v as { value: unknown }).value);
	return String(v);
}

const addressText = (a: AddressObject | AddressObject[] | undefined) => (a === undefined ? '' : Array.isArray(a) ? a.map((x) => x.text).join(', ') : a.text);

export async function startFakeMailServer(opts: { port?: number; dir?: string; host?: string } = {}): Promise<FakeMailServer> {
	const host = opts.host ?? '127.0.0.1';
	const dir = resolve(opts.dir ?? DEFAULT_MAILBOX_DIR);
	await mkdir(dir, { recursive: true });
	let received = 0;
	let stored = 0;

	async function keep(raw: NodeJS.ReadableStream, envelope: { from: string; to: string[] }) {
		const mail = await simpleParser(raw as never);
		if ((raw as { sizeExceeded?: boolean }).sizeExceeded) throw Object.assign(new Error('Message too large'), { responseCode: 552 });
		const messageId = mail.messageId ?? `<generated-${randomUUID()}@fake-mail.local>`;
		const id = mailFileId(messageId);
		const headers: Record<string, string> = {};
		for (const k of keptHeaders) {
			const v = headerText(mail.headers.get(k));
			if (v !== undefined) headers[k] = v;
		}
		const record: StoredMail = {
			id,
			messageId,
			date: mail.date ? mail.date.toISOString() : null,
			receivedAt: new Date().toISOString(),
			from: addressText(mail.from) || envelope.from,
			to: envelope.to,
			subject: mail.subject ?? '',
			text: mail.text ?? '',
			html: typeof mail.html === 'string' ? mail.html : '',
			headers,
			headerNames: [...new Set(mail.headerLines.map((h) => h.key.toLowerCase()))]
		};
		// Write aside, then link into place: link fails if the name exists, so two deliveries of
		// one Message-ID (even at the same moment) leave exactly one complete file.
		const tmp = join(dir, `.${id}.${randomUUID()}.tmp`);
		await writeFile(tmp, JSON.stringify(record, null, 2));
		try {
			await link(tmp, join(dir, `${id}.json`));
			stored++;
		} catch (e) {
			if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
		} finally {
			await unlink(tmp).catch(() => {});
		}
	}

	const server = new SMTPServer({
		name: 'fake-mail.beamwarden.local',
		banner: 'Beamwarden fake mail server (local only)',
		authOptional: true,
		allowInsecureAuth: true,
		// No certificate here: do not offer STARTTLS, so clients stay on the plain loopback socket.
		disabledCommands: ['STARTTLS'],
		size: 10 * 1024 * 1024,
		logger: false,
		closeTimeout: 2000,
		onAuth(auth, _session, callback) {
			// Any user and password are accepted; neither is stored or logged.
			callback(null, { user: auth.username ?? 'user' });
		},
		onData(stream, session, callback) {
			const envelope = {
				from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
				to: session.envelope.rcptTo.map((r) => r.address)
			};
			keep(stream, envelope).then(
				() => {
					received++;
					callback();
				},
				(e: Error & { responseCode?: number }) =>
					callback(e.responseCode ? e : Object.assign(new Error(`Could not store the message: ${e.message}`), { responseCode: 451 }))
			);
		}
	});

	await new Promise<void>((ok, fail) => {
		const onError = (e: Error) => fail(e);
		server.once('error', onError);
		server.listen(opts.port ?? 2525, host, () => {
			server.off('error', onError);
			ok();
		});
	});
	server.on('error', (e) => console.error('fake mail:', e.message));
	const port = (server.server.address() as AddressInfo).port;

	return {
		host,
		port,
		dir,
		received: () => received,
		stored: () => stored,
		close: () => new Promise<void>((ok) => server.close(() => ok()))
	};
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
	const raw = process.env.FAKE_SMTP_PORT ?? '2525';
	const port = Number(raw);
	if (!/^\d{1,5}$/.test(raw) || port < 1 || port > 65535) {
		console.error(`FAKE_SMTP_PORT: must be a port number between 1 and 65535 (got "${raw}")`);
		process.exit(2);
	}
	const dir = process.env.BEAMWARDEN_MAILBOX_DIR || DEFAULT_MAILBOX_DIR;
	try {
		const server = await startFakeMailServer({ port, dir });
		console.log(`Fake mail server on smtp://${server.host}:${server.port}, keeping messages in ${dir}`);
		let stopping = false;
		const stop = async () => {
			if (stopping) return;
			stopping = true;
			await server.close();
			process.exit(0);
		};
		process.on('SIGTERM', stop);
		process.on('SIGINT', stop);
	} catch (e) {
		console.error(`Fake mail server could not start on 127.0.0.1:${port}: ${(e as Error).message}`);
		process.exit(2);
	}
}
