import { redirect } from '@sveltejs/kit';
import { fail } from 'sveltekit-superforms';
import { MAX_LIMIT_SET_BYTES } from '$lib/schemas/limitSet';
import { requireAbility } from '$lib/server/auth/guard';
import { formFields } from '$lib/server/forms';
import * as limitSets from '$lib/server/limitSets';
import { readLimitSet, type RowProblem } from '$lib/server/limitSetFormat';
import { readTextUpload } from '$lib/server/uploads';
import type { Actions, PageServerLoad } from './$types';

export type ImportReport = { fileName: string | null; message: string; problems: RowProblem[] };

export const load: PageServerLoad = async ({ locals }) => {
	requireAbility(locals, 'manageLimits');
	const drafts = await limitSets.listDrafts();
	return { drafts: drafts.map((d) => ({ ...d, createdAt: d.createdAt.toISOString() })), maxBytes: MAX_LIMIT_SET_BYTES };
};

export const actions: Actions = {
	upload: async function uploadLimitSet({ locals, request }) {
		const officer = requireAbility(locals, 'manageLimits');
		const data = await formFields(request);
		if (!data) return fail(400, { report: { fileName: null, message: 'The upload could not be read; choose the file and send it again.', problems: [] } satisfies ImportReport });
		const file = await readTextUpload(data, 'file', MAX_LIMIT_SET_BYTES);
		if (!file.ok) return fail(file.status, { report: { fileName: null, message: file.message, problems: [] } satisfies ImportReport });
		const read = readLimitSet(file.text);
		if (!read.ok) return fail(read.status, { report: { fileName: file.fileName, message: read.message, problems: read.problems.slice(0, 500) } satisfies ImportReport });
		const staged = await limitSets.stage(officer.id, file.fileName, read.rows);
		redirect(303, `/limits/import/${staged.id}`);
	}
};
