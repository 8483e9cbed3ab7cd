import { asc } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';

export function list() {
	return db.select({ id: table.lab.id, code: table.lab.code, name: table.lab.name }).from(table.lab).orderBy(asc(table.lab.code));
}
