import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/http/api';
import { requireUser } from '$lib/server/auth/guard';
import { ABSOLUTE_TIMEOUT_MS } from '$lib/server/auth/session';
import * as labs from '$lib/server/labs';
import type { MeResponse } from '$lib/schemas/account';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = endpoint(async ({ locals }) => {
	const user = requireUser(locals);
	const session = locals.session!;
	const body: MeResponse = {
		id: user.id,
		name: user.name,
		email: user.email,
		role: user.role,
		labs: await labs.ofMember(user.id),
		session: {
			idleEndsAt: session.expiresAt.toISOString(),
			absoluteEndsAt: new Date(session.createdAt.getTime() + ABSOLUTE_TIMEOUT_MS).toISOString()
		}
	};
	return json(body);
});
