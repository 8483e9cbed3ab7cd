import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import * as schema from './schema';

// postgres.js connects lazily, so importing this module never needs a running database
// (the build imports server modules while analysing routes). The URL is checked at start-up
// by the server's init hook (see src/lib/server/config.ts).
export const client = postgres(process.env.DATABASE_URL ?? 'postgres://unset@127.0.0.1:1/unset', {
	max: Number(process.env.DATABASE_POOL_SIZE ?? 10),
	onnotice: () => {},
	connection: { application_name: 'beamwarden' },
	// While the database is down a request should get its 503 within a second, not wait for the
	// library's default reconnect backoff (which grows to 20 s): queries already queued on a
	// connection wait at most this long (then db/outage.ts answers the rest at once); a hung connect
	// gives up after 10 s.
	backoff: (retries: number) => Math.min(0.05 * 2 ** retries, 0.25),
	connect_timeout: 10,
	// A dropped connection may be the database going away (a restart cuts every connection at once):
	// db/outage.ts checks at once on a connection of its own, rather than waiting for a query to fail.
	onclose: () => connectionEvents.closed()
});

export const connectionEvents = { closed: () => {} };

export const db = drizzle(client, { schema });
export type Db = typeof db;
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
