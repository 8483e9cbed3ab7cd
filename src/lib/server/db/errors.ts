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
