import { json } from '@sveltejs/kit';
import { sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { isDatabaseUnavailable } from '$lib/server/db/errors';
import { noteUnavailable } from '$lib/server/db/outage';

/** Load balancers ask this: 200 when the database answers, 503 otherwise. */
export async function GET() {
	try {
		await db.execute(sql`SELECT 1`);
		return json({ status: 'ok' });
	} catch (e) {
		if (isDatabaseUnavailable(e)) noteUnavailable();
		return json({ status: 'unavailable', message: 'The database does not answer.' }, { status: 503 });
	}
}
