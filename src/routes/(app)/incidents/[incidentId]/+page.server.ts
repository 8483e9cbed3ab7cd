import { redirect } from '@sveltejs/kit';
import { fail, message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { actionSchema, closeActionSchema, closeIncidentSchema, investigationSchema, liftSchema, suspendSchema, type InvestigationForm } from '$lib/schemas/incidents';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { unreadableUpload } from '$lib/server/http/failure';
import { failForm, formFields, readForm } from '$lib/server/http/forms';
import { orError } from '$lib/server/http/pages';
import { closeActionFromForm } from '$lib/server/incidentForms';
import * as incidents from '$lib/server/incidents';
import * as medical from '$lib/server/medical';
import * as suspensions from '$lib/server/suspensions';
import { readUploads } from '$lib/server/uploads';
import { todayISO } from '$lib/inspectionState';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const today = todayISO();
	const { incident } = orError(await incidents.find(scope, params.incidentId, today));
	if (incident.state === 'draft' && incident.can.edit) redirect(303, `/incidents/${incident.id}/edit`);
	const officer = incident.can.investigate;
	const investigation: InvestigationForm = {
		severity: incident.severity ?? 'caught',
		causes: incident.causes,
		factors: incident.factors,
		pathIds: incident.links.paths.map((p) => p.id),
		eyewearIds: incident.links.eyewear.map((e) => e.id),
		procedures: incident.links.procedures.join('\n'),
		version: incident.version
	};
	const medicalRecord = officer ? await medical.read(scope, incident.id, 'page') : null;
	return {
		today,
		incident,
		officer: officer
			? {
					choices: await incidents.investigationChoices(incident.lab?.id ?? null),
					medical: medicalRecord?.ok ? medicalRecord : null,
					investigationForm: await superValidate(investigation, zod4(investigationSchema), { id: 'investigation', errors: false }),
					actionForm: await superValidate({ description: '', ownerId: '', dueOn: '' }, zod4(actionSchema), { id: 'action', errors: false }),
					suspendForm: await superValidate({ laserId: incident.laser?.id ?? '', reason: '' }, zod4(suspendSchema), { id: 'suspend', errors: false }),
					liftForm: await superValidate(zod4(liftSchema), { id: 'lift' }),
					closeForm: await superValidate({ closingNote: '', version: incident.version }, zod4(closeIncidentSchema), { id: 'close', errors: false })
				}
			: null,
		closeActionForm: await superValidate(zod4(closeActionSchema), { id: 'close-action' })
	};
};

async function officerScope(locals: App.Locals) {
	return scopeOf(requireAbility(locals, 'investigateIncidents'));
}

const photos = { action: 'photos' };

export const actions: Actions = {
	investigate: async function recordInvestigation({ locals, request, params }) {
		const scope = await officerScope(locals);
		const form = await readForm(request, zod4(investigationSchema), { id: 'investigation' });
		if (!form.valid) return fail(400, { investigationForm: form });
		const r = await incidents.investigate(scope, params.incidentId, form.data);
		if (!r.ok) return failForm(form, r);
		return message(form, 'Investigation saved.');
	},
	addAction: async function addCorrectiveAction({ locals, request, params }) {
		const scope = await officerScope(locals);
		const form = await readForm(request, zod4(actionSchema), { id: 'action' });
		if (!form.valid) return fail(400, { actionForm: form });
		const r = await incidents.addAction(scope, params.incidentId, form.data);
		if (!r.ok) return failForm(form, r);
		return message(form, 'Action added; its owner sees it under Incidents.');
	},
	closeAction: async function closeCorrectiveAction({ locals, request }) {
		const scope = await officerScope(locals);
		return closeActionFromForm(scope, request);
	},
	suspend: async function suspendLaser({ locals, request, params }) {
		const scope = await officerScope(locals);
		const form = await readForm(request, zod4(suspendSchema), { id: 'suspend' });
		if (!form.valid) return fail(400, { suspendForm: form });
		const r = await incidents.suspendFrom(scope, params.incidentId, form.data);
		if (!r.ok) return failForm(form, r);
		return message(form, 'Suspended. No new clearance is given on this laser until the suspension is lifted.');
	},
	lift: async function liftSuspension({ locals, request }) {
		const scope = await officerScope(locals);
		const form = await readForm(request, zod4(liftSchema), { id: 'lift' });
		if (!form.valid) return fail(400, { liftForm: form });
		const r = await suspensions.lift(scope, form.data);
		if (!r.ok) return failForm(form, r);
		return message(form, 'Suspension lifted.');
	},
	close: async function closeIncident({ locals, request, params }) {
		const scope = await officerScope(locals);
		const form = await readForm(request, zod4(closeIncidentSchema), { id: 'close' });
		if (!form.valid) return fail(400, { closeForm: form });
		const r = await incidents.close(scope, params.incidentId, form.data);
		if (!r.ok) return failForm(form, r);
		return message(form, 'Incident closed.');
	},
	photos: async function addIncidentPhotos({ locals, request, params }) {
		const scope = await officerScope(locals);
		const data = await formFields(request);
		if (!data) return failForm(photos, unreadableUpload());
		const files = await readUploads(data, 'photos');
		if (!files.ok) return failForm(photos, files);
		const r = await incidents.attachPhotos(scope, params.incidentId, files.files);
		if (!r.ok) return failForm(photos, r);
		return { photosAdded: r.count };
	}
};
