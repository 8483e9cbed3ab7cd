import { can } from '$lib/abilities';
import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { limitFormSchema, limitFormValues } from '$lib/schemas/limits';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { reloadAndRetry } from '$lib/server/http/failure';
import { failForm, formObject, readForm } from '$lib/server/http/forms';
import { orError } from '$lib/server/http/pages';
import * as limits from '$lib/server/limits';
import * as paths from '$lib/server/paths';
import type { Actions, PageServerLoad } from './$types';


export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	const { limit: found } = orError(await limits.find(params.limitId));
	const c = found.current;
	const values = limitFormValues(c, found.currentVersion);
	return {
		limit: { id: found.id, retired: found.retired, currentVersion: found.currentVersion, label: c.label },
		versions: found.versions,
		stale: await paths.countStale(),
		form: await superValidate(values, zod4(limitFormSchema), { errors: false }),
		canManage: can(user, 'manageLimits')
	};
};

export const actions: Actions = {
	revise: async function reviseLimit({ locals, request, params }) {
		const officer = requireAbility(locals, 'manageLimits');
		const form = await readForm(request, zod4(limitFormSchema));
		if (!form.valid) return fail(400, { form });
		const result = await limits.revise(officer.id, params.limitId, form.data);
		if (!result.ok) return failForm(form, result);
		redirect(303, `/limits/${params.limitId}?revised=${result.version}&stale=${result.staleMarked}`);
	},
	retire: async function retireLimit({ locals, request, params }) {
		const officer = requireAbility(locals, 'manageLimits');
		const parsed = z.object({ version: z.coerce.number().int().positive() }).safeParse(await formObject(request));
		if (!parsed.success) return failForm({ action: 'retire' }, reloadAndRetry());
		const result = await limits.retire(officer.id, params.limitId, parsed.data.version);
		if (!result.ok) return failForm({ action: 'retire' }, result);
		redirect(303, `/limits/${params.limitId}?withdrawn=1&stale=${result.staleMarked}`);
	}
};
