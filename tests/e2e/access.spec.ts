// The access matrix: every route × method (and form action) × anonymous, each role and a
// disabled user, compared with the written policy. A route missing from the policy fails.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { expect, test, type APIRequestContext } from '@playwright/test';
import postgres from 'postgres';
import { routePolicy, allows } from '../../src/lib/server/auth/policy';
import { roles, type Role } from '../../src/lib/roles';
import { anonymousClient, demo, signedInClient } from './helpers';

type Endpoint = { routeId: string; kind: 'page' | 'api'; method: string; action?: string };

function discover(dir = 'src/routes'): Endpoint[] {
	const found: Endpoint[] = [];
	const walk = (d: string) => {
		for (const name of readdirSync(d)) {
			const p = join(d, name);
			if (statSync(p).isDirectory()) walk(p);
		}
		const routeId = '/' + relative(dir, d).split('\\').join('/');
		const id = routeId === '/' ? '/' : routeId.replace(/\/$/, '');
		const has = (f: string) => readdirSync(d).includes(f);
		if (has('+page.svelte') || has('+page.server.ts')) {
			found.push({ routeId: id, kind: 'page', method: 'GET' });
			if (has('+page.server.ts')) {
				const src = readFileSync(join(d, '+page.server.ts'), 'utf8');
				const block = src.split('export const actions')[1];
				if (block) for (const m of block.matchAll(/^\t(\w+): async function/gm)) found.push({ routeId: id, kind: 'page', method: 'POST', action: m[1] });
			}
		}
		if (has('+server.ts')) {
			const src = readFileSync(join(d, '+server.ts'), 'utf8');
			for (const m of src.matchAll(/export (?:const|async function) (GET|POST|PUT|PATCH|DELETE)\b/g)) found.push({ routeId: id, kind: 'api', method: m[1] });
		}
	};
	walk(dir);
	return found;
}

const endpoints = discover();
let clients: Record<Role | 'anonymous' | 'disabled', APIRequestContext>;
let sample: Record<string, string>;

function urlOf(routeId: string, action?: string) {
	const path = routeId.replace(/\/\([^)]+\)/g, '').replace(/\[(\w+)\]/g, (_, name: string) => sample[name]) || '/';
	return action && action !== 'default' ? `${path}?/${action}` : path;
}

test.beforeAll(async () => {
	const admin = await signedInClient(demo('admin'));
	const list = (await (await admin.get('/api/admin/users')).json()) as { users: { id: string; email: string }[] };
	// Records the demo researcher may see: a laser of their lab, its line and path, and a limit.
	const inventory = await (await admin.get('/api/lasers?q=Solace')).json();
	const laser = await (await admin.get(`/api/lasers/${inventory.items[0].id}`)).json();
	const { limits } = await (await admin.get('/api/limits')).json();
	// Records without a JSON listing are looked up in the end-to-end database itself.
	const sql = postgres(`postgres://beamwarden_app@127.0.0.1:${process.env.BEAMWARDEN_PGPORT ?? '54329'}/beamwarden_e2e`, { max: 1 });
	const [spx] = await sql`SELECT i.id AS inspection_id, d.id AS document_id FROM inspection i JOIN area a ON a.id = i.area_id JOIN lab l ON l.id = a.lab_id LEFT JOIN document d ON d.entity_id = i.id::text WHERE l.code = 'SPX' AND d.id IS NOT NULL LIMIT 1`;
	const [goggles] = await sql`SELECT id FROM eyewear LIMIT 1`;
	const [incident] = await sql`SELECT id FROM incident WHERE state <> 'draft' ORDER BY number LIMIT 1`;
	// Procedures, authorisations and areas of the demo researcher's lab SPX.
	const [spxArea] = await sql`SELECT a.id FROM area a JOIN lab l ON l.id = a.lab_id WHERE l.code = 'SPX' LIMIT 1`;
	const [spxProcedure] = await sql`SELECT p.id FROM procedure p JOIN lab l ON l.id = p.lab_id WHERE l.code = 'SPX' LIMIT 1`;
	const [spxAuthorisation] = await sql`SELECT a.id FROM authorisation a JOIN lab l ON l.id = a.lab_id WHERE l.code = 'SPX' LIMIT 1`;
	await sql.end();
	sample = {
		userId: list.users.find((u) => u.email === demo('researcher').email)!.id,
		laserId: laser.laser.id,
		lineId: laser.lines[0].id,
		pathId: laser.paths[0].id,
		limitId: limits[0].limitId,
		inspectionId: spx.inspection_id,
		documentId: spx.document_id,
		eyewearId: goggles.id,
		incidentId: incident.id,
		areaId: spxArea.id,
		procedureId: spxProcedure.id,
		authorisationId: spxAuthorisation.id,
		token: 'not-a-real-token'
	};
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
