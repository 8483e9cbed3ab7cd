import { redirect } from '@sveltejs/kit';
import * as auth from '$lib/server/auth/session';
import { requireUser } from '$lib/server/auth/guard';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	requireUser(locals);
	return {};
};

export const actions: Actions = {
	default: async function signOut({ locals, cookies }) {
		requireUser(locals);
		if (locals.session) await auth.invalidateSession(locals.session.id);
		auth.deleteSessionCookie(cookies);
		redirect(303, '/signin');
	}
};
