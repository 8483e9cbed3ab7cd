import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { reloadAndRetry } from '$lib/server/http/failure';
import { failForm, formObject } from '$lib/server/http/forms';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as eyewear from '$lib/server/eyewear';
import { loadEyewearForm, saveEyewearForm } from '$lib/server/eyewearForms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, params }) => loadEyewearForm(locals, params.eyewearId);

export const actions: Actions = {
	save: async function saveEyewear({ locals, request, params }) {
		return saveEyewearForm(locals, request, params.eyewearId);
	},
	retire: async function retireEyewear({ locals, request, params }) {
		const scope = await scopeOf(requireAbility(locals, 'manageEyewear'));
		const parsed = z.object({ version: z.coerce.number().int().positive() }).safeParse(await formObject(request));
		if (!parsed.success) return failForm({ action: 'retire' }, reloadAndRetry());
		const result = await eyewear.retire(scope, params.eyewearId, parsed.data.version);
		if (!result.ok) return failForm({ action: 'retire' }, result);
		redirect(303, '/eyewear');
	}
};
