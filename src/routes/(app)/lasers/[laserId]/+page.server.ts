import { can } from '$lib/abilities';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as lasers from '$lib/server/lasers';
import * as authorisations from '$lib/server/authorisations';
import * as procedures from '$lib/server/procedures';
import { todayISO } from '$lib/inspectionState';
import { orError } from '$lib/server/http/pages';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const { detail, editable } = orError(await lasers.find(scope, params.laserId));
	// Who may operate it and its procedures (issue 15).
	const [people, procs] = await Promise.all([authorisations.list(scope, todayISO(), { laserId: detail.laser.id, decisions: ['granted', 'requested'] }), procedures.list(scope, todayISO(), { laserId: detail.laser.id })]);
	const safety = { laserId: detail.laser.id, areaId: detail.laser.areaId, people: people.map(authorisations.summary), procedures: procs, canWrite: editable, personLinks: can(user, 'readEveryone') };
	// Lines the engine cannot assess are said so beside the line, never left to surprise a path.
	const objections = Object.fromEntries(detail.lines.map((l) => [l.id, lasers.lineObjections(l)]));
	return { detail, editable, safety, objections };
};
