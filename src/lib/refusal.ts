/**
 * How a refused form action without a superform (a button, an upload, one row's small form) comes
 * back to its page: `failForm({ action, about }, failure)` on the server, `refusalOf(form, action)`
 * or <RefusalNote> on the page. `about` names the row when a page repeats the same form (a finding,
 * an inspection in a list).
 */
export type Refusal = { action: string; about: string | null; message: string; fields: Record<string, string> };

export function refusalOf(form: unknown, action: string, about: string | null = null): Refusal | null {
	if (!form || typeof form !== 'object' || !('refused' in form)) return null;
	const r = (form as { refused: Refusal }).refused;
	return r && r.action === action && (about === null || r.about === about) ? r : null;
}

/** What to say of a refusal in one line: what is wrong with the field it names (a form of one field or two), else its sentence. */
export function refusalText(r: Refusal): string {
	return Object.values(r.fields).join(' ') || r.message;
}
