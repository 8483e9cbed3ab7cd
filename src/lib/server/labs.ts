import { asc, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';

export function list() {
	return db.select({ id: table.lab.id, code: table.lab.code, name: table.lab.name }).from(table.lab).orderBy(asc(table.lab.code));
}

/** The labs a person belongs to. */
export function ofMember(userId: string) {
	return db
		.select({ id: table.lab.id, code: table.lab.code, name: table.lab.name })
		.from(table.labMember)
		.innerJoin(table.lab, eq(table.lab.id, table.labMember.labId))
		.where(eq(table.labMember.userId, userId))
		.orderBy(asc(table.lab.code));
}
