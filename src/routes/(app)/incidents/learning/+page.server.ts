import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import { todayISO } from '$lib/inspectionState';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const scope = await scopeOf(requireAbility(locals, 'readIncidentFigures'));
	const today = todayISO();
	return { today, learning: await incidents.learning(scope, today) };
};
