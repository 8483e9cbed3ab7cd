import { can } from '$lib/abilities';
import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { decideSchema, withdrawSchema, type DecideForm } from '$lib/schemas/authorisations';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as authorisations from '$lib/server/authorisations';
import { failForm, readForm } from '$lib/server/http/forms';
import { orError } from '$lib/server/http/pages';
import { todayISO } from '$lib/inspectionState';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const today = todayISO();
	const { authorisation: a, lapses } = orError(await authorisations.find(scope, params.authorisationId, today));
	const officer = can(user, 'approveProcedures');
	const deciding = officer && a.decision === 'requested' && a.userId !== user.id;
	const options = deciding ? await authorisations.conditionOptions({ laserId: a.laserId, areaId: a.areaId }) : null;
	// The officer starts from the usual conditions: every approved procedure of the laser or area.
	const start: DecideForm = { decision: 'granted', trainingTopics: [], procedureIds: options ? options.procedures.filter((p) => p.approved).map((p) => p.id) : [], expiresOn: '', reason: '', version: a.version };
	return {
		today,
		authorisation: {
			...authorisations.summary(a),
			labName: a.labName,
			requestNote: a.requestNote,
			requestedAt: a.requestedAt,
			decidedByName: a.decidedByName,
			decidedAt: a.decidedAt,
			decisionReason: a.decisionReason,
			expiresOn: a.expiresOn,
			conditions: a.outcome.conditions.map((c) => ({ key: c.key, kind: c.kind, label: c.label, holds: c.holds, detail: c.detail })),
			laserAreaId: a.laserAreaId
		},
		lapses: lapses.map((l) => ({ id: l.id, since: l.since, reason: l.reason, noticedAt: l.noticedAt })),
		decide: deciding && options ? { form: await superValidate(start, zod4(decideSchema), { id: 'decide', errors: false }), options } : null,
		withdrawForm: officer && (a.decision === 'granted' || a.decision === 'requested') ? await superValidate({ reason: '', version: a.version }, zod4(withdrawSchema), { id: 'withdraw', errors: false }) : null,
		ownRequest: officer && a.decision === 'requested' && a.userId === user.id
	};
};

export const actions: Actions = {
	decide: async function decideAuthorisation({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'approveProcedures'));
		const form = await readForm(request, zod4(decideSchema), { id: 'decide' });
		if (!form.valid) return fail(400, { decideForm: form });
		const r = await authorisations.decide(scope, params.authorisationId, form.data, todayISO());
		if (!r.ok) return failForm(form, r);
		redirect(303, `/authorisations/${params.authorisationId}?decided=${form.data.decision}`);
	},
	withdraw: async function withdrawAuthorisation({ locals, params, request }) {
		const scope = await scopeOf(requireAbility(locals, 'approveProcedures'));
		const form = await readForm(request, zod4(withdrawSchema), { id: 'withdraw' });
		if (!form.valid) return fail(400, { withdrawForm: form });
		const r = await authorisations.withdraw(scope, params.authorisationId, form.data.reason, form.data.version);
		if (!r.ok) return failForm(form, r);
		redirect(303, `/authorisations/${params.authorisationId}?withdrawn=1`);
	}
};
