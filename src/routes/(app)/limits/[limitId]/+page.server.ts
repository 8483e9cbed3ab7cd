import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { limitFormSchema, type LimitForm } from '$lib/schemas/limits';
import { requireRole, requireUser } from '$lib/server/auth/guard';
import { failForm } from '$lib/server/forms';
import * as limits from '$lib/server/limits';
import * as paths from '$lib/server/paths';
import { formatQuantity } from '$lib/units';
import type { Actions, PageServerLoad } from './$types';

const text = (v: string, kind: Parameters<typeof formatQuantity>[1]) => formatQuantity(v, kind, { significantDigits: 12 });
const day = (d: Date | null) => (d ? d.toISOString().slice(0, 10) : '');

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	const found = await limits.find(params.limitId);
	if (!found) error(404, { message: 'No such limit.' });
	const c = found.current;
	const values: LimitForm = {
		label: c.label,
		tissue: c.tissue,
		wavelengthMin: text(c.wavelengthMin, 'wavelength'),
		wavelengthMax: text(c.wavelengthMax, 'wavelength'),
		durationMin: text(c.durationMin, 'time'),
		durationMax: text(c.durationMax, 'time'),
		quantity: c.quantity,
		k: text(c.k, c.quantity === 'irradiance' ? 'irradiance' : 'radiant_exposure'),
		n: String(Number(c.n)),
		limitingAperture: formatQuantity(c.limitingAperture, 'length', { unit: 'mm', significantDigits: 12 }),
		pulseBasis: c.pulseBasis,
		pulseTrainExponent: c.pulseTrainExponent === null ? '' : String(Number(c.pulseTrainExponent)),
		noTrainCorrection: c.noTrainCorrection,
		citation: c.citation,
		demonstration: c.demonstration,
		validFrom: day(c.validFrom),
		validUntil: day(c.validUntil),
		version: found.currentVersion
	};
	return {
		limit: { id: found.id, retired: found.retired, currentVersion: found.currentVersion, label: c.label },
		versions: found.versions.map((v) => ({ ...v, createdAt: v.createdAt.toISOString() })),
		stale: await paths.countStale(),
		form: await superValidate(values, zod4(limitFormSchema), { errors: false }),
		canManage: user.role === 'officer'
	};
};

export const actions: Actions = {
	revise: async function reviseLimit({ locals, request, params }) {
		const officer = requireRole(locals, 'officer');
		const form = await superValidate(request, zod4(limitFormSchema));
		if (!form.valid) return fail(400, { form });
		const result = await limits.revise(officer.id, params.limitId, form.data);
		if (!result.ok) return failForm(form, result);
		redirect(303, `/limits/${params.limitId}?revised=${result.version}&stale=${result.staleMarked}`);
	},
	retire: async function retireLimit({ locals, request, params }) {
		const officer = requireRole(locals, 'officer');
		const parsed = z.object({ version: z.coerce.number().int().positive() }).safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { retireError: 'Reload the page and try again.' });
		const result = await limits.retire(officer.id, params.limitId, parsed.data.version);
		if (!result.ok) return fail(result.status, { retireError: result.message });
		redirect(303, `/limits/${params.limitId}?withdrawn=1&stale=${result.staleMarked}`);
	}
};
