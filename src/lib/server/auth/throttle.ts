// Failed sign-in throttling, kept in PostgreSQL so every app instance shares it. It slows the
// attacker without locking the owner out:
// - A browser without a device cookie for the account (see auth/device.ts) is counted three ways:
//   the (account, address) pair locks quickly; the account alone (guessing from many addresses) and
//   the address alone (one address trying many accounts) lock at higher counts.
// - A browser with a valid device cookie for the account (it signed in to it before) is counted by
//   its own failures only: strangers' failures on the account or from the same address (a shared
//   proxy) never stop it, and guessing from a stolen device cookie locks that cookie alone.
// Every lock lasts LOCK_MS; counts restart after WINDOW_MS; old rows are purged by purge().
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { inArray, sql } from 'drizzle-orm';

export const WINDOW_MS = 15 * 60 * 1000;
export const LOCK_MS = 15 * 60 * 1000;
export const LIMITS = { pair: 5, account: 20, address: 50, device: 10 } as const;

/** One sign-in attempt: who it is for, where it comes from, and the device nonce when the browser's device cookie is valid for this account. */
export type Attempt = { email: string; address: string; device: string | null };

function counters(a: Attempt): { key: string; limit: number }[] {
	const account = a.email.trim().toLowerCase();
	if (a.device) return [{ key: `device:${a.device}`, limit: LIMITS.device }];
	return [
		{ key: `pair:${account}|${a.address}`, limit: LIMITS.pair },
		{ key: `account:${account}`, limit: LIMITS.account },
		{ key: `address:${a.address}`, limit: LIMITS.address }
	];
}

/** Seconds until this attempt may be made, or 0 when none of its counters is locked. */
export async function lockedFor(a: Attempt, now = new Date()): Promise<number> {
	const rows = await db
		.select({ lockedUntil: table.signInThrottle.lockedUntil })
		.from(table.signInThrottle)
		.where(inArray(table.signInThrottle.key, counters(a).map((c) => c.key)));
	const until = Math.max(0, ...rows.map((r) => r.lockedUntil?.getTime() ?? 0));
	return Math.max(0, Math.ceil((until - now.getTime()) / 1000));
}

export async function recordFailure(a: Attempt, now = new Date()): Promise<void> {
	const at = now.toISOString();
	const windowStart = new Date(now.getTime() - WINDOW_MS).toISOString();
	const lockUntil = new Date(now.getTime() + LOCK_MS).toISOString();
	await db.transaction(async (tx) => {
		for (const { key, limit } of counters(a)) {
			// One atomic upsert per counter: a new window restarts the count; reaching the limit locks.
			await tx.execute(sql`
				INSERT INTO sign_in_throttle (key, failures, window_start, locked_until)
				VALUES (${key}, 1, ${at}::timestamptz, CASE WHEN 1 >= ${limit} THEN ${lockUntil}::timestamptz END)
				ON CONFLICT (key) DO UPDATE SET
					failures = CASE WHEN sign_in_throttle.window_start < ${windowStart}::timestamptz THEN 1 ELSE sign_in_throttle.failures + 1 END,
					window_start = CASE WHEN sign_in_throttle.window_start < ${windowStart}::timestamptz THEN ${at}::timestamptz ELSE sign_in_throttle.window_start END,
					locked_until = CASE
						WHEN (CASE WHEN sign_in_throttle.window_start < ${windowStart}::timestamptz THEN 1 ELSE sign_in_throttle.failures + 1 END) >= ${limit}
						THEN ${lockUntil}::timestamptz ELSE sign_in_throttle.locked_until END`);
		}
	});
}

/** A successful sign-in clears this browser's own counters (the pair, or its device); the account and address counters keep their history. */
export async function recordSuccess(a: Attempt): Promise<void> {
	const own = counters(a)
		.map((c) => c.key)
		.filter((k) => k.startsWith('pair:') || k.startsWith('device:'));
	await db.delete(table.signInThrottle).where(inArray(table.signInThrottle.key, own));
}

/** After a completed password reset (the owner proved they hold the mailbox), the account's locks end, at every address. */
export async function clearAccount(email: string): Promise<void> {
	const account = email.trim().toLowerCase();
	await db.delete(table.signInThrottle).where(sql`${table.signInThrottle.key} = ${'account:' + account} OR starts_with(${table.signInThrottle.key}, ${'pair:' + account + '|'})`);
}

/** Delete rows whose window and lock have both passed; they count nothing any more. */
export async function purge(now = new Date()): Promise<number> {
	const windowStart = new Date(now.getTime() - WINDOW_MS).toISOString();
	const deleted = await db.execute(sql`
		DELETE FROM sign_in_throttle
		WHERE window_start < ${windowStart}::timestamptz AND (locked_until IS NULL OR locked_until < ${now.toISOString()}::timestamptz)`);
	return deleted.count ?? 0;
}
