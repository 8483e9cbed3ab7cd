import { building } from '$app/environment';
import { error, json, redirect, type Handle, type HandleServerError, type ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { client } from '$lib/server/db';
import { DATABASE_UNAVAILABLE, isDatabaseUnavailable, refusedInput } from '$lib/server/db/errors';
import { databaseDown, noteUnavailable, onOutage } from '$lib/server/db/outage';
import { readConfig } from '$lib/server/config';
import { startJobs, stopJobs } from '$lib/server/jobs/workers';
import * as auth from '$lib/server/auth/session';
import { allows, ruleFor } from '$lib/server/auth/policy';
import { forbidden } from '$lib/server/auth/guard';
import { apiError } from '$lib/server/http/api';
import { bodyLimitFor, drain, tooLargeMessage, withBodyLimit } from '$lib/server/http/bodyLimit';

export const init: ServerInit = async () => {
	if (building) return;
	try {
		readConfig();
	} catch (e) {
		console.error((e as Error).message);
		process.exit(2);
	}
	// The job queue's library records a job's end on its own connection; during a database restart
	// that write can fail outside any promise we hold. Such a rejection must not end the process (the
	// schedule repeats the job); any other stays fatal, as Node makes it by default.
	process.on('unhandledRejection', (e) => {
		if (!isDatabaseUnavailable(e)) throw e;
		noteUnavailable();
		console.error('job queue: the database was unavailable:', (e as Error).message);
	});
	if (process.env.BEAMWARDEN_JOBS !== 'off') startJobsWhenReady();
	process.on('sveltekit:shutdown', async () => {
		await stopJobs();
		await client.end({ timeout: 5 });
	});
};

/** Start the queue workers; if the database is not up yet, keep trying without blocking requests. */
function startJobsWhenReady(delay = 1000) {
	startJobs(process.env.DATABASE_URL!).catch((e) => {
		console.error(`job queue not started (${(e as Error).message}); retrying`);
		setTimeout(() => startJobsWhenReady(Math.min(delay * 2, 30_000)), delay);
	});
}

const isApi = (path: string) => path.startsWith('/api/');
/** 503 while the database cannot be reached: the API's error shape for /api, plain text otherwise. */
const unavailable = (path: string) => {
	if (isApi(path)) {
		const res = apiError(503, DATABASE_UNAVAILABLE);
		res.headers.set('retry-after', '5');
		return res;
	}
	return new Response(DATABASE_UNAVAILABLE, { status: 503, headers: { 'content-type': 'text/plain; charset=utf-8', 'retry-after': '5' } });
};

// A load or action that fails because the database is down, or because it refused a value, is
// rendered by SvelteKit as a 500; handleError marks which, and the answer goes out as a 503 that
// says to try again, or as the 4xx of the refused value.
const handleUnavailable: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (response.status !== 500) return response;
	const headers = new Headers(response.headers);
	if (event.locals.databaseUnavailable) {
		headers.set('retry-after', '5');
		return new Response(response.body, { status: 503, headers });
	}
	if (event.locals.refusedStatus) return new Response(response.body, { status: event.locals.refusedStatus, headers });
	return response;
};

// Body limits by kind of route (bodyLimit.ts): a declared size over the limit is refused before
// anything reads it; a streamed body is cut off where it passes the limit, and its reader answers 413.
const handleBodyLimit: Handle = async ({ event, resolve }) => {
	const { method, headers } = event.request;
	if (method === 'GET' || method === 'HEAD' || !event.request.body) return resolve(event);
	const limit = bodyLimitFor(event.route.id, event.url);
	if (Number(headers.get('content-length') ?? 0) > limit) {
		void drain(event.request.body);
		const close = { connection: 'close' };
		if (isApi(event.url.pathname)) return json({ message: tooLargeMessage } satisfies App.Error, { status: 413, headers: close });
		if ((headers.get('accept') ?? '').includes('application/json')) return json({ type: 'error', error: { message: tooLargeMessage } }, { status: 413, headers: close });
		return new Response(tooLargeMessage, { status: 413, headers: { 'content-type': 'text/plain; charset=utf-8', ...close } });
	}
	event.request = withBodyLimit(event.request, limit);
	return resolve(event);
};

// While the database is down, answer at once (db/outage.ts) rather than queue behind reconnects;
// a request already in flight when the outage is noticed gets IN_FLIGHT_GRACE_MS to finish, then its
// 503 (a write not finished by then is not acknowledged: it either committed or rolled back).
const IN_FLIGHT_GRACE_MS = 300;
const handleOutage: Handle = async ({ event, resolve }) => {
	if (databaseDown()) {
		void drain(event.request.body);
		return unavailable(event.url.pathname);
	}
	let timer: ReturnType<typeof setTimeout> | undefined;
	let forget = () => {};
	const cutOff = new Promise<Response>((done) => {
		forget = onOutage(() => (timer = setTimeout(() => done(unavailable(event.url.pathname)), IN_FLIGHT_GRACE_MS)));
	});
	try {
		return await Promise.race([resolve(event), cutOff]);
	} finally {
		forget();
		clearTimeout(timer);
	}
};

const handleSession: Handle = async ({ event, resolve }) => {
	const token = event.cookies.get(auth.sessionCookieName);
	event.locals.user = null;
	event.locals.session = null;
	if (token) {
		try {
			const { session, user } = await auth.validateSessionToken(token);
			if (session?.fresh) auth.setSessionCookie(event.cookies, session.id);
			if (!session) auth.deleteSessionCookie(event.cookies);
			event.locals.user = user;
			event.locals.session = session;
		} catch (e) {
			if (isDatabaseUnavailable(e)) {
				noteUnavailable();
				return unavailable(event.url.pathname);
			}
			throw e;
		}
	}
	return resolve(event);
};

// SvelteKit's own CSRF check covers form posts only; JSON writes need their own.
const handleJsonOrigin: Handle = async ({ event, resolve }) => {
	const { method, headers } = event.request;
	if (isApi(event.url.pathname) && !['GET', 'HEAD', 'OPTIONS'].includes(method)) {
		const origin = headers.get('origin');
		const site = headers.get('sec-fetch-site');
		const sameOrigin = origin ? origin === event.url.origin : site === 'same-origin';
		if (!sameOrigin) return json({ message: 'Cross-site request refused.' }, { status: 403 });
	}
	return resolve(event);
};

// Deny by default: every route must appear in the written policy.
const handleGuard: Handle = async ({ event, resolve }) => {
	const routeId = event.route.id;
	if (routeId === null) return resolve(event); // no such route: SvelteKit answers 404 (static files included)
	const rule = ruleFor(routeId);
	const reading = event.request.method === 'GET' || event.request.method === 'HEAD';
	const access = rule ? (reading ? rule.read : rule.write) : [];
	const user = event.locals.user;
	if (allows(access, user?.role ?? null)) return resolve(event);
	if (!user) {
		if (isApi(event.url.pathname) || !reading)
			return json({ message: 'Sign in to continue.' }, { status: 401 });
		redirect(303, `/signin?next=${encodeURIComponent(event.url.pathname + event.url.search)}`);
	}
	const body = forbidden(user.role, access === 'public' || access === 'signed-in' ? [] : access);
	if (isApi(event.url.pathname) || !reading) return json(body, { status: 403 });
	error(403, body); // rendered by src/error.html, which says what is missing

};

const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const h = response.headers;
	h.set('x-content-type-options', 'nosniff');
	h.set('referrer-policy', 'same-origin');
	h.set('x-frame-options', 'DENY');
	h.set('cross-origin-opener-policy', 'same-origin');
	h.set('permissions-policy', 'camera=(), microphone=(), geolocation=()');
	if (event.locals.user && !h.has('cache-control')) h.set('cache-control', 'no-store');
	return response;
};

export const handle = sequence(securityHeaders, handleUnavailable, handleBodyLimit, handleOutage, handleSession, handleJsonOrigin, handleGuard);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (isDatabaseUnavailable(error)) {
		noteUnavailable();
		event.locals.databaseUnavailable = true;
		return { message: DATABASE_UNAVAILABLE };
	}
	const refused = refusedInput(error);
	if (refused) {
		console.error('Input refused by the database', event.route.id, (error as Error).message);
		event.locals.refusedStatus = refused.status;
		return { message: refused.message };
	}
	if (status >= 500) console.error('Unhandled error', event.route.id, error);
	return { message: status >= 500 ? 'Something went wrong on our side; it has been logged.' : message };
};
