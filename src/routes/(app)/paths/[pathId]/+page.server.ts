import { loadPath, savePath } from '$lib/server/pathForms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, params }) => loadPath(locals, params.pathId);

export const actions: Actions = {
	save: async function savePathChanges({ locals, request, params }) {
		return savePath(locals, request, null, params.pathId);
	}
};
