import { fail, message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { readForm } from '$lib/server/http/forms';
import { preferencesSchema } from '$lib/schemas/account';
import { requireUser } from '$lib/server/auth/guard';
import * as preferences from '$lib/server/preferences';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	return { form: await superValidate({ mailMode: await preferences.mailMode(user.id) }, zod4(preferencesSchema)) };
};

export const actions: Actions = {
	save: async function savePreferences({ locals, request }) {
		const user = requireUser(locals);
		const form = await readForm(request, zod4(preferencesSchema));
		if (!form.valid) return fail(400, { form });
		await preferences.setMailMode(user.id, form.data.mailMode);
		return message(form, 'Saved.');
	}
};
