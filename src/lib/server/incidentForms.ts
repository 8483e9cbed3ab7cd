// The report form's server side, shared by a new report and a draft being finished: read the
// multipart body once, validate the fields and the photos, save, and say where to go next.
import { redirect } from '@sveltejs/kit';
import { fail, message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { closeActionSchema, reportSchema } from '$lib/schemas/incidents';
import type { Scope } from '$lib/server/auth/scope';
import { failForm, formFields, readFormData } from '$lib/server/http/forms';
import * as incidents from '$lib/server/incidents';
import { readUploads } from '$lib/server/uploads';
import { failure } from '$lib/server/http/failure';

export async function saveReportForm(scope: Scope, request: Request, incidentId: string | null) {
	const data = await formFields(request);
	if (!data) {
		const form = await superValidate(zod4(reportSchema));
		return failForm(form, failure(400, 'The form could not be read; send it again.'));
	}
	const form = await readFormData(data, zod4(reportSchema));
	if (!form.valid) return fail(400, { form });
	const files = await readUploads(data, 'photos');
	if (!files.ok) return failForm(form, { ...files, message: `${files.message} Nothing was saved; choose the photos again.` });
	const saved = await incidents.saveReport(scope, incidentId, form.data, files.files);
	if (!saved.ok) return failForm(form, saved);
	redirect(303, saved.submitted ? `/incidents/${saved.id}?sent=1` : `/incidents/${saved.id}/edit?saved=1`);
}

/** Closing an action with its evidence (text and photos), from this page or from the list of one's actions. */
export async function closeActionFromForm(scope: Scope, request: Request) {
	const data = await formFields(request);
	if (!data) {
		return failForm(await superValidate(zod4(closeActionSchema), { id: 'close-action' }), failure(400, 'The form could not be read; send it again.'));
	}
	const form = await readFormData(data, zod4(closeActionSchema));
	if (!form.valid) return fail(400, { closeActionForm: form });
	const files = await readUploads(data, 'photos');
	if (!files.ok) return failForm(form, { ...files, message: `${files.message} Nothing was saved; choose the photos again.` });
	const r = await incidents.closeAction(scope, form.data, files.files);
	if (!r.ok) return failForm(form, r);
	return message(form, 'Action closed.');
}
