import { error } from '@sveltejs/kit';
import type { Failure } from './failure';

/** In a load: turn a data module's refusal into the error page (403 says what is missing, 404 says what). */
export function orError<T extends { ok: true }>(found: T | Failure): T {
	if (!found.ok) error(found.status, { message: found.message });
	return found;
}
