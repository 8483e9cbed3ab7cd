import { error, redirect } from '@sveltejs/kit';
import { fail } from 'sveltekit-superforms';
import { z } from 'zod';
import { requireAbility } from '$lib/server/auth/guard';
import { formObject } from '$lib/server/forms';
import * as limitSets from '$lib/server/limitSets';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	requireAbility(locals, 'manageLimits');
	const found = await limitSets.find(params.importId);
	if (!found) error(404, { message: 'No such import.' });
	return {
		draft: { id: found.id, state: found.state, fileName: found.fileName, createdAt: found.createdAt.toISOString(), decidedAt: found.decidedAt?.toISOString() ?? null, outcome: found.outcome },
		plan: found.plan
	};
};

/** The stamp of the comparison the officer saw (limitSets.plan): publishing checks it, both actions require it. */
const decisionSchema = z.object({ stamp: z.string().regex(/^[0-9a-f]{32}$/) });

export const actions: Actions = {
	publish: async function publishImport({ locals, params, request }) {
		const officer = requireAbility(locals, 'manageLimits');
		const parsed = decisionSchema.safeParse(await formObject(request));
		if (!parsed.success) return fail(400, { decisionError: 'Reload the page and try again.' });
		const result = await limitSets.publish(officer.id, params.importId, parsed.data.stamp);
		if (!result.ok) return fail(result.status, { decisionError: result.message });
		redirect(303, `/limits/import/${params.importId}?published=1`);
	},
	discard: async function discardImport({ locals, params, request }) {
		const officer = requireAbility(locals, 'manageLimits');
		if (!decisionSchema.safeParse(await formObject(request)).success) return fail(400, { decisionError: 'Reload the page and try again.' });
		const result = await limitSets.discard(officer.id, params.importId);
		if (!result.ok) return fail(result.status, { decisionError: result.message });
		redirect(303, '/limits/import?discarded=1');
	}
};
