import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { requireAbility } from '$lib/server/auth/guard';
import { reloadAndRetry } from '$lib/server/http/failure';
import { failForm, formObject } from '$lib/server/http/forms';
import { orError } from '$lib/server/http/pages';
import * as limitSets from '$lib/server/limitSets';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	requireAbility(locals, 'manageLimits');
	const { limitImport: found } = orError(await limitSets.find(params.importId));
	return {
		draft: { id: found.id, state: found.state, fileName: found.fileName, createdAt: found.createdAt, decidedAt: found.decidedAt, outcome: found.outcome },
		plan: found.plan
	};
};

/** The stamp of the comparison the officer saw (limitSets.plan): publishing checks it, both actions require it. */
const decisionSchema = z.object({ stamp: z.string().regex(/^[0-9a-f]{32}$/) });
/** Publish and discard answer in one place on the page. */
const decided = { action: 'decide' };

export const actions: Actions = {
	publish: async function publishImport({ locals, params, request }) {
		const officer = requireAbility(locals, 'manageLimits');
		const parsed = decisionSchema.safeParse(await formObject(request));
		if (!parsed.success) return failForm(decided, reloadAndRetry());
		const result = await limitSets.publish(officer.id, params.importId, parsed.data.stamp);
		if (!result.ok) return failForm(decided, result);
		redirect(303, `/limits/import/${params.importId}?published=1`);
	},
	discard: async function discardImport({ locals, params, request }) {
		const officer = requireAbility(locals, 'manageLimits');
		if (!decisionSchema.safeParse(await formObject(request)).success) return failForm(decided, reloadAndRetry());
		const result = await limitSets.discard(officer.id, params.importId);
		if (!result.ok) return failForm(decided, result);
		redirect(303, '/limits/import?discarded=1');
	}
};
