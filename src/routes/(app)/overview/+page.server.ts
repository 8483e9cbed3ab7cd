import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as notifications from '$lib/server/notifications';
import * as reviews from '$lib/server/reviews';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const [counts, recent] = await Promise.all([reviews.counts(scope), notifications.recent(user.id, 10)]);
	return {
		counts,
		notifications: recent.map((n) => ({ id: n.id, title: n.title, body: n.body, pathId: n.pathId, kind: n.kind, createdAt: n.createdAt.toISOString(), read: n.readAt !== null }))
	};
};
