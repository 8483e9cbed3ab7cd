import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { readForm } from '$lib/server/http/forms';
import { limitFormSchema } from '$lib/schemas/limits';
import { requireAbility } from '$lib/server/auth/guard';
import { failForm } from '$lib/server/http/forms';
import * as limits from '$lib/server/limits';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	requireAbility(locals, 'manageLimits');
	return { form: await superValidate(zod4(limitFormSchema)) };
};

export const actions: Actions = {
	default: async function addLimit({ locals, request }) {
		const officer = requireAbility(locals, 'manageLimits');
		const form = await readForm(request, zod4(limitFormSchema));
		if (!form.valid) return fail(400, { form });
		const result = await limits.create(officer.id, form.data);
		if (!result.ok) return failForm(form, result);
		redirect(303, `/limits/${result.id}`);
	}
};
