// Device cookies: a browser in which someone signed in to an account successfully carries a token
// for that account, signed with a key kept in PostgreSQL (so every instance checks it alike). While
// strangers' failures have the account or the address throttled, such a browser is judged by its own
// failures only, so the owner keeps signing in from a browser they used before (see auth/throttle.ts).
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Cookies } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { secureCookie } from './session';

export const deviceCookieName = 'bw_device';
const MAX_AGE_SECONDS = 365 * 24 * 3600;
const KEY_NAME = 'device-cookie-key';

let key: Promise<Buffer> | null = null;

/** The signing key: made once (the first instance to need it inserts it), then read by all. */
function signingKey(): Promise<Buffer> {
	key ??= (async () => {
		await db.insert(table.appSecret).values({ name: KEY_NAME, value: randomBytes(32).toString('base64url') }).onConflictDoNothing();
		const [row] = await db.select({ value: table.appSecret.value }).from(table.appSecret).where(eq(table.appSecret.name, KEY_NAME));
		return Buffer.from(row.value, 'base64url');
	})().catch((e) => {
		key = null; // a database outage must not be remembered
		throw e;
	});
	return key;
}

const account = (email: string) => email.trim().toLowerCase();
const sign = (k: Buffer, email: string, nonce: string) => createHmac('sha256', k).update(`${account(email)}\n${nonce}`).digest('base64url');

/** A new device token for this account: `<nonce>.<signature>`. */
export async function issue(email: string): Promise<string> {
	const nonce = randomBytes(16).toString('base64url');
	return `${nonce}.${sign(await signingKey(), email, nonce)}`;
}

/** The device's nonce when the token was signed by us for this very account, else null. */
export async function verify(token: string | undefined, email: string): Promise<string | null> {
	const [nonce, signature, extra] = (token ?? '').split('.');
	if (!nonce || !signature || extra !== undefined || nonce.length > 64) return null;
	const expected = Buffer.from(sign(await signingKey(), email, nonce));
	const given = Buffer.from(signature);
	return given.length === expected.length && timingSafeEqual(given, expected) ? nonce : null;
}

export function setDeviceCookie(cookies: Cookies, token: string) {
	cookies.set(deviceCookieName, token, { path: '/', httpOnly: true, sameSite: 'lax', secure: secureCookie, maxAge: MAX_AGE_SECONDS });
}
