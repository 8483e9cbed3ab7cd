// While the database is known to be unreachable (a restart, a failover), every request is answered
// 503 at once instead of each of its queries waiting on the pool's reconnect attempts in turn (under
// load that added up to many seconds). One probe at a time checks whether the database is back.
import { setTimeout as sleep } from 'node:timers/promises';
import postgres from 'postgres';
import { client, connectionEvents } from './index';

const PROBE_EVERY_MS = 200;
const PROBE_TIMEOUT_MS = 1000;
const CHECK_TIMEOUT_MS = 500;

let down = false;
let probing: Promise<void> | null = null;
const inFlight = new Set<() => void>();

export const databaseDown = () => down;

/** Call `then` when a query next finds the database unreachable; the returned function unregisters. */
export function onOutage(then: () => void): () => void {
	inFlight.add(then);
	return () => inFlight.delete(then);
}

/** A query failed because the database cannot be reached: answer 503 until a probe gets through. */
export function noteUnavailable() {
	down = true;
	for (const then of inFlight) then();
	inFlight.clear();
	probing ??= watch();
}

// Its own single connection, so a check never queues behind the pool's busy connections under load.
let checker: postgres.Sql | null = null;
let checking = false;

/** A pooled connection closed: check the database at once; if it does not answer, it is down. */
async function checkNow() {
	if (down || checking || !process.env.DATABASE_URL) return;
	checking = true;
	checker ??= postgres(process.env.DATABASE_URL, { max: 1, connect_timeout: 2, idle_timeout: 5, onnotice: () => {} });
	try {
		await Promise.race([checker`SELECT 1`, sleep(CHECK_TIMEOUT_MS).then(() => Promise.reject(new Error('check timed out')))]);
	} catch {
		noteUnavailable();
	} finally {
		checking = false;
	}
}
connectionEvents.closed = () => void checkNow();

async function watch() {
	while (down) {
		try {
			await Promise.race([client`SELECT 1`, sleep(PROBE_TIMEOUT_MS).then(() => Promise.reject(new Error('probe timed out')))]);
			down = false;
		} catch {
			await sleep(PROBE_EVERY_MS);
		}
	}
	probing = null;
}
