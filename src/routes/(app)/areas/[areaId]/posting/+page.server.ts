import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { orError } from '$lib/server/http/pages';
import * as postings from '$lib/server/postings';
import { todayISO } from '$lib/inspectionState';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const scope = await scopeOf(requireUser(locals));
	const today = todayISO();
	const posting = orError(await postings.find(scope, params.areaId, today));
	return { today, posting: { ...posting, area: { id: posting.area.id, name: posting.area.name, room: posting.area.room, building: posting.area.building } } };
};
