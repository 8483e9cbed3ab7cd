import type { z } from 'zod';

/** What a data module returns when it refuses: a 4xx status, a sentence, and messages per field. */
export type Failure = { ok: false; status: 400 | 403 | 404 | 409 | 413 | 429; message: string; fields?: Record<string, string[]> };

export function failure(status: Failure['status'], message: string, fields?: Record<string, string | string[]>): Failure {
	const f: Failure = { ok: false, status, message };
	if (fields) f.fields = Object.fromEntries(Object.entries(fields).map(([k, v]) => [k, Array.isArray(v) ? v : [v]]));
	return f;
}

export const fieldsNeedAttention = (fields: Record<string, string | string[]>) => failure(400, 'Some fields need attention.', fields);
export const notFound = (what: string) => failure(404, `No such ${what}.`);
/** A record of a lab the person may not see answers exactly like an unknown id: its existence never leaks. */
export const notYours = notFound;
/** A record the person may see but not change (their role, or a lab they may read but not edit). */
export const cannotChange = (what: string) => failure(403, `You can see this ${what} but not change it: it belongs to a lab you are not a member of, or your role cannot change it.`);
export const changedMeanwhile = (what: string) =>
	failure(409, `Someone else changed this ${what} while you were editing. Nothing was saved; reload to see their change, then apply yours again.`);
/** A small form whose hidden fields (an id, a version) did not come back as the page sent them. */
export const reloadAndRetry = () => failure(400, 'Reload the page and try again.');
/** A multipart post that could not be read at all (cut off, malformed). */
export const unreadableUpload = () => failure(400, 'The upload could not be read; choose the file and send it again.');

/** zod issues as messages per dotted field path. */
export function fieldMessages(error: z.ZodError): Record<string, string[]> {
	const fields: Record<string, string[]> = {};
	for (const issue of error.issues) {
		const key = issue.path.join('.') || '(body)';
		(fields[key] ??= []).push(issue.message);
	}
	return fields;
}

/** A form or body zod refused, as a failure naming each field. */
export const invalidInput = (error: z.ZodError) => fieldsNeedAttention(fieldMessages(error));
