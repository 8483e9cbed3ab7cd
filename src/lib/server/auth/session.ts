// The one module that knows about lucia (v3 is frozen upstream, so it stays behind these verbs).
// The cookie carries a 200-bit random token; the database only ever holds its SHA-256, so a
// leaked session table yields no live sessions.
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import type { Cookies } from '@sveltejs/kit';
import { createHash } from 'node:crypto';
import { Lucia, TimeSpan, type Adapter, type DatabaseSession } from 'lucia';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';

/** Idle timeout: a session unused this long ends (lucia extends it while in use). */
export const IDLE_TIMEOUT = new TimeSpan(4, 'h');
/** Absolute timeout: however active, a session ends this long after sign-in. */
export const ABSOLUTE_TIMEOUT_MS = 12 * 60 * 60 * 1000;

export function hashToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}

function hashingAdapter(inner: Adapter): Adapter {
	const withId = (s: DatabaseSession | null, id: string) => (s ? { ...s, id } : null);
	return {
		async getSessionAndUser(token) {
			const [s, u] = await inner.getSessionAndUser(hashToken(token));
			return [withId(s, token), u];
		},
		getUserSessions: (userId) => inner.getUserSessions(userId),
		setSession: (s) => inner.setSession({ ...s, id: hashToken(s.id) }),
		updateSessionExpiration: (token, at) => inner.updateSessionExpiration(hashToken(token), at),
		deleteSession: (token) => inner.deleteSession(hashToken(token)),
		deleteUserSessions: (userId) => inner.deleteUserSessions(userId),
		deleteExpiredSessions: () => inner.deleteExpiredSessions()
	};
}

/** Cookies are `Secure` unless explicitly turned off for plain-HTTP local use. */
export const secureCookie = process.env.BEAMWARDEN_INSECURE_COOKIE !== '1';

export const lucia = new Lucia(hashingAdapter(new DrizzlePostgreSQLAdapter(db, table.session, table.user)), {
	sessionExpiresIn: IDLE_TIMEOUT,
	sessionCookie: {
		name: 'bw_session',
		attributes: { secure: secureCookie, sameSite: 'lax', path: '/' }
	},
	getSessionAttributes: (a) => ({ createdAt: a.createdAt }),
	// Only what pages need: never the password hash.
	getUserAttributes: (a) => ({ email: a.email, name: a.name, role: a.role, disabled: a.disabled })
});

declare module 'lucia' {
	interface Register {
		Lucia: typeof lucia;
		DatabaseSessionAttributes: { createdAt: Date };
		DatabaseUserAttributes: Omit<table.User, 'id'>;
	}
}

export type SessionValidationResult = Awaited<ReturnType<typeof validateSessionToken>>;
export type SessionUser = NonNullable<SessionValidationResult['user']>;

export const sessionCookieName = lucia.sessionCookieName;

export async function createSession(userId: string) {
	return lucia.createSession(userId, { createdAt: new Date() });
}

export async function validateSessionToken(token: string) {
	const { session, user } = await lucia.validateSession(token);
	if (!session || !user) return { session: null, user: null };
	const tooOld = Date.now() - session.createdAt.getTime() > ABSOLUTE_TIMEOUT_MS;
	if (tooOld || user.disabled) {
		await lucia.invalidateSession(session.id);
		return { session: null, user: null };
	}
	return { session, user };
}

export async function invalidateSession(token: string) {
	await lucia.invalidateSession(token);
}

export function setSessionCookie(cookies: Cookies, token: string) {
	const c = lucia.createSessionCookie(token);
	cookies.set(c.name, c.value, { ...c.attributes, path: '/' });
}

export function deleteSessionCookie(cookies: Cookies) {
	const c = lucia.createBlankSessionCookie();
	cookies.set(c.name, c.value, { ...c.attributes, path: '/' });
}
