import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { editLaserSchema } from '$lib/schemas/register';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { failForm, readForm } from '$lib/server/http/forms';
import * as labs from '$lib/server/labs';
import * as lasers from '$lib/server/lasers';
import { orError } from '$lib/server/http/pages';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
	const { detail, editable } = orError(await lasers.find(scope, params.laserId));
	if (!editable) error(403, { message: 'Only members of this laser’s lab and laser safety officers can change it.' });
	const { labId, maker, model, serial, laserClass, status, notes, version } = detail.laser;
	const all = await labs.list();
	return {
		laser: { id: detail.laser.id, name: `${maker} ${model}` },
		form: await superValidate({ labId, maker, model, serial, laserClass, status, notes, version }, zod4(editLaserSchema)),
		labs: all.filter((l) => scope.editLabIds === 'all' || (Array.isArray(scope.editLabIds) && scope.editLabIds.includes(l.id)))
	};
};

export const actions: Actions = {
	save: async function saveLaser({ locals, request, params }) {
		const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
		const form = await readForm(request, zod4(editLaserSchema));
		if (!form.valid) return fail(400, { form });
		const result = await lasers.update(scope, params.laserId, form.data);
		if (!result.ok) return failForm(form, result);
		redirect(303, `/lasers/${params.laserId}`);
	}
};
