// Reading form posts and turning refusals into form errors. Every form action reads its body through
// readForm (superforms) or formFields (plain fields): whatever the body, the action gets a value it
// can answer with a 4xx, never an exception that becomes a 500.
import { error, type ActionFailure } from '@sveltejs/kit';
import { defaultValues, fail, setError, message, superValidate, type JSONSchema, type SuperValidated } from 'sveltekit-superforms';
import type { ValidationAdapter } from 'sveltekit-superforms/adapters';
import { isTooLarge, tooLargeMessage } from './bodyLimit';
import type { Refusal } from '$lib/refusal';
import type { Failure } from './failure';

type Options<T extends Record<string, unknown>> = Parameters<typeof superValidate<T>>[2];

const NEEDS_ATTENTION = 'Some fields need attention.';
const UNREADABLE = 'The form could not be read (its fields are not in the shape this page sends). Nothing was saved; reload the page and try again.';

/**
 * superValidate of a form action's body that answers any body. superforms throws on some malformed
 * posts (a nested field sent as a plain field, array items that are not the schema's objects); those
 * come back as an invalid form with a message, keeping what could be read, for the action's usual
 * `fail(400, { form })`. Every invalid form carries a message, not only field errors. Only the
 * schema's own defaults (zod `.default`) fill fields that were not posted.
 */
export async function readForm<T extends Record<string, unknown>, In extends Record<string, unknown> = T>(
	request: Request,
	adapter: ValidationAdapter<T, In>,
	options?: Options<T>
): Promise<SuperValidated<T, string, In>> {
	return readFormData(await formFields(request), adapter, options);
}

/**
 * readForm of fields already read (a form that also carries files: read the body once with
 * formFields, the files with readUploads). Files are not form fields: they are left out here.
 */
export async function readFormData<T extends Record<string, unknown>, In extends Record<string, unknown> = T>(
	posted: FormData | null,
	adapter: ValidationAdapter<T, In>,
	options?: Options<T>
): Promise<SuperValidated<T, string, In>> {
	let data = posted;
	if (posted && [...posted.values()].some((v) => typeof v !== 'string')) {
		data = new FormData();
		for (const [k, v] of posted) if (typeof v === 'string') data.append(k, v);
	}
	// Strict: a field missing from the post is missing, not silently filled with a default (a post of
	// a few stray fields must not become, say, a role change with every lab removed).
	options = { ...options, strict: true };
	if (data) {
		try {
			const form = await superValidate<T, string, In>(data, adapter, options);
			if (!form.valid) {
				form.message ??= NEEDS_ATTENTION;
				form.data = conform(form.data, adapter.jsonSchema, adapter.defaults) as T;
			}
			return form;
		} catch {
			// superforms could not map the body onto the schema: answered below as an unreadable form
		}
	}
	const form = await readable(data, adapter, options);
	form.data = conform(form.data, adapter.jsonSchema, adapter.defaults) as T;
	form.valid = false;
	form.posted = true;
	form.errors = { _errors: [UNREADABLE] } as typeof form.errors;
	form.message = UNREADABLE;
	return form;
}

/** What can still be read of a malformed post: fields superforms names as unreadable are dropped (a few times at most), no per-field errors. */
async function readable<T extends Record<string, unknown>, In extends Record<string, unknown>>(data: FormData | null, adapter: ValidationAdapter<T, In>, options?: Options<T>) {
	for (let tries = 0; data && tries < 10; tries++) {
		try {
			return await superValidate<T, string, In>(data, adapter, { ...options, errors: false });
		} catch (e) {
			const field = (e as { path?: unknown }).path;
			if (typeof field !== 'string' || !data.has(field)) break;
			data.delete(field);
		}
	}
	return superValidate<T, string, In>(adapter, options);
}

/**
 * An invalid form's values shaped like the schema, so the page that shows them again can render
 * them: superforms keeps a posted value of the wrong shape (an object where a list belongs, list
 * items of unknown keys); such a value becomes the schema's default, values of the right type stay.
 */
function conform(value: unknown, schema: JSONSchema | undefined, fallback: unknown): unknown {
	if (!schema || typeof schema === 'boolean') return value;
	const types: string[] = schema.type === undefined ? [] : Array.isArray(schema.type) ? schema.type : [schema.type];
	if (value === null && types.includes('null')) return null;
	if (types.includes('object') && schema.properties) {
		if (!value || typeof value !== 'object' || Array.isArray(value)) return fallback;
		const base = (fallback && typeof fallback === 'object' ? fallback : {}) as Record<string, unknown>;
		const out: Record<string, unknown> = {};
		for (const [key, sub] of Object.entries(schema.properties)) {
			out[key] = conform((value as Record<string, unknown>)[key], sub as JSONSchema, base[key] ?? defaultOf(sub as JSONSchema));
			// A required field with nothing usable: the whole object is unusable (a list drops it).
			if (out[key] === undefined && schema.required?.includes(key)) return fallback;
		}
		return out;
	}
	if (types.includes('array')) {
		if (!Array.isArray(value)) return fallback;
		const item = (Array.isArray(schema.items) ? schema.items[0] : schema.items) as JSONSchema | undefined;
		return item ? value.map((v) => conform(v, item, undefined)).filter((v) => v !== undefined) : value;
	}
	if (types.length === 0) return value === undefined ? fallback : value;
	const ok = types.some((t) => (t === 'integer' ? Number.isInteger(value) : t === 'null' ? value === null : typeof value === t));
	return ok ? value : fallback;
}

function defaultOf(schema: JSONSchema): unknown {
	try {
		return defaultValues(schema);
	} catch {
		return undefined;
	}
}

/**
 * The body of a form post, or null when it is not a readable form (malformed multipart,
 * …). A body over the size limit (see bodyLimit.ts) is a 413, not an unreadable form.
 */
export async function formFields(request: Request): Promise<FormData | null> {
	try {
		return await request.formData();
	} catch (e) {
		if (isTooLarge(e)) error(413, { message: tooLargeMessage });
		return null;
	}
}

/** A form of plain fields as an object for a zod schema; an unreadable body is an empty form (the schema then refuses it). */
export async function formObject(request: Request): Promise<Record<string, FormDataEntryValue>> {
	return Object.fromEntries((await formFields(request)) ?? []);
}

/** A form action without a superform: its name, and the row it is about when the page repeats it. */
export type PlainForm = { action: string; about?: string };

/**
 * The one way a form action answers a refusal, with the failure's 4xx status. A superform gets the
 * failure as its message and per-field errors; any other form gets `{ refused }` (see $lib/refusal),
 * with `extra` beside it for what the page shows with the refusal (an import's problem list).
 */
export function failForm<T extends Record<string, unknown>, In extends Record<string, unknown>>(
	form: SuperValidated<T, string, In>,
	failure: Failure
): { form: SuperValidated<T, string, In> } | ActionFailure<{ form: SuperValidated<T, string, In> }>;
export function failForm<E extends Record<string, unknown> = Record<never, never>>(form: PlainForm, failure: Failure, extra?: E): ActionFailure<{ refused: Refusal } & E>;
export function failForm(form: SuperValidated<Record<string, unknown>, string> | PlainForm, failure: Failure, extra?: Record<string, unknown>) {
	if ('action' in form) {
		const fields = Object.fromEntries(Object.entries(failure.fields ?? {}).map(([k, v]) => [k, v[0]]));
		return fail(failure.status, { ...extra, refused: { action: form.action, about: form.about ?? null, message: failure.message, fields } satisfies Refusal });
	}
	for (const [field, messages] of Object.entries(failure.fields ?? {})) {
		// 'elements.2.length' (ours) → 'elements[2].length' (superforms' path syntax)
		// A message about a whole list goes to its '_errors' (superforms would otherwise replace the list's item errors).
		const whole = !field.includes('.') && Array.isArray((form.data as Record<string, unknown>)[field]);
		const path = whole ? `${field}._errors` : field.replace(/\.(\d+)(?=\.|$)/g, '[$1]');
		for (const m of messages) setError(form, path as never, m, { status: failure.status });
	}
	return message(form, failure.message, { status: failure.status });
}
