import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { failure } from '$lib/server/http/failure';
import { failForm, readForm } from '$lib/server/http/forms';
import { signInSchema } from '$lib/schemas/users';
import * as auth from '$lib/server/auth/session';
import * as device from '$lib/server/auth/device';
import { safeNext } from '$lib/server/auth/next';
import * as users from '$lib/server/users';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	return { form: await superValidate(zod4(signInSchema)) };
};

export const actions: Actions = {
	default: async function signIn(event) {
		const form = await readForm(event.request, zod4(signInSchema));
		if (!form.valid) return fail(400, { form: { ...form, data: { ...form.data, password: '' } } });
		const outcome = await users.authenticate(form.data.email, form.data.password, event.getClientAddress(), event.cookies.get(device.deviceCookieName));
		form.data.password = '';
		if (!outcome.ok && outcome.reason === 'throttled') {
			const minutes = Math.ceil(outcome.retryAfter / 60);
			return failForm(form, failure(429, `Too many failed attempts. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, sign in from a browser you have used here before, or reset your password.`));
		}
		if (!outcome.ok) return failForm(form, failure(400, 'That e-mail and password do not match an active account.'));
		// A fresh session on every sign-in; the old one (if any) ends.
		if (event.locals.session) await auth.invalidateSession(event.locals.session.id);
		const session = await auth.createSession(outcome.userId);
		auth.setSessionCookie(event.cookies, session.id);
		device.setDeviceCookie(event.cookies, outcome.deviceToken);
		redirect(303, safeNext(event.url.searchParams.get('next'), event.url.origin));
	}
};
