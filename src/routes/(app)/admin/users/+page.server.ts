import { requireAbility } from '$lib/server/auth/guard';
import * as labs from '$lib/server/labs';
import * as users from '$lib/server/users';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	requireAbility(locals, 'administer');
	const [people, labList] = await Promise.all([users.list(), labs.list()]);
	return { people, labs: labList };
};
