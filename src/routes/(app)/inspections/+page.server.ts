import { can } from '$lib/abilities';
import { fail } from 'sveltekit-superforms';
import { assignSchema } from '$lib/schemas/inspections';
import { formObject } from '$lib/server/forms';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as inspections from '$lib/server/inspections';
import { todayISO } from '$lib/inspectionState';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const today = todayISO();
	const [rows, chart, findings, officers] = await Promise.all([inspections.schedule(scope, today), inspections.chart(scope, today), inspections.openFindings(scope), inspections.officers()]);
	return { today, rows, chart, findings, officers, canAssign: can(user, 'assignInspectors'), canRecord: can(user, 'recordInspections') };
};

export const actions: Actions = {
	assign: async function assignInspector({ locals, request }) {
		const scope = await scopeOf(requireAbility(locals, 'assignInspectors'));
		const parsed = assignSchema.safeParse(await formObject(request));
		if (!parsed.success) return fail(400, { assignError: parsed.error.issues[0].message });
		const r = await inspections.assign(scope, parsed.data.inspectionId, parsed.data.inspectorId, parsed.data.version);
		if (!r.ok) return fail(r.status, { assignError: r.fields ? Object.values(r.fields)[0][0] : r.message, inspectionId: parsed.data.inspectionId });
		return { assigned: parsed.data.inspectionId, confirmation: `${r.inspectorName} is now the inspector of ${r.areaName}.` };
	}
};
