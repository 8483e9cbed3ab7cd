// One shape for every JSON API answer that is not a success: { message, fields? } with a 4xx/5xx.
import { isHttpError, isRedirect, json, type RequestEvent, type RequestHandler } from '@sveltejs/kit';
import { fieldMessages, type Failure } from '$lib/server/http/failure';
import type { z } from 'zod';
import { DATABASE_UNAVAILABLE, isDatabaseUnavailable, refusedInput } from '../db/errors';
import { noteUnavailable } from '../db/outage';
import { isTooLarge, tooLargeMessage } from './bodyLimit';

export type ApiError = App.Error;

export function apiError(status: number, message: string, fields?: Record<string, string[]>) {
	return json({ message, ...(fields ? { fields } : {}) } satisfies ApiError, { status });
}

/** A data module's failure as the API's error answer (its status, message and field messages). */
export function failureAnswer(f: Failure) {
	return apiError(f.status, f.message, f.fields);
}

/** Wrap an endpoint so guards' `error()` and unexpected failures still answer in the API shape. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function endpoint<H extends RequestHandler<any, any>>(handler: H): H {
	return (async (event: RequestEvent) => {
		try {
			return await handler(event);
		} catch (e) {
			if (isRedirect(e)) throw e;
			if (isHttpError(e)) return json(e.body, { status: e.status });
			if (isDatabaseUnavailable(e)) {
				noteUnavailable();
				return apiError(503, DATABASE_UNAVAILABLE);
			}
			const refused = refusedInput(e);
			if (refused) {
				console.error('API input refused by the database', event.route.id, (e as Error).message);
				return apiError(refused.status, refused.message);
			}
			console.error('API failure', event.route.id, e);
			return apiError(500, 'Something went wrong on our side; it has been logged.');
		}
	}) as H;
}

/** Read and validate a JSON body; a bad body answers 400 naming each field. */
export async function readJson<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<{ ok: true; data: z.infer<S> } | { ok: false; response: Response }> {
	let body: unknown;
	try {
		body = await request.json();
	} catch (e) {
		if (isTooLarge(e)) return { ok: false, response: apiError(413, tooLargeMessage) };
		return { ok: false, response: apiError(400, 'The request body must be JSON.') };
	}
	const parsed = schema.safeParse(body);
	if (!parsed.success) return { ok: false, response: apiError(400, 'Some fields need attention.', fieldMessages(parsed.error)) };
	return { ok: true, data: parsed.data };
}

