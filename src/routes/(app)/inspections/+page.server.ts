import { can } from '$lib/abilities';
import { assignSchema } from '$lib/schemas/inspections';
import { invalidInput } from '$lib/server/http/failure';
import { failForm, formObject } from '$lib/server/http/forms';
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
		if (!parsed.success) return failForm({ action: 'assign' }, invalidInput(parsed.error));
		const r = await inspections.assign(scope, parsed.data.inspectionId, parsed.data.inspectorId, parsed.data.version);
		if (!r.ok) return failForm({ action: 'assign', about: parsed.data.inspectionId }, r);
		return { assigned: parsed.data.inspectionId, confirmation: `${r.inspectorName} is now the inspector of ${r.areaName}.` };
	}
};
