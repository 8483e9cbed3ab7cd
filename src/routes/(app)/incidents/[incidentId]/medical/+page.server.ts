import { error } from '@sveltejs/kit';
import { fail, message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { medicalSchema } from '$lib/schemas/incidents';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { failForm, readForm } from '$lib/server/http/forms';
import * as medical from '$lib/server/medical';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const scope = await scopeOf(requireAbility(locals, 'investigateIncidents'));
	const record = await medical.read(scope, params.incidentId, 'page');
	if (!record.ok) error(record.status, { message: record.message });
	const start = { examinationRequestedOn: record.examinationRequestedOn ?? '', examinationDoneOn: record.examinationDoneOn ?? '', outcome: record.outcome, version: record.version };
	return { incidentId: params.incidentId, record, form: await superValidate(start, zod4(medicalSchema), { errors: false }) };
};

export const actions: Actions = {
	save: async function saveMedicalFollowUp({ locals, request, params }) {
		const scope = await scopeOf(requireAbility(locals, 'investigateIncidents'));
		const form = await readForm(request, zod4(medicalSchema));
		if (!form.valid) return fail(400, { form });
		const r = await medical.save(scope, params.incidentId, form.data);
		if (!r.ok) return failForm(form, r);
		form.data.version += 1;
		return message(form, 'Saved.');
	}
};
