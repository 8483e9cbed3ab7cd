import { fail, message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { visitSchema, type VisitForm } from '$lib/schemas/authorisations';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as areas from '$lib/server/areas';
import * as authorisations from '$lib/server/authorisations';
import { failForm, readForm } from '$lib/server/http/forms';
import { orError } from '$lib/server/http/pages';
import * as procedures from '$lib/server/procedures';
import { todayISO } from '$lib/inspectionState';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const today = todayISO();
	const found = orError(await areas.find(scope, params.areaId));
	const [people, procs, visits] = await Promise.all([
		authorisations.list(scope, today, { areaId: found.area.id, decisions: ['granted', 'requested'] }),
		procedures.list(scope, today, { areaId: found.area.id, includeAreaLasers: true }),
		areas.visits(found.area.id, today)
	]);
	const start: VisitForm = { visitorName: '', organisation: '', kind: 'visitor', startsOn: today, endsOn: '', escortName: '', briefing: '' };
	return {
		today,
		area: { id: found.area.id, name: found.area.name, room: found.area.room, building: found.area.building, interlockNotes: found.area.interlockNotes, signageNotes: found.area.signageNotes },
		labCode: found.labCode,
		labName: found.labName,
		responsibleName: found.responsibleName,
		lasers: found.lasers,
		people: people.map(authorisations.summary),
		procedures: procs,
		visits,
		visitForm: found.editable ? await superValidate(start, zod4(visitSchema), { id: 'visit', errors: false }) : null
	};
};

export const actions: Actions = {
	visit: async function recordVisit({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'workWithLasers'));
		const form = await readForm(request, zod4(visitSchema), { id: 'visit' });
		if (!form.valid) return fail(400, { visitForm: form });
		const r = await areas.recordVisit(scope, params.areaId, form.data);
		if (!r.ok) return failForm(form, r);
		return message(form, `Visit of ${form.data.visitorName} recorded.`);
	}
};
