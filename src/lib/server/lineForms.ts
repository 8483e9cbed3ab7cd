// The line form's load and save, shared by "add a line" and "edit a line".
import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { lineSchema } from '$lib/schemas/register';
import { requireAbility } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import { failForm, readForm } from '$lib/server/http/forms';
import * as lasers from '$lib/server/lasers';
import { orError } from '$lib/server/http/pages';
import { asEntered } from '$lib/units';

export async function loadLineForm(locals: App.Locals, laserId: string, lineId: string | null) {
	const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
	const { detail, editable } = orError(await lasers.find(scope, laserId));
	if (!editable) error(403, { message: 'Only members of this laser’s lab and laser safety officers can change it.' });
	const laser = { id: detail.laser.id, name: `${detail.laser.maker} ${detail.laser.model}` };
	if (lineId === null) return { laser, form: await superValidate(zod4(lineSchema)) };
	const l = detail.lines.find((x) => x.id === lineId);
	if (!l) error(404, { message: 'No such emission line.' });
	const values = {
		label: l.label,
		mode: l.mode,
		wavelength: asEntered(l.wavelength, 'wavelength'),
		wavelengthMax: asEntered(l.wavelengthMax, 'wavelength'),
		power: asEntered(l.power, 'power'),
		pulseEnergy: asEntered(l.pulseEnergy, 'energy'),
		pulseDuration: asEntered(l.pulseDuration, 'time'),
		repetitionRate: asEntered(l.repetitionRate, 'frequency'),
		beamDiameter: asEntered(l.beamDiameter, 'length'),
		beamDiameterDefinition: l.beamDiameterDefinition,
		divergence: asEntered(l.divergence, 'angle'),
		divergenceDefinition: l.divergenceDefinition,
		beamQuality: l.beamQuality ?? '',
		beamProfile: l.beamProfile,
		hotSpotFactor: l.hotSpotFactor ?? '',
		version: l.version
	};
	return { laser, form: await superValidate(values, zod4(lineSchema)) };
}

export async function saveLineForm(locals: App.Locals, request: Request, laserId: string, lineId: string | null) {
	const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
	const form = await readForm(request, zod4(lineSchema));
	if (!form.valid) return fail(400, { form });
	const result = await lasers.saveLine(scope, laserId, lineId, form.data);
	if (!result.ok) return failForm(form, result);
	redirect(303, `/lasers/${laserId}`);
}
