import { redirect } from '@sveltejs/kit';
import { MAX_LIMIT_SET_BYTES } from '$lib/schemas/limitSet';
import { requireAbility } from '$lib/server/auth/guard';
import { failure, unreadableUpload } from '$lib/server/http/failure';
import { failForm, formFields } from '$lib/server/http/forms';
import * as limitSets from '$lib/server/limitSets';
import { readLimitSet, type RowProblem } from '$lib/server/limitSetFormat';
import { readTextUpload } from '$lib/server/uploads';
import type { Actions, PageServerLoad } from './$types';

/** Beside a refused upload: the file's name and its problems by row. */
export type ImportReport = { fileName: string | null; problems: RowProblem[] };

export const load: PageServerLoad = async ({ locals }) => {
	requireAbility(locals, 'manageLimits');
	const drafts = await limitSets.listDrafts();
	return { drafts, maxBytes: MAX_LIMIT_SET_BYTES };
};

const uploadForm = { action: 'upload' };

export const actions: Actions = {
	upload: async function uploadLimitSet({ locals, request }) {
		const officer = requireAbility(locals, 'manageLimits');
		const data = await formFields(request);
		const unnamed: ImportReport = { fileName: null, problems: [] };
		if (!data) return failForm(uploadForm, unreadableUpload(), unnamed);
		const file = await readTextUpload(data, 'file', MAX_LIMIT_SET_BYTES);
		if (!file.ok) return failForm(uploadForm, file, unnamed);
		const read = readLimitSet(file.text);
		if (!read.ok) return failForm(uploadForm, failure(read.status, read.message), { fileName: file.fileName, problems: read.problems.slice(0, 500) } satisfies ImportReport);
		const staged = await limitSets.stage(officer.id, file.fileName, read.rows);
		redirect(303, `/limits/import/${staged.id}`);
	}
};
