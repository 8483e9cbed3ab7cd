// What both editor pages (a new path, a saved one) hand the path editor. Written out here, shared
// with the browser; the load functions in $lib/server/pathForms.ts are checked against it.
import type { ComponentProps } from 'svelte';
import type { SuperValidated } from 'sveltekit-superforms';
import type { z } from 'zod';
import type { AssessmentResult, Verdict } from '$lib/assessmentResult';
import type { LineColumns } from '$lib/schemas/assessment';
import type { PathForm } from '$lib/schemas/register';
import type { replySchema } from '$lib/schemas/reviews';
import type ReviewRecord from '$lib/components/review/ReviewRecord.svelte';

export type EditorHistoryRow = { id: string; createdAt: Date; verdict: Verdict | null; cause: string; worstRatio: string | null; stale: boolean };

type Common = {
	laser: { id: string; name: string; labCode: string };
	lines: LineColumns[];
	form: SuperValidated<PathForm>;
	editable: boolean;
	latest: { createdAt: Date; result: AssessmentResult | { errors: unknown[] }; cause: string } | null;
	history: EditorHistoryRow[];
};

/** A new path, or a saved one with its state and review record. */
export type EditorData =
	| (Common & { pathId: null })
	| (Common & {
			pathId: string;
			path: { stale: boolean; flagged: boolean; verdict: Verdict | null; staleReason: string | null };
			review: ComponentProps<typeof ReviewRecord>['record'];
			replyForm: SuperValidated<z.infer<typeof replySchema>>;
		});
