import { can } from '$lib/abilities';
import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { closeFindingSchema, recordInspectionSchema, type RecordInspectionForm } from '$lib/schemas/inspections';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { invalidInput, unreadableUpload } from '$lib/server/http/failure';
import { failForm, formFields, formObject, readForm } from '$lib/server/http/forms';
import { orError } from '$lib/server/http/pages';
import * as inspections from '$lib/server/inspections';
import { readUploads } from '$lib/server/uploads';
import { inspectionState, todayISO } from '$lib/inspectionState';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const found = orError(await inspections.find(scope, params.inspectionId));
	const templates = await inspections.templates();
	const first = templates[0];
	const start: RecordInspectionForm = {
		completedOn: todayISO(),
		templateId: first?.id ?? '',
		results: (first?.items ?? []).map((i) => ({ itemText: i.text, outcome: '', notes: '' })),
		findings: [],
		notes: '',
		version: found.inspection.version
	};
	const today = todayISO();
	return {
		today,
		inspection: { ...found.inspection, state: inspectionState(found.inspection.dueOn, found.inspection.completedOn, today) },
		area: { id: found.area.id, name: found.area.name, room: found.area.room, building: found.area.building, interval: found.area.inspectionIntervalMonths, interlockNotes: found.area.interlockNotes, signageNotes: found.area.signageNotes },
		labCode: found.labCode,
		inspectorName: found.inspectorName,
		results: found.results,
		findings: found.findings.map((f) => ({ id: f.id, description: f.description, action: f.action, dueOn: f.dueOn, closedOn: f.closedOn, closedByName: f.closedByName, closureNote: f.closureNote, version: f.version, overdue: !f.closedOn && !!f.dueOn && f.dueOn < today })),
		photos: found.photos,
		history: found.history,
		templates: templates.map((t) => ({ id: t.id, name: t.name, items: t.items.map((i) => i.text) })),
		form: await superValidate(start, zod4(recordInspectionSchema), { errors: false }),
		canRecord: can(user, 'recordInspections') && !found.inspection.completedOn,
		canCloseFindings: can(user, 'recordInspections')
	};
};

const photos = { action: 'photos' };

export const actions: Actions = {
	record: async function recordInspection({ locals, request, params }) {
		const scope = await scopeOf(requireAbility(locals, 'recordInspections'));
		const form = await readForm(request, zod4(recordInspectionSchema));
		if (!form.valid) return fail(400, { form });
		const r = await inspections.record(scope, params.inspectionId, form.data);
		if (!r.ok) return failForm(form, r);
		redirect(303, `/inspections/${params.inspectionId}?next=${r.nextDueOn}`);
	},
	closeFinding: async function closeFinding({ locals, request, params }) {
		const scope = await scopeOf(requireAbility(locals, 'recordInspections'));
		const body = await formObject(request);
		const findingId = typeof body?.findingId === 'string' ? body.findingId : '';
		const parsed = closeFindingSchema.safeParse(body);
		const closing = { action: 'closeFinding', about: findingId };
		if (!parsed.success) return failForm(closing, invalidInput(parsed.error));
		const r = await inspections.closeFinding(scope, params.inspectionId, parsed.data);
		if (!r.ok) return failForm(closing, r);
		return { findingClosed: r.description };
	},
	photos: async function attachPhotos({ locals, request, params }) {
		const scope = await scopeOf(requireAbility(locals, 'recordInspections'));
		const data = await formFields(request);
		if (!data) return failForm(photos, unreadableUpload());
		const files = await readUploads(data, 'photos');
		if (!files.ok) return failForm(photos, files);
		const r = await inspections.attach(scope, params.inspectionId, files.files);
		if (!r.ok) return failForm(photos, r);
		return { photosAdded: r.count };
	}
};
