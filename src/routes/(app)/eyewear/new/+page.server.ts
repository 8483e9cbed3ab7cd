import { loadEyewearForm, saveEyewearForm } from '$lib/server/eyewearForms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => loadEyewearForm(locals, null);

export const actions: Actions = {
	default: async function addEyewear({ locals, request }) {
		return saveEyewearForm(locals, request, null);
	}
};
