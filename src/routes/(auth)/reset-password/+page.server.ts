import { fail, message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { failForm, readForm } from '$lib/server/http/forms';
import { resetRequestSchema } from '$lib/schemas/account';
import * as resets from '$lib/server/passwordResets';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => ({ form: await superValidate(zod4(resetRequestSchema)) });

export const actions: Actions = {
	default: async function requestReset({ request, getClientAddress }) {
		const form = await readForm(request, zod4(resetRequestSchema));
		if (!form.valid) return fail(400, { form });
		const outcome = await resets.request(form.data.email, getClientAddress());
		if (!outcome.ok) return failForm(form, outcome);
		return message(form, 'If an active account uses this address, a link to choose a new password is on its way. It works once, for 30 minutes.');
	}
};
