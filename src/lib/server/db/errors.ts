// Errors that mean "the database cannot be reached right now" (answer 503), not "a bug" (500).
const unavailableCodes = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'ETIMEDOUT',
	'EPIPE',
	'CONNECTION_CLOSED',
	'CONNECTION_ENDED',
	'CONNECTION_DESTROYED',
	'CONNECT_TIMEOUT',
	'57P01', // admin_shutdown
	'57P02', // crash_shutdown
	'57P03' // cannot_connect_now
]);

/** What users are told while the database cannot be reached (with a 503). */
export const DATABASE_UNAVAILABLE = 'The register is unavailable for a moment; try again shortly.';

export function isDatabaseUnavailable(e: unknown): boolean {
	for (let cur: unknown = e, depth = 0; cur && depth < 5; depth++) {
		const code = (cur as { code?: unknown }).code;
		if (typeof code === 'string' && unavailableCodes.has(code)) return true;
		cur = (cur as { cause?: unknown }).cause;
	}
	return false;
}

/**
 * A database refusal of a value that validation let through (a safety net: the schemas and data
 * modules should catch these first). The transaction has rolled back, so nothing was saved; the
 * person gets a 4xx, never a 500.
 */
const refusedValueCodes = new Set([
	'22001', // string_data_right_truncation
	'22003', // numeric_value_out_of_range
	'22007', // invalid_datetime_format
	'22008', // datetime_field_overflow
	'22021', // character_not_in_repertoire (e.g. a NUL byte in text)
	'22P02', // invalid_text_representation
	'22P05', // untranslatable_character
	'23503', // foreign_key_violation (a reference to something that does not exist)
	'23514' // check_violation
]);

export function refusedInput(e: unknown): { status: 400 | 409; message: string } | null {
	for (let cur: unknown = e, depth = 0; cur && depth < 5; depth++) {
		const code = (cur as { code?: unknown }).code;
		if (code === '23505') return { status: 409, message: 'That record already exists or was just created by someone else. Reload and try again.' };
		if (typeof code === 'string' && refusedValueCodes.has(code))
			return { status: 400, message: 'A value was not accepted (it is out of range, refers to something that does not exist, or holds characters that cannot be stored). Nothing was saved.' };
		cur = (cur as { cause?: unknown }).cause;
	}
	return null;
}
