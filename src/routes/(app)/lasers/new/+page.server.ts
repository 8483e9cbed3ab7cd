import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { newLaserSchema } from '$lib/schemas/register';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { failForm, readForm } from '$lib/server/http/forms';
import * as labs from '$lib/server/labs';
import * as lasers from '$lib/server/lasers';
import type { Actions, PageServerLoad } from './$types';

async function editableLabs(locals: App.Locals) {
	const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
	const all = await labs.list();
	return all.filter((l) => scope.editLabIds === 'all' || (Array.isArray(scope.editLabIds) && scope.editLabIds.includes(l.id)));
}

export const load: PageServerLoad = async ({ locals }) => {
	const labList = await editableLabs(locals);
	const form = await superValidate(zod4(newLaserSchema));
	if (labList.length === 1) form.data.labId = labList[0].id;
	return { form, labs: labList };
};

export const actions: Actions = {
	default: async function registerLaser({ locals, request }) {
		const user = requireAbility(locals, 'changeRegister');
		const form = await readForm(request, zod4(newLaserSchema));
		if (!form.valid) return fail(400, { form });
		const result = await lasers.create(await scopeOf(user), form.data);
		if (!result.ok) return failForm(form, result);
		redirect(303, `/lasers/${result.id}`);
	}
};
