import { redirect } from '@sveltejs/kit';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { failForm, formObject } from '$lib/server/http/forms';
import { nudge, queues } from '$lib/server/jobs/queues';
import { orError } from '$lib/server/http/pages';
import * as registerImport from '$lib/server/registerImport';
import type { ImportProblem } from '$lib/registerCsv';
import type { Actions, PageServerLoad } from './$types';

/** Problems listed on the page at most; the count says how many there are in all. */
const SHOWN_PROBLEMS = 1000;

export const load: PageServerLoad = async ({ locals, params }) => {
	const scope = await scopeOf(requireAbility(locals, 'importRegister'));
	const found = orError(await registerImport.find(scope, params.registerImportId));
	const r = found.record;
	const problems = r.problems as ImportProblem[];
	return {
		fileName: r.fileName,
		uploader: found.uploader,
		mine: found.mine,
		createdAt: r.createdAt,
		totalRows: r.totalRows,
		errorRows: r.errorRows,
		newLasers: r.newLasers,
		existingLasers: r.existingLasers,
		validOnly: r.validOnly,
		problemCount: problems.length,
		problems: problems.slice(0, SHOWN_PROBLEMS),
		progress: registerImport.progressOf(r)
	};
};

export const actions: Actions = {
	start: async function start({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'importRegister'));
		const form = await formObject(request);
		const r = await registerImport.start(scope, params.registerImportId, form.validOnly === 'true');
		if (!r.ok) return failForm({ action: 'decide' }, r);
		await nudge(queues.registerImport);
		redirect(303, `/lasers/import/${params.registerImportId}`);
	},
	discard: async function discard({ locals, params }) {
		const scope = await scopeOf(requireAbility(locals, 'importRegister'));
		const r = await registerImport.discard(scope, params.registerImportId);
		if (!r.ok) return failForm({ action: 'decide' }, r);
		redirect(303, '/lasers/import?discarded=1');
	}
};
