import { can } from '$lib/abilities';
import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { decisionSchema, replySchema, type DecisionForm } from '$lib/schemas/reviews';
import { requireAbility, requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as assessments from '$lib/server/assessments';
import * as limits from '$lib/server/limits';
import { failForm, readForm } from '$lib/server/http/forms';
import { isCurrentResult } from '$lib/assessmentResult';
import { orError } from '$lib/server/http/pages';
import { formValues } from '$lib/server/pathForms';
import * as paths from '$lib/server/paths';
import { exposureProfile } from '$lib/server/alongPath';
import * as reviews from '$lib/server/reviews';
import { diffInputs, diffResults, normaliseInputs } from '$lib/server/snapshotDiff';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireUser(locals);
	const scope = await scopeOf(user);
	const { detail, editable } = orError(await paths.find(scope, params.pathId));
	const latest = detail.latest;
	if (!latest) error(404, { message: 'This beam path has no saved assessment yet.' });
	const result = isCurrentResult(latest.result) ? latest.result : null;
	// A snapshot of an older engine is shown as it was saved (its engine version named), without a plot.
	const legacy = !result && latest.result && typeof latest.result === 'object' && 'engineVersion' in latest.result ? (latest.result as Record<string, unknown>) : null;
	const inputs = normaliseInputs(latest.inputs);
	const profile = result ? exposureProfile(inputs.path, inputs.limits, result) : null;

	const used = result?.limitsUsed ?? [];
	const limitRows = await limits.versions(used);

	let changes: ReturnType<typeof diffInputs> | null = null;
	const clearedId = detail.path.clearedAssessmentId;
	if (clearedId && clearedId !== latest.id) {
		const cleared = await assessments.snapshot(clearedId);
		if (cleared) changes = [...diffInputs(cleared.inputs, latest.inputs), ...diffResults(cleared.result, latest.result)];
	}
	const review = await reviews.record(detail.path, editable);
	const history = review.history;
	const self = can(user, 'decideReviews') ? reviews.selfReviewReason(detail.path, user.id, latest.createdBy) : null;
	const start: DecisionForm = {
		assessmentId: latest.id,
		afterDecisionId: history[0]?.id ?? '',
		decision: 'cleared',
		comments: '',
		reviewBy: '',
		controls: reviews.eyewearControls(result)
	};
	return {
		path: detail.path,
		laser: { id: detail.laser.id, name: `${detail.laser.maker} ${detail.laser.model}`, laserClass: detail.laser.laserClass },
		lab: detail.lab,
		form: formValues(detail),
		snapshot: { id: latest.id, createdAt: latest.createdAt, cause: latest.cause, engineVersion: latest.engineVersion, stale: latest.stale, staleReason: latest.staleReason, result, legacy, errors: result || legacy ? null : ((latest.result as { errors?: unknown[] }).errors ?? []) },
		profile,
		limits: limitRows.map((l) => ({ id: l.limitId, version: l.version, label: l.label, citation: l.citation, demonstration: l.demonstration, tissue: l.tissue })),
		changes,
		review,
		decide: can(user, 'decideReviews') ? { allowed: !self && !detail.path.stale && !detail.path.draft, reason: self ?? (detail.path.stale ? 'The assessment is being re-evaluated; decide once the new result is in.' : detail.path.draft ? reviews.draftReason : null) } : null,
		decisionForm: await superValidate(start, zod4(decisionSchema), { errors: false, id: 'decision' }),
		replyForm: await superValidate(zod4(replySchema), { id: 'reply' })
	};
};

export const actions: Actions = {
	decide: async function decideReview({ locals, request, params }) {
		const officer = await scopeOf(requireAbility(locals, 'decideReviews'));
		const form = await readForm(request, zod4(decisionSchema));
		if (!form.valid) return fail(400, { decisionForm: form });
		const result = await reviews.decide(officer, params.pathId, form.data);
		if (!result.ok) return failForm(form, result);
		redirect(303, `/reviews/${params.pathId}?decided=${form.data.decision}`);
	},
	reply: async function replyToReview({ locals, request, params }) {
		const scope = await scopeOf(requireAbility(locals, 'changeRegister'));
		const form = await readForm(request, zod4(replySchema));
		if (!form.valid) return fail(400, { replyForm: form });
		const result = await reviews.reply(scope, params.pathId, form.data.body);
		if (!result.ok) return failForm(form, result);
		redirect(303, `/reviews/${params.pathId}?replied=1`);
	}
};
