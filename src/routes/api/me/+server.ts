import { json } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { endpoint } from '$lib/server/api';
import { requireUser } from '$lib/server/auth/guard';
import { ABSOLUTE_TIMEOUT_MS } from '$lib/server/auth/session';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import type { Role } from '$lib/roles';
import type { RequestHandler } from './$types';

export type MeResponse = {
	id: string;
	name: string;
	email: string;
	role: Role;
	labs: { id: string; code: string; name: string }[];
	session: { idleEndsAt: string; absoluteEndsAt: string };
};

export const GET: RequestHandler = endpoint(async ({ locals }) => {
	const user = requireUser(locals);
	const session = locals.session!;
	const labs = await db
		.select({ id: table.lab.id, code: table.lab.code, name: table.lab.name })
		.from(table.labMember)
		.innerJoin(table.lab, eq(table.lab.id, table.labMember.labId))
		.where(eq(table.labMember.userId, user.id));
	const body: MeResponse = {
		id: user.id,
		name: user.name,
		email: user.email,
		role: user.role,
		labs,
		session: {
			idleEndsAt: session.expiresAt.toISOString(),
			absoluteEndsAt: new Date(session.createdAt.getTime() + ABSOLUTE_TIMEOUT_MS).toISOString()
		}
	};
	return json(body);
});
