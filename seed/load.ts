// Loads the demo scenario. Safe to run twice: rows are keyed by lab code and e-mail.
import { inArray, sql } from 'drizzle-orm';
import { db, client } from '../src/lib/server/db';
import * as table from '../src/lib/server/db/schema';
import { hashPassword } from '../src/lib/server/auth/password';
import { demoLabs, demoUsers } from './demo';

export async function loadDemo(): Promise<{ labs: number; users: number }> {
	const hashes = await Promise.all(demoUsers.map((u) => hashPassword(u.password)));
	return db.transaction(async (tx) => {
		const labs = await tx.insert(table.lab).values([...demoLabs]).onConflictDoNothing({ target: table.lab.code }).returning();
		const labRows = await tx.select().from(table.lab).where(inArray(table.lab.code, demoLabs.map((l) => l.code)));
		const labId = new Map(labRows.map((l) => [l.code, l.id]));
		const people = await tx
			.insert(table.user)
			.values(demoUsers.map((u, i) => ({ email: u.email, name: u.name, role: u.role, passwordHash: hashes[i] })))
			.onConflictDoNothing({ target: table.user.email })
			.returning({ id: table.user.id, email: table.user.email });
		for (const p of people) {
			const u = demoUsers.find((d) => d.email === p.email)!;
			if (u.labs.length) await tx.insert(table.labMember).values(u.labs.map((c) => ({ labId: labId.get(c)!, userId: p.id }))).onConflictDoNothing();
			await tx.insert(table.auditLog).values({ actorId: null, action: 'seed.user', entity: 'user', entityId: p.id, after: { email: u.email, role: u.role } });
		}
		return { labs: labs.length, users: people.length };
	});
}

export async function isEmpty(): Promise<boolean> {
	const [{ n }] = await db.execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM "user"`);
	return n === 0;
}

if (import.meta.url === `file://${process.argv[1]}`) {
	const onlyIfEmpty = process.argv.includes('--if-empty');
	if (!onlyIfEmpty || (await isEmpty())) {
		const added = await loadDemo();
		console.log(`Demo data: ${added.labs} labs and ${added.users} people added.`);
	} else console.log('Database already holds data: demo data not loaded.');
	await client.end();
}
