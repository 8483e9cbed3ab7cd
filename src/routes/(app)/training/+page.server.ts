import { can } from '$lib/abilities';
import { fail, message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { recordTrainingSchema, withdrawTrainingSchema } from '$lib/schemas/training';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { failForm, readForm } from '$lib/server/http/forms';
import * as training from '$lib/server/training';
import { todayISO } from '$lib/inspectionState';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	// Researchers see their own records; officers, managers and admins everyone's.
	const today = todayISO();
	const canRecord = can(user, 'recordTraining');
	const [rows, people] = await Promise.all([training.list(today, can(user, 'readEveryone') ? undefined : user.id), canRecord ? training.people() : Promise.resolve([])]);
	return {
		today,
		rows,
		canRecord,
		people,
		recordForm: await superValidate({ userId: '', topic: '', completedOn: today, expiresOn: '', notes: '' }, zod4(recordTrainingSchema), { id: 'record', errors: false }),
		withdrawForm: await superValidate(zod4(withdrawTrainingSchema), { id: 'withdraw' })
	};
};

export const actions: Actions = {
	record: async function recordTraining({ locals, request }) {
		const officer = requireAbility(locals, 'recordTraining');
		const form = await readForm(request, zod4(recordTrainingSchema), { id: 'record' });
		if (!form.valid) return fail(400, { recordForm: form });
		const result = await training.record(officer.id, form.data, todayISO());
		if (!result.ok) return failForm(form, result);
		return message(form, 'Recorded.');
	},
	withdraw: async function withdrawTraining({ locals, request }) {
		const officer = requireAbility(locals, 'recordTraining');
		const form = await readForm(request, zod4(withdrawTrainingSchema), { id: 'withdraw' });
		if (!form.valid) return fail(400, { withdrawForm: form });
		const result = await training.withdraw(officer.id, form.data);
		if (!result.ok) return failForm(form, result);
		return message(form, 'Withdrawn; the record stays in the history.');
	}
};
