import { loadNewPath, savePath } from '$lib/server/pathForms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, params }) => loadNewPath(locals, params.laserId);

export const actions: Actions = {
	save: async function saveNewPath({ locals, request, params }) {
		return savePath(locals, request, params.laserId, null);
	}
};
