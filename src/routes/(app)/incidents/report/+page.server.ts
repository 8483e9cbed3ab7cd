import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { reportSchema, type ReportForm } from '$lib/schemas/incidents';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import { saveReportForm } from '$lib/server/incidentForms';
import * as inspections from '$lib/server/inspections';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const scope = await scopeOf(requireUser(locals));
	const places = await incidents.places(scope);
	// Prefilled from the page the person came from: a laser, a beam path, or an inspection's area.
	const q = (k: string) => url.searchParams.get(k) ?? '';
	const path = places.paths.find((p) => p.id === q('pathId'));
	const laser = places.lasers.find((l) => l.id === (path?.laserId ?? q('laserId')));
	let areaId = laser?.areaId ?? '';
	if (!laser && q('inspectionId')) {
		const found = await inspections.find(scope, q('inspectionId'));
		if (found.ok) areaId = found.area.id;
	}
	const start: ReportForm = {
		intent: 'submit',
		kind: '',
		occurredAt: '',
		areaId,
		laserId: laser?.id ?? '',
		pathId: path?.id ?? '',
		locationNotes: '',
		description: '',
		peopleInvolved: '',
		medicalAttention: 'unknown',
		anonymous: false,
		version: 0
	};
	return { places, form: await superValidate(start, zod4(reportSchema), { errors: false }) };
};

export const actions: Actions = {
	save: async function saveNewReport({ locals, request }) {
		return saveReportForm(await scopeOf(requireUser(locals)), request, null);
	}
};
