// Fuzzing the JSON API with fast-check: whatever the body, only 2xx/4xx, never a 5xx, and no row
// written from invalid input.
import fc from 'fast-check';
import { expect, test } from '@playwright/test';
import { demo, signedInClient } from './helpers';

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
