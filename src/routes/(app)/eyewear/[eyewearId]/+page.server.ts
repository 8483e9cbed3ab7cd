import { loadEyewearForm, saveEyewearForm } from '$lib/server/eyewearForms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, params }) => loadEyewearForm(locals, params.eyewearId);

export const actions: Actions = {
	save: async function saveEyewear({ locals, request, params }) {
		return saveEyewearForm(locals, request, params.eyewearId);
	}
};
