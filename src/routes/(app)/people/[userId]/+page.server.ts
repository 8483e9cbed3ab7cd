import { can } from '$lib/abilities';
import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as authorisations from '$lib/server/authorisations';
import * as procedures from '$lib/server/procedures';
import * as training from '$lib/server/training';
import { orError } from '$lib/server/http/pages';
import * as users from '$lib/server/users';
import { signoffState } from '$lib/authorisationState';
import { todayISO } from '$lib/inspectionState';
import type { PageServerLoad } from './$types';

/** A person's training, sign-offs and authorisations: their own, or anyone's for officers and managers. */
export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	// A researcher sees only themselves; another person's page answers as if it did not exist.
	if (!can(user, 'readEveryone') && params.userId !== user.id) error(404, { message: 'No such person.' });
	const { person } = orError(await users.find(params.userId));
	const today = todayISO();
	const scope = await scopeOf(user);
	const [records, rows, interval] = await Promise.all([training.list(today, person.id), authorisations.list(scope, today, { userId: person.id }), procedures.signoffInterval()]);
	const signoffs = new Map<string, { procedureId: string; title: string; number: number | null; state: string; signedOn: string | null; validUntil: string | null }>();
	for (const r of rows.filter((x) => x.decision === 'granted'))
		for (const p of r.procedures) {
			const s = signoffState(p, interval.months, today);
			signoffs.set(p.procedureId, { procedureId: p.procedureId, title: p.title, number: p.current?.number ?? null, state: s.state, signedOn: p.signedCurrentOn, validUntil: s.validUntil });
		}
	return {
		person: { id: person.id, name: person.name, role: person.role, disabled: person.disabled },
		training: records.map((r) => ({ id: r.id, topic: r.topic, completedOn: r.completedOn, expiresOn: r.expiresOn, state: r.state })),
		authorisations: rows.map(authorisations.summary),
		signoffs: [...signoffs.values()]
	};
};
