import { redirect } from '@sveltejs/kit';
import { fail } from 'sveltekit-superforms';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { formFields } from '$lib/server/forms';
import * as registerImport from '$lib/server/registerImport';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	requireAbility(locals, 'importRegister');
	return { recent: await registerImport.recent() };
};

export const actions: Actions = {
	upload: async function upload({ locals, request }) {
		const scope = await scopeOf(requireAbility(locals, 'importRegister'));
		const data = await formFields(request);
		if (!data) return fail(400, { uploadError: 'The upload could not be read; choose the file and send it again.', problems: [] });
		const read = await registerImport.readUpload(data.get('file'));
		if (!read.ok) return fail(read.status, { uploadError: read.message, problems: [] });
		const staged = await registerImport.stage(scope, read.fileName, read.text);
		if (!staged.ok) return fail(staged.status, { uploadError: staged.message, problems: 'problems' in staged ? (staged.problems ?? []) : [] });
		redirect(303, `/lasers/import/${staged.id}`);
	}
};
