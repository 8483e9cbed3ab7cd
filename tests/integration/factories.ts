// Small factories for test data, written straight through the app's data modules.
import { randomUUID } from 'node:crypto';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import * as users from '$lib/server/users';
import type { Role } from '$lib/roles';

export const strongPassword = 'correct horse battery staple 7';

export async function makeLab(code = `L${randomUUID().slice(0, 6)}`) {
	const [lab] = await db.insert(table.lab).values({ code, name: `Lab ${code}` }).returning();
	return lab;
}

export async function makeUser(role: Role = 'researcher', labIds: string[] = []) {
	const email = `${role}-${randomUUID().slice(0, 8)}@test.example`;
	const result = await users.create(null, { name: `Test ${role}`, email, role, labIds, password: strongPassword });
	if (!result.ok) throw new Error(`factory failed: ${result.message}`);
	return { id: result.id, email, password: strongPassword, role };
}
