// The hazard engine's own rules for one limit, in the form's field names: the limit form and each
// row of an imported limit set are refused on the same grounds, so no limit the engine cannot use is stored.
import { limitToSI, type LimitForm } from '$lib/schemas/limits';
import { limitProblems } from '$lib/server/hazard';

export type FieldProblem = { field: string; reason: string };

export function engineProblems(form: Omit<LimitForm, 'version'>): FieldProblem[] {
	return limitProblems({ id: 'limit', version: '1', ...limitToSI(form) }).map((p) => ({ field: p.field || 'label', reason: p.reason }));
}
