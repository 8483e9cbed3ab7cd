import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { updateUserSchema } from '$lib/schemas/users';
import { requireAbility } from '$lib/server/auth/guard';
import { failForm, readForm } from '$lib/server/http/forms';
import { orError } from '$lib/server/http/pages';
import * as labs from '$lib/server/labs';
import * as users from '$lib/server/users';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	requireAbility(locals, 'administer');
	const { person } = orError(await users.find(params.userId));
	const { role, labIds, disabled, version } = person;
	return {
		person: { id: person.id, name: person.name, email: person.email },
		form: await superValidate({ role, labIds, disabled, version }, zod4(updateUserSchema)),
		labs: await labs.list()
	};
};

export const actions: Actions = {
	save: async function saveUser({ locals, request, params }) {
		const admin = requireAbility(locals, 'administer');
		const form = await readForm(request, zod4(updateUserSchema));
		if (!form.valid) return fail(400, { form });
		const result = await users.update(admin.id, params.userId, form.data);
		if (!result.ok) return failForm(form, result);
		redirect(303, '/admin/users');
	}
};
