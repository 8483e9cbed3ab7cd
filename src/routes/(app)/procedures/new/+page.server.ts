import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { newProcedureSchema, type NewProcedureForm } from '$lib/schemas/procedures';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { failForm, readForm } from '$lib/server/http/forms';
import * as procedures from '$lib/server/procedures';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const scope = await scopeOf(requireAbility(locals, 'workWithLasers'));
	const options = await procedures.targetOptions(scope);
	const wanted = url.searchParams.get('target') ?? '';
	const known = [...options.lasers.map((l) => `laser:${l.id}`), ...options.areas.map((a) => `area:${a.id}`)];
	const start: NewProcedureForm = { target: known.includes(wanted) ? wanted : '', kind: 'operating', title: '', pathIds: [], body: '' };
	return { options, form: await superValidate(start, zod4(newProcedureSchema), { errors: false }) };
};

export const actions: Actions = {
	create: async function createProcedure({ locals, request }) {
		const scope = await scopeOf(requireAbility(locals, 'workWithLasers'));
		const form = await readForm(request, zod4(newProcedureSchema));
		if (!form.valid) return fail(400, { form });
		const r = await procedures.create(scope, form.data);
		if (!r.ok) return failForm(form, r);
		redirect(303, `/procedures/${r.id}?created=1`);
	}
};
