import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { newPasswordSchema } from '$lib/schemas/account';
import { failForm, readForm } from '$lib/server/http/forms';
import * as resets from '$lib/server/passwordResets';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => ({
	usable: await resets.isUsable(params.token),
	form: await superValidate(zod4(newPasswordSchema))
});

export const actions: Actions = {
	default: async function setNewPassword({ request, params }) {
		const form = await readForm(request, zod4(newPasswordSchema));
		const password = form.data.password;
		form.data.password = '';
		form.data.confirm = '';
		if (!form.valid) return fail(400, { form });
		const r = await resets.complete(params.token, password);
		if (!r.ok) return failForm(form, r);
		redirect(303, '/signin?reset=1');
	}
};
