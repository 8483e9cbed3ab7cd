// Whether the database answers, for the load balancers' health check.
import { sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { isDatabaseUnavailable } from '$lib/server/db/errors';
import { noteUnavailable } from '$lib/server/db/outage';

export async function databaseAnswers(): Promise<boolean> {
	try {
		await db.execute(sql`SELECT 1`);
		return true;
	} catch (e) {
		if (isDatabaseUnavailable(e)) noteUnavailable();
		return false;
	}
}
