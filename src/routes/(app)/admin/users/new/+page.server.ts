import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { newUserSchema } from '$lib/schemas/users';
import { requireAbility } from '$lib/server/auth/guard';
import { failForm, readForm } from '$lib/server/http/forms';
import * as labs from '$lib/server/labs';
import * as users from '$lib/server/users';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	requireAbility(locals, 'administer');
	return { form: await superValidate(zod4(newUserSchema)), labs: await labs.list() };
};

export const actions: Actions = {
	default: async function createUser({ locals, request }) {
		const admin = requireAbility(locals, 'administer');
		const form = await readForm(request, zod4(newUserSchema));
		const password = form.data.password;
		form.data.password = ''; // never echo a password back
		if (!form.valid) return fail(400, { form });
		const result = await users.create(admin.id, { ...form.data, password });
		if (!result.ok) return failForm(form, result);
		redirect(303, `/admin/users?created=${encodeURIComponent(result.id)}`);
	}
};
