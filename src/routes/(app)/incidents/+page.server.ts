import { can } from '$lib/abilities';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { closeActionSchema } from '$lib/schemas/incidents';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import { closeActionFromForm } from '$lib/server/incidentForms';
import { todayISO } from '$lib/inspectionState';
import { incidentKinds, incidentStates } from '$lib/incidentWords';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const today = todayISO();
	const state = url.searchParams.get('state');
	const kind = url.searchParams.get('kind');
	const filter: incidents.ListFilter = {
		state: state === 'open' || (incidentStates as readonly string[]).includes(state ?? '') ? (state as incidents.ListFilter['state']) : undefined,
		kind: (incidentKinds as readonly string[]).includes(kind ?? '') ? (kind as incidents.ListFilter['kind']) : undefined
	};
	const [rows, mine] = await Promise.all([incidents.list(scope, today, filter), incidents.myActions(scope, today)]);
	return {
		today,
		rows,
		mine,
		filter,
		role: user.role,
		canLearn: can(user, 'readIncidentFigures'),
		closeActionForm: await superValidate(zod4(closeActionSchema), { id: 'close-action' })
	};
};

export const actions: Actions = {
	closeAction: async function closeOwnAction({ locals, request }) {
		return closeActionFromForm(await scopeOf(requireUser(locals)), request);
	}
};
