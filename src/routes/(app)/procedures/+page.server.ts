import { can } from '$lib/abilities';
import { fail, message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { intervalSchema } from '$lib/schemas/procedures';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as authorisations from '$lib/server/authorisations';
import { failForm, readForm } from '$lib/server/http/forms';
import * as procedures from '$lib/server/procedures';
import { signoffState } from '$lib/authorisationState';
import { todayISO } from '$lib/inspectionState';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const today = todayISO();
	const [rows, interval, mine] = await Promise.all([procedures.list(scope, today), procedures.signoffInterval(), authorisations.list(null, today, { userId: user.id, decisions: ['granted'] })]);
	// What this person must sign: the procedures their authorisations name, unsigned or lapsing.
	const toSign = new Map<string, { procedureId: string; title: string; number: number; state: string; validUntil: string | null }>();
	for (const a of mine)
		for (const p of a.procedures) {
			const s = signoffState(p, interval.months, today);
			if (p.current && s.state !== 'signed') toSign.set(p.procedureId, { procedureId: p.procedureId, title: p.title, number: p.current.number, state: s.state, validUntil: s.validUntil });
		}
	return {
		rows,
		toSign: [...toSign.values()],
		intervalMonths: interval.months,
		canCreate: scope.editLabIds !== 'none',
		intervalForm: can(user, 'approveProcedures') ? await superValidate({ months: interval.months, version: interval.version }, zod4(intervalSchema), { id: 'interval', errors: false }) : null
	};
};

export const actions: Actions = {
	interval: async function setInterval({ locals, request }) {
		const scope = await scopeOf(requireAbility(locals, 'approveProcedures'));
		const form = await readForm(request, zod4(intervalSchema), { id: 'interval' });
		if (!form.valid) return fail(400, { intervalForm: form });
		const r = await procedures.setSignoffInterval(scope, form.data.months, form.data.version);
		if (!r.ok) return failForm(form, r);
		return message(form, `Saved: a sign-off now lapses after ${form.data.months} months.`);
	}
};
