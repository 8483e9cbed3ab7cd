import { redirect } from '@sveltejs/kit';
import { templateSchema } from '$lib/schemas/inspections';
import { invalidInput } from '$lib/server/http/failure';
import { failForm, formObject } from '$lib/server/http/forms';
import { requireAbility } from '$lib/server/auth/guard';
import * as inspections from '$lib/server/inspections';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	requireAbility(locals, 'recordInspections');
	return { templates: await inspections.templates() };
};

export const actions: Actions = {
	create: async function createChecklist({ locals, request }) {
		const officer = requireAbility(locals, 'recordInspections');
		const raw = await formObject(request);
		const parsed = templateSchema.safeParse(raw);
		if (!parsed.success) return failForm({ action: 'create' }, invalidInput(parsed.error), { values: { name: String(raw.name ?? ''), items: String(raw.items ?? '') } });
		const lines = parsed.data.items.split('\n').map((l) => l.trim()).filter(Boolean);
		await inspections.createTemplate(officer.id, parsed.data.name, lines);
		redirect(303, '/inspections/checklists');
	}
};
