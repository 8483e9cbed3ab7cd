import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as lasers from '$lib/server/lasers';
import { orError } from '$lib/server/pages';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	const { detail, editable } = orError(await lasers.find(await scopeOf(user), params.laserId));
	return { detail, editable };
};
