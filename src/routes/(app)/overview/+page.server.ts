import { can } from '$lib/abilities';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as inspections from '$lib/server/inspections';
import * as notifications from '$lib/server/notifications';
import * as training from '$lib/server/training';
import { todayISO } from '$lib/inspectionState';
import * as reviews from '$lib/server/reviews';
import * as authorisations from '$lib/server/authorisations';
import * as procedures from '$lib/server/procedures';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const today = todayISO();
	const [counts, recent, open, records, duties, desk] = await Promise.all([
		reviews.counts(scope),
		notifications.recent(user.id, 10),
		inspections.schedule(scope, today),
		training.list(today, user.id),
		can(user, 'workWithLasers') ? authorisations.dutiesOf(scope, today) : Promise.resolve([]),
		can(user, 'decideReviews') ? officerDesk(scope, today) : Promise.resolve(null)
	]);
	// The open inspections this person answers for: as the area's responsible person or as its inspector.
	const mine = open.filter((r) => r.responsibleId === user.id || r.inspectorId === user.id);
	return {
		counts,
		today,
		inspections: mine.map((r) => ({ id: r.id, areaName: r.areaName, labCode: r.labCode, dueOn: r.dueOn, state: r.state, as: r.inspectorId === user.id ? (r.responsibleId === user.id ? 'responsible and inspector' : 'inspector') : 'responsible' })),
		// Only one's own records that need doing something about.
		training: records.filter((r) => r.state === 'expired' || r.state === 'expires_soon').map((r) => ({ id: r.id, topic: r.topic, expiresOn: r.expiresOn, state: r.state })),
		duties,
		desk,
		notifications: recent.map((n) => ({ id: n.id, title: n.title, body: n.body, pathId: n.pathId, kind: n.kind, createdAt: n.createdAt, read: n.readAt !== null }))
	};
};

/** What the officer watches: authorisations lapsing within 30 days or lapsed, requests, procedures waiting. */
async function officerDesk(scope: Awaited<ReturnType<typeof scopeOf>>, today: string) {
	const [a, procs] = await Promise.all([authorisations.officerDesk(today), procedures.list(scope, today)]);
	return {
		lapsing: a.lapsing.map(authorisations.summary),
		lapsed: a.lapsed.map(authorisations.summary),
		requests: a.requests.map(authorisations.summary),
		procedures: procs.filter((p) => p.draftState === 'submitted' || p.state === 'to_be_reviewed' || p.state === 'review_overdue' || p.state === 'review_due')
	};
}
