import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { replySchema } from '$lib/schemas/reviews';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { failForm, readForm } from '$lib/server/http/forms';
import { loadPath, savePath } from '$lib/server/pathForms';
import * as reports from '$lib/server/reports';
import * as reviews from '$lib/server/reviews';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const page = await loadPath(locals, params.pathId);
	// The hazard zone drawing and the report links, beside the editor.
	return { ...page, pictures: await reports.pathPictures(params.pathId) };
};

export const actions: Actions = {
	save: async function savePathChanges({ locals, request, params }) {
		return savePath(locals, request, null, params.pathId);
	},
	/** The researcher answers a returned review from the path page the mail links to. */
	reply: async function replyFromPath({ locals, request, params }) {
		const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
		const form = await readForm(request, zod4(replySchema));
		if (!form.valid) return fail(400, { replyForm: form });
		const result = await reviews.reply(scope, params.pathId, form.data.body);
		if (!result.ok) return failForm(form, result);
		redirect(303, `/paths/${params.pathId}?replied=1`);
	}
};
