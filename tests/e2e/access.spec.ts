// The access matrix: every route × method (and form action) × anonymous, each role and a
// disabled user, compared with the written policy. A route missing from the policy fails.
import { expect, test, type APIRequestContext } from '@playwright/test';
import { routePolicy, allows } from '../../src/lib/server/auth/policy';
import { roles, type Role } from '../../src/lib/roles';
import { anonymousClient, demo, signedInClient } from './helpers';
import { discover, sampleIds, urlOf as fill } from './routes';

const endpoints = discover();
let clients: Record<Role | 'anonymous' | 'disabled', APIRequestContext>;
let sample: Record<string, string>;

const urlOf = (routeId: string, action?: string) => fill(routeId, sample, action);

test.beforeAll(async () => {
	const admin = await signedInClient(demo('admin'));
	sample = await sampleIds(admin);
	// A disabled person whose session was live before the disable
	const person = { email: `disabled-${Date.now()}@test.example`, password: 'a long enough test passphrase' };
	const created = await admin.post('/api/admin/users', { data: { name: 'Soon Disabled', email: person.email, role: 'officer', labIds: [], password: person.password } });
	expect(created.status()).toBe(201);
	const { id } = await created.json();
	const disabled = await signedInClient(person);
	const patched = await admin.patch(`/api/admin/users/${id}`, { data: { role: 'officer', labIds: [], disabled: true, version: 1 } });
	expect(patched.status()).toBe(200);
	clients = { anonymous: await anonymousClient(), disabled, admin } as typeof clients;
	for (const r of roles) if (r !== 'admin') clients[r] = await signedInClient(demo(r));
});

test('every route is in the written policy, and the policy names no route that does not exist', () => {
	const ids = new Set(endpoints.map((e) => e.routeId));
	expect(ids.size).toBeGreaterThanOrEqual(15);
	expect([...ids].filter((id) => !(id in routePolicy))).toEqual([]);
	expect(Object.keys(routePolicy).filter((id) => !ids.has(id))).toEqual([]);
});

test('each route answers each caller as the policy says', async () => {
	const mismatches: string[] = [];
	for (const e of endpoints) {
		const rule = routePolicy[e.routeId];
		for (const who of ['anonymous', 'disabled', ...roles] as const) {
			const role = who === 'anonymous' || who === 'disabled' ? null : who;
			const access = e.method === 'GET' ? rule.read : rule.write;
			const allowed = allows(access, role);
			const url = urlOf(e.routeId, e.action);
			// Signing out ends the session, so that action gets a throw-away session of its own.
			const signsOut = e.routeId === '/(auth)/signout' && e.method === 'POST' && role !== null;
			const client = signsOut ? await signedInClient(demo(role)) : clients[who];
			const res = await client.fetch(url, {
				method: e.method,
				maxRedirects: 0,
				headers: e.kind === 'api' ? { accept: 'application/json', 'content-type': 'application/json' } : { accept: 'text/html' },
				data: e.method === 'GET' ? undefined : e.kind === 'api' ? '{}' : ''
			});
			const s = res.status();
			const location = res.headers()['location'] ?? '';
			let ok: boolean;
			const sentToSignIn = s === 303 && location.startsWith('/signin');
			if (allowed) ok = s < 500 && s !== 401 && s !== 403 && (access === 'public' || !sentToSignIn);
			// Signed out, a browser GET outside the JSON API is sent to sign in; everything else answers 401.
			else if (role === null) ok = e.method === 'GET' && !url.startsWith('/api/') ? sentToSignIn : s === 401;
			else ok = s === 403;
			if (!ok) mismatches.push(`${who} ${e.method} ${url}: ${s} ${location} (policy: ${allowed ? 'allow' : 'deny'})`);
		}
	}
	expect(mismatches).toEqual([]);
});

test('JSON writes from another site are refused', async () => {
	const admin = clients.admin;
	const res = await admin.post('/api/admin/users', { headers: { origin: 'http://evil.example' }, data: {} });
	expect(res.status()).toBe(403);
	expect(await res.json()).toEqual({ message: 'Cross-site request refused.' });
});

test('signed-in pages carry the security headers and are not cached', async () => {
	const res = await clients.officer.get('/overview');
	const h = res.headers();
	expect(h['content-security-policy']).toMatch(/frame-ancestors 'none'/);
	expect(h['content-security-policy']).toMatch(/script-src 'self' 'nonce-/);
	expect(h['x-content-type-options']).toBe('nosniff');
	expect(h['referrer-policy']).toBe('same-origin');
	expect(h['cache-control']).toBe('no-store');
});

test('the session cookie is HttpOnly, SameSite=Lax, Secure, Path=/ and has no Domain', async () => {
	const ctx = await anonymousClient();
	const res = await ctx.post('/signin', {
		form: { email: demo('manager').email, password: demo('manager').password },
		headers: { accept: 'text/html' },
		maxRedirects: 0
	});
	const cookie = res.headersArray().find((h) => h.name.toLowerCase() === 'set-cookie' && h.value.startsWith('bw_session='))!.value;
	expect(cookie).toMatch(/HttpOnly/i);
	expect(cookie).toMatch(/SameSite=Lax/i);
	expect(cookie).toMatch(/Secure/i);
	expect(cookie).toMatch(/Path=\//);
	expect(cookie).not.toMatch(/Domain=/i);
});

test('no page data or API answer carries a hash or a token', async () => {
	for (const url of ['/api/me', '/api/admin/users', `/api/admin/users/${sample.userId}`, '/admin/users/__data.json', '/overview/__data.json']) {
		const body = await (await clients.admin.get(url)).text();
		expect(body, url).not.toMatch(/argon2|password_?hash|passwordHash/i);
	}
});
