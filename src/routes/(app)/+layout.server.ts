import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as suspensions from '$lib/server/suspensions';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	// Every page about one laser (its own, its lines, its paths, their reviews) says so when the laser
	// is suspended; only for people who may read that laser.
	const p = params as { laserId?: string; pathId?: string };
	const suspension = p.laserId || p.pathId ? await suspensions.forPage(await scopeOf(user), p) : null;
	return { user: { id: user.id, name: user.name, role: user.role }, suspension };
};
