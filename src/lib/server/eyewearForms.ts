// Load and save of the eyewear form, shared by "add" and "edit".
import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { eyewearSchema, type EyewearForm } from '$lib/schemas/eyewear';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as eyewear from '$lib/server/eyewear';
import { failForm, readForm } from '$lib/server/http/forms';
import { orError } from '$lib/server/http/pages';
import * as labs from '$lib/server/labs';
import { asEntered } from '$lib/units';

export async function loadEyewearForm(locals: App.Locals, eyewearId: string | null) {
	const scope = await scopeOf(requireAbility(locals, 'manageEyewear'));
	const labList = await labs.list();
	if (eyewearId === null) {
		const start: EyewearForm = { labId: '', label: '', location: '', frame: '', condition: 'good', lastCheckedAt: '', bands: [{ wavelengthMin: '', wavelengthMax: '', od: '' }], version: 0 };
		return { labs: labList, form: await superValidate(start, zod4(eyewearSchema), { errors: false }), label: null, retired: false, version: 0 };
	}
	const { eyewear: e } = orError(await eyewear.find(scope, eyewearId));
	const values: EyewearForm = {
		labId: e.labId,
		label: e.label,
		location: e.location,
		frame: e.frame,
		condition: e.condition,
		lastCheckedAt: e.lastCheckedAt?.toISOString().slice(0, 10) ?? '',
		bands: e.bands.map((b) => ({ wavelengthMin: asEntered(b.wavelengthMin, 'wavelength'), wavelengthMax: asEntered(b.wavelengthMax, 'wavelength'), od: asEntered(b.od, null) })),
		version: e.version
	};
	return { labs: labList, form: await superValidate(values, zod4(eyewearSchema)), label: e.label, retired: e.retired, version: e.version };
}

export async function saveEyewearForm(locals: App.Locals, request: Request, eyewearId: string | null) {
	const scope = await scopeOf(requireAbility(locals, 'manageEyewear'));
	const form = await readForm(request, zod4(eyewearSchema));
	if (!form.valid) return fail(400, { form });
	const result = await eyewear.save(scope, eyewearId, form.data);
	if (!result.ok) return failForm(form, result);
	redirect(303, '/eyewear');
}
