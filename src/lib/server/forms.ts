import { setError, message, type SuperValidated } from 'sveltekit-superforms';
import type { Failure } from './failure';

/** Turn a data module's failure into the form's per-field errors, with its 4xx status. */
export function failForm<T extends Record<string, unknown>>(form: SuperValidated<T>, failure: Failure) {
	for (const [field, messages] of Object.entries(failure.fields ?? {})) {
		// 'elements.2.length' (ours) → 'elements[2].length' (superforms' path syntax)
		// A message about a whole list goes to its '_errors' (superforms would otherwise replace the list's item errors).
		const whole = !field.includes('.') && Array.isArray((form.data as Record<string, unknown>)[field]);
		const path = whole ? `${field}._errors` : field.replace(/\.(\d+)(?=\.|$)/g, '[$1]');
		for (const m of messages) setError(form, path as never, m, { status: failure.status });
	}
	return message(form, failure.message, { status: failure.status });
}
