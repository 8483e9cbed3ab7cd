import { json } from '@sveltejs/kit';
import type { AssessmentResult } from '$lib/assessmentResult';
import { previewSchema, type LimitSI } from '$lib/schemas/assessment';
import { apiError, endpoint, readJson } from '$lib/server/http/api';
import { requireUser } from '$lib/server/auth/guard';
import { errorsByField, evaluatePath } from '$lib/server/assessments';
import { currentLimits } from '$lib/server/limits';
import { evaluate } from '$lib/server/hazard';
import { elementPowers, exposureProfile } from '$lib/server/alongPath';
import type { PreviewResponse } from '$lib/assessmentResult';

/** Assess without saving: the editor calls this while the researcher types. */
export const POST = endpoint(async ({ locals, request }) => {
	requireUser(locals);
	const body = await readJson(request, previewSchema);
	if (!body.ok) return body.response;
	const { path, breakdown } = body.data;
	let limits: LimitSI[];
	let outcome;
	if (body.data.limits === undefined) {
		const evaluated = evaluatePath(path, await currentLimits(), { breakdown });
		limits = evaluated.inputs.limits;
		outcome = evaluated.outcome;
	} else {
		limits = body.data.limits;
		outcome = evaluate(path, limits, { breakdown });
	}
	if (!outcome.ok) return apiError(400, 'The assessment cannot be computed from these values.', errorsByField(outcome.errors));
	const profile = exposureProfile(path, limits, outcome.result);
	return json({ result: outcome.result, profile, powers: elementPowers(path, limits), limitsSource: body.data.limits === undefined ? 'library' : 'request' } satisfies PreviewResponse);
});
