import { error, redirect } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { reportSchema, type ReportForm } from '$lib/schemas/incidents';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import { saveReportForm } from '$lib/server/incidentForms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const scope = await scopeOf(requireUser(locals));
	const draft = await incidents.draftOf(scope, params.incidentId);
	if (!draft) {
		// A sent report is read on its own page; anyone else's draft does not exist for this person.
		if (await incidents.levelOf(scope, params.incidentId)) redirect(303, `/incidents/${params.incidentId}`);
		error(404, { message: 'No such report.' });
	}
	const start: ReportForm = {
		intent: 'submit',
		kind: draft.kind ?? '',
		occurredAt: draft.occurredAt?.slice(0, 16).replace(' ', 'T') ?? '',
		areaId: draft.areaId ?? '',
		laserId: draft.laserId ?? '',
		pathId: draft.pathId ?? '',
		locationNotes: draft.locationNotes,
		description: draft.description,
		peopleInvolved: draft.peopleInvolved,
		medicalAttention: draft.medicalAttention,
		anonymous: draft.anonymous,
		version: draft.version
	};
	return { number: draft.number, places: await incidents.places(scope), form: await superValidate(start, zod4(reportSchema), { errors: false }) };
};

export const actions: Actions = {
	save: async function saveDraftReport({ locals, request, params }) {
		const scope = await scopeOf(requireUser(locals));
		// Answered here, not by the page's load (which sends a reader of a sent report to its page).
		if (!(await incidents.draftOf(scope, params.incidentId))) error(404, { message: 'No draft report of yours has this number; a sent report is changed by the officers on its page.' });
		return saveReportForm(scope, request, params.incidentId);
	}
};
