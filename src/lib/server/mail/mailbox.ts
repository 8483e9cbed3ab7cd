// The local fake mailbox: the folder where scripts/fake-mail.ts keeps every message it received,
// one JSON file per Message-ID. The admin's mail page reads it here, outside production only.
import { createHash } from 'node:crypto';
import { readdir, readFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';

export type StoredMail = {
	/** The file's name without '.json'; stable per Message-ID. */
	id: string;
	messageId: string;
	/** The message's Date header (ISO), if it had one. */
	date: string | null;
	/** When the fake server accepted it (ISO). */
	receivedAt: string;
	from: string;
	/** Envelope recipients (RCPT TO), so a Bcc shows too. */
	to: string[];
	subject: string;
	text: string;
	html: string;
	/** A few headers, decoded: message-id, date, from, to, subject, auto-submitted, x-beamwarden-kind. */
	headers: Record<string, string>;
	/** The names of every header the message carried (lower case). */
	headerNames: string[];
};

export type MailSummary = Pick<StoredMail, 'id' | 'messageId' | 'date' | 'receivedAt' | 'from' | 'to' | 'subject'>;

export type Unavailable = { available: false; reason: string };

export const DEFAULT_MAILBOX_DIR = '.data/mailbox';

/** A file name for a Message-ID: readable, safe on any file system, and one per Message-ID. */
export function mailFileId(messageId: string): string {
	const readable = messageId
		.replace(/^<|>$/g, '')
		.replace(/[^A-Za-z0-9._@-]+/g, '_')
		.slice(0, 100);
	const hash = createHash('sha256').update(messageId).digest('hex').slice(0, 12);
	return `${readable}-${hash}`;
}

const ID_PATTERN = /^[A-Za-z0-9._@-]{1,140}$/;

/** The folder to read, or why there is none. */
export function mailboxDir(env: Record<string, string | undefined> = process.env): string | Unavailable {
	if (env.NODE_ENV === 'production') return { available: false, reason: 'The local mailbox is not available in production.' };
	const dir = env.BEAMWARDEN_MAILBOX_DIR;
	if (!dir) return { available: false, reason: 'The local mailbox is not available: BEAMWARDEN_MAILBOX_DIR is not set.' };
	return resolve(dir);
}

async function readAll(dir: string): Promise<StoredMail[]> {
	let names: string[];
	try {
		names = await readdir(dir);
	} catch (e) {
		if ((e as NodeJS.ErrnoException).code === 'ENOENT') return [];
		throw e;
	}
	const out: StoredMail[] = [];
	for (const name of names) {
		if (!name.endsWith('.json') || !ID_PATTERN.test(name.slice(0, -5))) continue;
		try {
			out.push(JSON.parse(await readFile(join(dir, name), 'utf8')) as StoredMail);
		} catch {
			// a file being written or not ours: skip it
		}
	}
	return out.sort((a, b) => (a.receivedAt < b.receivedAt ? 1 : a.receivedAt > b.receivedAt ? -1 : a.id < b.id ? 1 : -1));
}

export type MailboxPage = { available: true; total: number; page: number; pageSize: number; pages: number; messages: MailSummary[] };

/** Newest first, `pageSize` a page (1 … 100). */
export async function listMailbox(opts: { page?: number; pageSize?: number } = {}, env: Record<string, string | undefined> = process.env): Promise<MailboxPage | Unavailable> {
	const dir = mailboxDir(env);
	if (typeof dir !== 'string') return dir;
	const pageSize = Math.min(Math.max(Math.trunc(opts.pageSize ?? 25) || 25, 1), 100);
	const all = await readAll(dir);
	const pages = Math.max(1, Math.ceil(all.length / pageSize));
	const page = Math.min(Math.max(Math.trunc(opts.page ?? 1) || 1, 1), pages);
	const messages = all.slice((page - 1) * pageSize, page * pageSize).map(({ id, messageId, date, receivedAt, from, to, subject }) => ({ id, messageId, date, receivedAt, from, to, subject }));
	return { available: true, total: all.length, page, pageSize, pages, messages };
}

/** One message by its id (the file name); null when there is no such message. */
export async function readMailboxMessage(id: string, env: Record<string, string | undefined> = process.env): Promise<{ available: true; message: StoredMail | null } | Unavailable> {
	const dir = mailboxDir(env);
	if (typeof dir !== 'string') return dir;
	if (!ID_PATTERN.test(id)) return { available: true, message: null };
	try {
		return { available: true, message: JSON.parse(await readFile(join(dir, `${id}.json`), 'utf8')) as StoredMail };
	} catch {
		return { available: true, message: null };
	}
}

/** Every stored message (tests and scripts). */
export async function readMailboxDir(dir: string): Promise<StoredMail[]> {
	return readAll(resolve(dir));
}
