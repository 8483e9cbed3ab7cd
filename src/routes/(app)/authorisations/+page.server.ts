import { can } from '$lib/abilities';
import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { grantSchema, requestSchema, type GrantForm } from '$lib/schemas/authorisations';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as authorisations from '$lib/server/authorisations';
import { failForm, readForm } from '$lib/server/http/forms';
import { nudge, queues } from '$lib/server/jobs/queues';
import * as procedures from '$lib/server/procedures';
import { todayISO } from '$lib/inspectionState';
import type { Actions, PageServerLoad } from './$types';

const states = ['all', 'requested', 'pending', 'active', 'lapses_soon', 'lapsed', 'refused', 'withdrawn'] as const;

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const today = todayISO();
	const officer = can(user, 'approveProcedures');
	const wantedState = url.searchParams.get('state') ?? 'all';
	const state = (states as readonly string[]).includes(wantedState) ? wantedState : 'all';
	const [rows, mine, options] = await Promise.all([
		!can(user, 'readEveryone') ? Promise.resolve([]) : authorisations.list(scope, today),
		authorisations.list(null, today, { userId: user.id }),
		can(user, 'workWithLasers') ? procedures.targetOptions(scope) : Promise.resolve(null)
	]);
	const wanted = url.searchParams.get('request') ?? '';
	const known = options ? [...options.lasers.map((l) => `laser:${l.id}`), ...options.areas.map((a) => `area:${a.id}`)] : [];
	const grantStart: GrantForm = { userId: '', target: '', trainingTopics: [], procedureIds: [], expiresOn: '', reason: '' };
	return {
		today,
		state,
		rows: rows.map(authorisations.summary).filter((r) => state === 'all' || r.state === state),
		counts: Object.fromEntries(states.map((s) => [s, s === 'all' ? rows.length : rows.filter((r) => r.outcome.state === s).length])),
		mine: mine.map(authorisations.summary),
		targets: options ? { lasers: options.lasers, areas: options.areas } : null,
		requestForm: options ? await superValidate({ target: known.includes(wanted) ? wanted : '', note: '' }, zod4(requestSchema), { id: 'request', errors: false }) : null,
		grant: officer
			? {
					form: await superValidate(grantStart, zod4(grantSchema), { id: 'grant', errors: false }),
					people: await authorisations.candidates(),
					topics: (await authorisations.conditionOptions(null)).topics,
					procedures: await authorisations.procedureChoices()
				}
			: null
	};
};

export const actions: Actions = {
	request: async function requestAuthorisation({ locals, request }) {
		const scope = await scopeOf(requireAbility(locals, 'workWithLasers'));
		const form = await readForm(request, zod4(requestSchema), { id: 'request' });
		if (!form.valid) return fail(400, { requestForm: form });
		const r = await authorisations.request(scope, form.data);
		if (!r.ok) return failForm(form, r);
		await nudge(queues.mailDeliver);
		redirect(303, `/authorisations/${r.id}?requested=1`);
	},
	grant: async function grantAuthorisation({ locals, request }) {
		const scope = await scopeOf(requireAbility(locals, 'approveProcedures'));
		const form = await readForm(request, zod4(grantSchema), { id: 'grant' });
		if (!form.valid) return fail(400, { grantForm: form });
		const r = await authorisations.grant(scope, form.data, todayISO());
		if (!r.ok) return failForm(form, r);
		redirect(303, `/authorisations/${r.id}?granted=1`);
	}
};
