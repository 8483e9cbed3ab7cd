// Fuzzing the JSON API and every form action with fast-check: whatever the body, never a 5xx, and no
// row written from invalid input.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { parse, stringify } from 'devalue';
import postgres from 'postgres';
import { expect, test, type APIRequestContext } from '@playwright/test';
import { routePolicy } from '../../src/lib/server/auth/policy';
import type { Role } from '../../src/lib/roles';
import { anonymousClient, demo, signedInClient } from './helpers';
import { discover, e2eDatabaseUrl, sampleIds, urlOf } from './routes';

test('POST /api/admin/users and PATCH /api/admin/users/[userId] never answer 5xx', async () => {
	const admin = await signedInClient(demo('admin'));
	const count = async () => ((await (await admin.get('/api/admin/users')).json()) as { users: unknown[] }).users.length;
	const before = await count();
	const list = (await (await admin.get('/api/admin/users')).json()) as { users: { id: string; email: string }[] };
	const target = list.users.find((u) => u.email === demo('researcher').email)!.id;
	const body = fc.oneof(
		fc.anything(),
		fc.record({ name: fc.anything(), email: fc.anything(), role: fc.anything(), labIds: fc.anything(), password: fc.anything() }, { requiredKeys: [] }),
		fc.string({ maxLength: 5000 }),
		fc.constant('x'.repeat(200_000))
	);
	await fc.assert(
		fc.asyncProperty(body, fc.boolean(), async (data, raw) => {
			const payload = raw && typeof data === 'string' ? data : JSON.stringify(data) ?? 'null';
			for (const res of [
				await admin.post('/api/admin/users', { data: payload, headers: { 'content-type': 'application/json' } }),
				await admin.patch(`/api/admin/users/${target}`, { data: payload, headers: { 'content-type': 'application/json' } })
			]) {
				expect(res.status(), payload.slice(0, 200)).toBeLessThan(500);
				if (res.status() >= 400) expect(typeof (await res.json()).message).toBe('string');
			}
		}),
		{ numRuns: 150 }
	);
	expect(await count()).toBe(before);
});

test('every JSON write of the register answers 4xx to arbitrary bodies and writes nothing', async () => {
	const officer = await signedInClient(demo('officer'));
	const inventory = await (await officer.get('/api/lasers?q=Solace')).json();
	const laser = await (await officer.get(`/api/lasers/${inventory.items[0].id}`)).json();
	const { limits } = await (await officer.get('/api/limits')).json();
	const writes: [string, string][] = [
		['post', '/api/lasers'],
		['patch', `/api/lasers/${laser.laser.id}`],
		['post', `/api/lasers/${laser.laser.id}/paths`],
		['put', `/api/paths/${laser.paths[0].id}`],
		['post', '/api/limits'],
		['put', `/api/limits/${limits[0].limitId}`],
		['post', '/api/assessments/preview']
	];
	const counts = async () => {
		const all = await (await officer.get('/api/lasers?pageSize=1&status=active')).json();
		const lib = await (await officer.get('/api/limits')).json();
		const one = await (await officer.get(`/api/paths/${laser.paths[0].id}`)).json();
		return { lasers: all.total, limits: lib.limits.length, pathVersion: one.path.version };
	};
	const before = await counts();
	const body = fc.oneof(
		fc.anything(),
		fc.record({ labId: fc.anything(), lineIds: fc.anything(), line: fc.anything(), path: fc.anything(), limits: fc.anything(), elements: fc.anything(), points: fc.anything(), k: fc.anything(), version: fc.anything() }, { requiredKeys: [] }),
		fc.string({ maxLength: 2000 })
	);
	for (const [method, url] of writes) {
		await fc.assert(
			fc.asyncProperty(body, async (data) => {
				const res = await officer.fetch(url, { method, data: JSON.stringify(data) ?? 'null', headers: { 'content-type': 'application/json' } });
				expect(res.status(), `${method} ${url} ${JSON.stringify(data)?.slice(0, 200)}`).toBeGreaterThanOrEqual(400);
				expect(res.status()).toBeLessThan(500);
			}),
			{ numRuns: 40 }
		);
	}
	expect(await counts()).toEqual(before);
});

/** A failure's data says something: a form message, form-level errors, or an `…Error` sentence. */
function hasMessage(data: unknown, depth = 0): boolean {
	if (!data || typeof data !== 'object' || depth > 2) return false;
	return Object.entries(data).some(([k, v]) => ((k === 'message' || /^(error|\w+Error)$/.test(k)) && typeof v === 'string' && v.length > 0) || (k === '_errors' && Array.isArray(v) && v.length > 0) || hasMessage(v, depth + 1));
}

// Every form action of every route (read from src/routes, so a new action is fuzzed without editing
// this file), posted as its policy's writer: plain fields, nested values sent as plain fields, the
// superforms JSON part with values of any shape (array items of unknown keys included), multipart
// with files, and bodies that are no form at all. Only 4xx answers, each with a message; no 5xx;
// and no row written: the audit log, which every change writes in its transaction, does not grow.
test('every form action answers 4xx with a message to arbitrary bodies and writes nothing', async () => {
	test.setTimeout(600_000);
	const actions = discover().filter((e) => e.method === 'POST' && e.kind === 'page');
	expect(actions.length).toBeGreaterThanOrEqual(20);
	const admin = await signedInClient(demo('admin'));
	const sample = await sampleIds(admin);
	const clients = new Map<string, APIRequestContext>();
	const clientFor = async (routeId: string) => {
		const access = routePolicy[routeId].write;
		if (access === 'public') return anonymousClient();
		const role: Role = access === 'signed-in' || access.includes('officer') ? 'officer' : access[0];
		if (!clients.has(role)) clients.set(role, await signedInClient(demo(role)));
		return clients.get(role)!;
	};
	// Field names of every schema, so that bodies often name real fields (and so reach past the first check).
	const schemaText = readdirSync('src/lib/schemas').filter((f) => f.endsWith('.ts')).map((f) => readFileSync(join('src/lib/schemas', f), 'utf8')).join('\n');
	const names = [...new Set([...schemaText.matchAll(/(\w+)\s*:\s*z\s*\./g)].map((m) => m[1]))];
	expect(names).toEqual(expect.arrayContaining(['line', 'elements', 'controls', 'results', 'bands', 'email']));

	const key = fc.oneof({ weight: 4, arbitrary: fc.constantFrom(...names) }, fc.string({ maxLength: 12 }), fc.constantFrom('__superform_id', '__proto__', 'constructor', 'version'));
	const text = fc.oneof(
		{ weight: 4, arbitrary: fc.string({ maxLength: 200 }) },
		fc.constantFrom('{}', '[]', '{"a":{"b":{}}}', '[{"x":1}]', 'null', 'true', '1e999', '-1', 'NaN', '0x10', '\u0000', '\u202ename.pdf', '12 parsecs'),
		// Never a small whole number: `version=1` alone is a valid request to retire a limit, not bad input.
		fc.integer().filter((n) => n < 0 || n > 99).map(String),
		fc.constant('x'.repeat(100_000))
	);
	const fields = fc.array(fc.tuple(key, text), { maxLength: 10 });
	const value = fc.oneof(fc.anything(), fc.array(fc.dictionary(fc.string({ maxLength: 6 }), fc.anything({ maxDepth: 2 })), { maxLength: 3 }), fc.dictionary(fc.string({ maxLength: 6 }), fc.anything({ maxDepth: 2 })));
	const shaped = fc.dictionary(fc.constantFrom(...names), value, { maxKeys: 8 });
	const devalued = (v: unknown) => {
		try {
			return stringify(v);
		} catch {
			return JSON.stringify(v) ?? 'null';
		}
	};
	type Body = { kind: 'urlencoded'; entries: [string, string][] } | { kind: 'multipart'; entries: [string, string][]; file: boolean } | { kind: 'raw'; type: string; raw: string };
	const body: fc.Arbitrary<Body> = fc.oneof(
		fields.map((entries) => ({ kind: 'urlencoded' as const, entries })),
		fc.tuple(fc.oneof(shaped, fc.anything()), fields).map(([json, extra]) => ({ kind: 'urlencoded' as const, entries: [['__superform_json', devalued(json)] as [string, string], ...extra] })),
		fc.tuple(fc.string({ maxLength: 300 }), fields).map(([junk, extra]) => ({ kind: 'urlencoded' as const, entries: [['__superform_json', junk] as [string, string], ...extra] })),
		fc.tuple(fields, fc.boolean()).map(([entries, file]) => ({ kind: 'multipart' as const, entries, file })),
		fc.tuple(fc.constantFrom('application/x-www-form-urlencoded', 'multipart/form-data; boundary=zz', 'multipart/form-data', 'text/plain'), fc.string({ maxLength: 2000 })).map(([type, raw]) => ({ kind: 'raw' as const, type, raw }))
	);

	const sql = postgres(e2eDatabaseUrl(), { max: 1 });
	// Changes only: a page shown again after a refused action records who read personal fields, as it should.
	const audited = async () => Number((await sql`SELECT count(*)::int AS n FROM audit_log WHERE action NOT LIKE '%.view_%'`)[0].n);
	const before = await audited();
	// Signing out needs a fresh sign-in per body (slow, and the action reads no field): a few bodies there, the rest spread over the others.
	const signOutRuns = 25;
	const runs = Math.ceil((5200 - signOutRuns) / (actions.length - 1));
	let sent = 0;
	const problems: string[] = [];
	const timings: string[] = [];
	try {
		for (const a of actions) {
			const url = urlOf(a.routeId, sample, a.action);
			const signsOut = a.routeId === '/(auth)/signout';
			const started = Date.now();
			let client = signsOut ? await signedInClient(demo('officer')) : await clientFor(a.routeId);
			const send = async (b: Body, wantsJson: boolean) => {
				if (signsOut) {
					await client.dispose();
					client = await signedInClient(demo('officer')); // signing out ends the session: a fresh one each time
				}
				// One connection per body: a server that answers before reading a whole body (415, 413)
				// closes that connection, which a reused keep-alive socket would report as a reset.
				const headers: Record<string, string> = { accept: wantsJson ? 'application/json' : 'text/html', connection: 'close' };
				const options: Parameters<APIRequestContext['post']>[1] = { headers, maxRedirects: 0 };
				if (b.kind === 'urlencoded') {
					headers['content-type'] = 'application/x-www-form-urlencoded';
					options.data = new URLSearchParams(b.entries).toString();
				} else if (b.kind === 'multipart') {
					const form = new FormData();
					for (const [k, v] of b.entries) form.append(k, v);
					if (b.file) form.append(b.entries[0]?.[0] ?? 'photos', new Blob([new Uint8Array([0x89, 0x50, 0x4e, 0x47, 1, 2, 3])]), '\u202egnp.exe');
					options.multipart = form;
				} else {
					headers['content-type'] = b.type;
					options.data = b.raw;
				}
				const res = await client.post(url, options);
				sent++;
				const status = res.status();
				const answer = await res.text();
				await res.dispose();
				let outcome: { ok: boolean; why: string };
				// Sign-out takes no fields: any readable body signs out (a body over the size limit is a 413).
				if (signsOut) outcome = { ok: status === 303 || (status === 200 && /"type":"redirect"/.test(answer)) || status === 413, why: `sign-out answered ${status}` };
				else if (status >= 500) outcome = { ok: false, why: '5xx' };
				else if (wantsJson && status === 200) {
					// SvelteKit answers actions called with Accept: JSON as 200 + { type, status }
					const parsed = JSON.parse(answer) as { type: string; status?: number; data?: string };
					const data = parsed.data ? parse(parsed.data) : null;
					outcome = { ok: parsed.type === 'failure' && parsed.status! >= 400 && parsed.status! < 500 && hasMessage(data), why: `answered ${parsed.type} ${parsed.status ?? ''}` };
				} else outcome = { ok: status >= 400 && status < 500 && answer.length > 0, why: `answered ${status}` };
				if (!outcome.ok) problems.push(`${a.action} ${url} (${b.kind}, ${wantsJson ? 'json' : 'html'}): ${outcome.why}; body ${JSON.stringify(b).slice(0, 300)}`);
				return outcome.ok;
			};
			// Four bodies at a time (sign-out one at a time, each needs its own session).
			const batch = signsOut ? 1 : 4;
			try {
				await fc.assert(
					fc.asyncProperty(fc.array(fc.tuple(body, fc.boolean()), { minLength: batch, maxLength: batch }), async (bodies) => {
						const answers = await Promise.all(bodies.map(([b, wantsJson]) => send(b, wantsJson)));
						return answers.every(Boolean);
					}),
					{ numRuns: Math.ceil((signsOut ? signOutRuns : runs) / batch), endOnFailure: true }
				);
			} catch (e) {
				problems.push(`${url}: ${(e as Error).message.split('\n').slice(0, 3).join(' ').slice(0, 400)}`); // the answers themselves are listed too
			}
			timings.push(`${url} ${((Date.now() - started) / 1000).toFixed(1)} s`);
		}
		expect(problems, 'answers that were not a 4xx with a message').toEqual([]);
		expect(sent).toBeGreaterThanOrEqual(5000);
		expect(await audited(), 'rows written from invalid input (audit log)').toBe(before);
	} finally {
		await sql.end();
	}
	console.log(`fuzz: ${sent} bodies to ${actions.length} form actions\n  ${timings.join('\n  ')}`);
});
