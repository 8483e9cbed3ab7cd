import { json } from '@sveltejs/kit';
import { assessmentPreviewSchema, toAssessmentInput } from '$lib/schemas/assessment';
import { apiError, endpoint, readJson } from '$lib/server/api';
import { requireUser } from '$lib/server/auth/guard';
import { currentLimits, limitInput } from '$lib/server/assessments';
import { assess, type AssessmentResult } from '$lib/server/hazard';
import { exposureProfile, type Profile } from '$lib/server/profile';

export type PreviewResponse = {
	result: AssessmentResult;
	profile: Profile | null;
	/** Where the limits came from: the library in force now, or the request body. */
	limitsSource: 'library' | 'request';
};

/** Assess without saving: the editor calls this while the researcher types. */
export const POST = endpoint(async ({ locals, request }) => {
	requireUser(locals);
	const body = await readJson(request, assessmentPreviewSchema);
	if (!body.ok) return body.response;
	const input = toAssessmentInput(body.data);
	const fromLibrary = body.data.limits === undefined;
	if (fromLibrary) input.limits = (await currentLimits()).map(limitInput);
	const outcome = assess(input);
	if (!outcome.ok) {
		const fields: Record<string, string[]> = {};
		for (const e of outcome.errors) (fields[e.field || '(body)'] ??= []).push(e.reason);
		return apiError(400, 'The assessment cannot be computed from these values.', fields);
	}
	const t = input.nohd?.exposureDuration ?? input.points.find((p) => p.tissue === 'eye')?.exposureDuration ?? null;
	const profile = exposureProfile(input, Number(outcome.result.pathLength), t === null || t === undefined ? null : String(t));
	return json({ result: outcome.result, profile, limitsSource: fromLibrary ? 'library' : 'request' } satisfies PreviewResponse);
});
