import type { SessionValidationResult } from '$lib/server/auth/session';

declare global {
	namespace App {
		interface Error {
			message: string;
			/** Roles that would have been allowed (403 pages say what is missing). */
			missing?: string[];
			/** Per-field messages for a 400. */
			fields?: Record<string, string[]>;
		}
		interface Locals {
			user: SessionValidationResult['user'];
			session: SessionValidationResult['session'];
			/** Set by handleError when the database could not be reached: the answer becomes a 503. */
			databaseUnavailable?: boolean;
			/** Set by handleError when the database refused a value: the answer becomes this 4xx. */
			refusedStatus?: 400 | 409;
		}
	}
}

export {};
