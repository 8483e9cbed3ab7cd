import { fail } from '@sveltejs/kit';
import { setError, message, type SuperValidated } from 'sveltekit-superforms';
import type { Failure } from './failure';

/** Turn a data module's failure into the form's per-field errors, with its 4xx status. */
export function failForm<T extends Record<string, unknown>>(form: SuperValidated<T>, failure: Failure) {
	for (const [field, messages] of Object.entries(failure.fields ?? {}))
		for (const m of messages) setError(form, field as never, m, { status: failure.status });
	return failure.fields ? fail(failure.status, { form }) : message(form, failure.message, { status: failure.status });
}
