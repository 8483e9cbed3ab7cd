import { redirect } from '@sveltejs/kit';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { unreadableUpload, type Failure } from '$lib/server/http/failure';
import { failForm, formFields } from '$lib/server/http/forms';
import * as registerImport from '$lib/server/registerImport';
import type { ImportProblem } from '$lib/registerCsv';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	requireAbility(locals, 'importRegister');
	return { recent: await registerImport.recent() };
};

/** A refused upload, with the file's problems by line when it was read. */
const refuseUpload = (f: Failure, problems: ImportProblem[] = []) => failForm({ action: 'upload' }, f, { problems });

export const actions: Actions = {
	upload: async function upload({ locals, request }) {
		const scope = await scopeOf(requireAbility(locals, 'importRegister'));
		const data = await formFields(request);
		if (!data) return refuseUpload(unreadableUpload());
		const read = await registerImport.readUpload(data.get('file'));
		if (!read.ok) return refuseUpload(read);
		const staged = await registerImport.stage(scope, read.fileName, read.text);
		if (!staged.ok) return refuseUpload(staged, staged.problems);
		redirect(303, `/lasers/import/${staged.id}`);
	}
};
