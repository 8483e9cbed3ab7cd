// Failed sign-in throttling, kept in PostgreSQL so every app instance shares it.
// Three counters per failure: the (account, address) pair locks quickly, so an attacker at one
// address cannot keep guessing while the account's owner still signs in from elsewhere; the address
// alone and the account alone lock at higher counts to slow spraying and distributed guessing.
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { inArray, sql } from 'drizzle-orm';

const WINDOW_MS = 15 * 60 * 1000;
const LOCK_MS = 15 * 60 * 1000;
const LIMITS = { pair: 5, address: 30, account: 100 } as const;

function keys(email: string, address: string) {
	const account = email.trim().toLowerCase();
	return {
		pair: `pair:${account}|${address}`,
		address: `address:${address}`,
		account: `account:${account}`
	};
}

/** Seconds until sign-in may be tried again, or 0 when not locked. */
export async function lockedFor(email: string, address: string, now = new Date()): Promise<number> {
	const rows = await db
		.select({ lockedUntil: table.signInThrottle.lockedUntil })
		.from(table.signInThrottle)
		.where(inArray(table.signInThrottle.key, Object.values(keys(email, address))));
	const until = Math.max(0, ...rows.map((r) => r.lockedUntil?.getTime() ?? 0));
	return Math.max(0, Math.ceil((until - now.getTime()) / 1000));
}

export async function recordFailure(email: string, address: string, now = new Date()): Promise<void> {
	const k = keys(email, address);
	const at = now.toISOString();
	const windowStart = new Date(now.getTime() - WINDOW_MS).toISOString();
	const lockUntil = new Date(now.getTime() + LOCK_MS).toISOString();
	await db.transaction(async (tx) => {
		for (const kind of ['pair', 'address', 'account'] as const) {
			// One atomic upsert per counter: a new window restarts the count.
			await tx.execute(sql`
				INSERT INTO sign_in_throttle (key, failures, window_start)
				VALUES (${k[kind]}, 1, ${at}::timestamptz)
				ON CONFLICT (key) DO UPDATE SET
					failures = CASE WHEN sign_in_throttle.window_start < ${windowStart}::timestamptz THEN 1 ELSE sign_in_throttle.failures + 1 END,
					window_start = CASE WHEN sign_in_throttle.window_start < ${windowStart}::timestamptz THEN ${at}::timestamptz ELSE sign_in_throttle.window_start END`);
			await tx.execute(sql`
				UPDATE sign_in_throttle SET locked_until = ${lockUntil}::timestamptz
				WHERE key = ${k[kind]} AND failures >= ${LIMITS[kind]}`);
		}
	});
}

/** A successful sign-in clears the pair counter only: the address and account counters keep their history. */
export async function recordSuccess(email: string, address: string): Promise<void> {
	await db.delete(table.signInThrottle).where(sql`${table.signInThrottle.key} = ${keys(email, address).pair}`);
}
