import { loadLineForm, saveLineForm } from '$lib/server/lineForms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, params }) => loadLineForm(locals, params.laserId, null);

export const actions: Actions = {
	default: async function addLine({ locals, request, params }) {
		return saveLineForm(locals, request, params.laserId, null);
	}
};
