import { loadLineForm, saveLineForm } from '$lib/server/lineForms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, params }) => loadLineForm(locals, params.laserId, params.lineId);

export const actions: Actions = {
	save: async function saveLine({ locals, request, params }) {
		return saveLineForm(locals, request, params.laserId, params.lineId);
	}
};
