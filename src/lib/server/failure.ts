/** What a data module returns when it refuses: a 4xx status, a sentence, and messages per field. */
export type Failure = { ok: false; status: 400 | 403 | 404 | 409 | 413; message: string; fields?: Record<string, string[]> };

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
