// The register's JSON API: lab scope (404, like an unknown id), bad input (400 with field messages), stale versions (409)
// and the documented answers (200/201).
import { expect, test, type APIRequestContext, type APIResponse } from '@playwright/test';
import { demoUsers } from '../../seed/demo';
import { demo, signedInClient } from './helpers';

const priya = demoUsers.find((u) => u.email.startsWith('priya'))!; // researcher in UFL and SPX
const tomas = demoUsers.find((u) => u.email.startsWith('tomas'))!; // researcher in HEL and MPC
let mine: APIRequestContext;
let other: APIRequestContext;
let officer: APIRequestContext;
let laserId: string;
let lineId: string;
let labId: string;

/** The same status and the same body (pages: with the per-request CSP nonce and request ids blanked). */
async function expectLikeUnknown(theirs: Promise<APIResponse>, unknown: Promise<APIResponse>) {
	const [a, b] = await Promise.all([theirs, unknown]);
	const blank = (t: string) => t.replace(/nonce="[^"]*"|nonce-[A-Za-z0-9+/=]+/g, 'nonce').replace(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/g, 'id');
	expect(a.status()).toBe(404);
	expect(b.status()).toBe(404);
	expect(blank(await a.text())).toBe(blank(await b.text()));
}

const line = { label: '', mode: 'continuous', wavelength: '633 nm', wavelengthMax: '', power: '20 mW', pulseEnergy: '', pulseDuration: '', repetitionRate: '', beamDiameter: '0.8 mm', beamDiameterDefinition: '1/e2', divergence: '1.2 mrad', divergenceDefinition: '1/e2', beamQuality: '' };
const element = { label: '', length: '', transmission: '', reflectance: '', magnification: '', focalLength: '', coreDiameter: '', numericalAperture: '', couplingTransmission: '' };
const pathBody = (overrides: Record<string, unknown> = {}) => ({
	lineIds: [lineId],
	lineChoiceReason: '',
	name: 'API path',
	purpose: '',
	nohdExposureDuration: '0.25 s',
	elements: [{ ...element, kind: 'propagate', length: '2 m' }],
	points: [{ key: 'k1', label: 'Viewer', kind: 'intrabeam', tissue: 'eye', position: '2 m', exposureDuration: '0.25 s', reflectance: '', viewingAngle: '', viewingDistance: '' }],
	version: 0,
	...overrides
});

test.beforeAll(async () => {
	mine = await signedInClient(priya);
	other = await signedInClient(tomas);
	officer = await signedInClient(demo('officer'));
	const me = await (await mine.get('/api/me')).json();
	labId = me.labs.find((l: { code: string }) => l.code === 'SPX').id;
	const created = await mine.post('/api/lasers', { data: { labId, maker: 'Test', model: 'HeNe 20', serial: `api-${Date.now()}`, laserClass: '3B', status: 'active', notes: '', line } });
	expect(created.status()).toBe(201);
	laserId = (await created.json()).id;
	lineId = (await (await mine.get(`/api/lasers/${laserId}`)).json()).lines[0].id;
});

test('lasers: documented answers, lab scope and field messages', async () => {
	const page = await (await mine.get('/api/lasers?band=visible&sort=updated&dir=desc&pageSize=5')).json();
	expect(page).toMatchObject({ page: 1, pageSize: 5 });
	expect(page.items.length).toBeGreaterThan(0);
	expect(Object.keys(page.items[0]).sort()).toEqual(['areaName', 'flaggedCount', 'id', 'labCode', 'labName', 'laserClass', 'lineCount', 'linesNeedingAttention', 'maker', 'model', 'pathCount', 'serial', 'staleCount', 'status', 'suspended', 'updatedAt', 'wavelengthMax', 'wavelengthMin']);
	// another lab's researcher sees neither the laser nor it in the list
	// exactly like an unknown id (status and body): another lab's records never reveal they exist
	await expectLikeUnknown(other.get(`/api/lasers/${laserId}`), other.get(`/api/lasers/${crypto.randomUUID()}`));
	await expectLikeUnknown(other.get(`/lasers/${laserId}`), other.get(`/lasers/${crypto.randomUUID()}`));
	const theirs = await (await other.get('/api/lasers?q=HeNe%2020')).json();
	expect(theirs.total).toBe(0);
	expect((await other.patch(`/api/lasers/${laserId}`, { data: { labId, maker: 'x', model: 'y', serial: '', laserClass: '4', status: 'active', notes: '', version: 1 } })).status()).toBe(404);
	// bad query and bad body
	const badQuery = await mine.get('/api/lasers?band=gamma&page=0');
	expect(badQuery.status()).toBe(400);
	expect(Object.keys((await badQuery.json()).fields).sort()).toEqual(['band', 'page']);
	const bad = await mine.post('/api/lasers', { data: { labId, maker: '', model: 'M', laserClass: '9', line: { ...line, power: '20 parsecs' }, role: 'admin' } });
	expect(bad.status()).toBe(400);
	const fields = (await bad.json()).fields;
	expect(Object.keys(fields)).toEqual(expect.arrayContaining(['maker', 'laserClass', 'line.power', '(body)']));
});

test('values the database cannot take are a 4xx with a message, and nothing is saved', async () => {
	const count = async () => (await (await officer.get('/api/lasers?pageSize=1')).json()).total;
	const before = await count();
	// A NUL character in a search, a power beyond what PostgreSQL's numeric holds, an unknown lab.
	expect((await mine.get('/api/lasers?q=%00')).status()).toBe(400);
	const huge = await mine.post('/api/lasers', { data: { labId, maker: 'Test', model: 'Huge', serial: '', laserClass: '4', status: 'active', notes: '', line: { ...line, power: '1e200000 W' } } });
	expect(huge.status()).toBe(400);
	expect((await huge.json()).message).toMatch(/not accepted|Some fields/);
	const moved = await officer.patch(`/api/lasers/${laserId}`, { data: { labId: '00000000-0000-4000-8000-000000000000', maker: 'Test', model: 'HeNe 20', serial: '', laserClass: '3B', status: 'active', notes: '', version: 999 } });
	expect(moved.status()).toBe(400);
	expect((await moved.json()).fields).toHaveProperty('labId');
	expect(await count()).toBe(before);
});

test('lasers: a stale edit answers 409 and loses nothing', async () => {
	const edit = (model: string) => ({ labId, maker: 'Test', model, serial: '', laserClass: '3B', status: 'active', notes: '', version: 1 });
	const first = await mine.patch(`/api/lasers/${laserId}`, { data: edit('HeNe 20 (renamed)') });
	expect(first.status()).toBe(200);
	expect((await first.json()).laser).toMatchObject({ model: 'HeNe 20 (renamed)', version: 2 });
	const second = await mine.patch(`/api/lasers/${laserId}`, { data: edit('lost update') });
	expect(second.status()).toBe(409);
	expect((await second.json()).message).toMatch(/changed this laser/);
	expect((await (await mine.get(`/api/lasers/${laserId}`)).json()).laser.model).toBe('HeNe 20 (renamed)');
});

test('beam paths: create, read, 400 naming the field, 409 on a stale version, 404 for another lab', async () => {
	const created = await mine.post(`/api/lasers/${laserId}/paths`, { data: pathBody() });
	expect(created.status()).toBe(201);
	const saved = await created.json();
	expect(saved).toMatchObject({ ok: true, version: 1 });
	expect(['within_limit', 'exceeds_limit', 'no_applicable_limit', 'incomplete']).toContain(saved.verdict);
	const read = await (await mine.get(`/api/paths/${saved.id}`)).json();
	expect(read.latest.verdict).toBe(saved.verdict);
	expect(read.latest.result.caution).toMatch(/not replace measurement|local code/i);

	const bad = await mine.put(`/api/paths/${saved.id}`, { data: pathBody({ version: 1, elements: [{ ...element, kind: 'transmission', transmission: '1.5' }] }) });
	expect(bad.status()).toBe(400);
	expect(Object.keys((await bad.json()).fields)).toContain('elements.0.transmission');

	expect((await mine.put(`/api/paths/${saved.id}`, { data: pathBody({ version: 1, name: 'first' }) })).status()).toBe(200);
	const stale = await mine.put(`/api/paths/${saved.id}`, { data: pathBody({ version: 1, name: 'second' }) });
	expect(stale.status()).toBe(409);
	expect((await (await mine.get(`/api/paths/${saved.id}`)).json()).path.name).toBe('first');

	await expectLikeUnknown(other.get(`/api/paths/${saved.id}`), other.get(`/api/paths/${crypto.randomUUID()}`));
	await expectLikeUnknown(other.get(`/paths/${saved.id}`), other.get(`/paths/${crypto.randomUUID()}`));
	await expectLikeUnknown(other.get(`/reviews/${saved.id}`), other.get(`/reviews/${crypto.randomUUID()}`));
	await expectLikeUnknown(other.put(`/api/paths/${saved.id}`, { data: pathBody({ version: 2 }) }), other.put(`/api/paths/${crypto.randomUUID()}`, { data: pathBody({ version: 2 }) }));
	await expectLikeUnknown(other.post(`/api/lasers/${laserId}/paths`, { data: pathBody() }), other.post(`/api/lasers/${crypto.randomUUID()}/paths`, { data: pathBody() }));
});

test('preview: the engine result with its working, or 400 naming the field', async () => {
	const line = { mode: 'continuous', wavelength: '532e-9', power: 5, beamDiameter: '0.002', beamDiameterDefinition: '1/e2', divergence: '0.001', divergenceDefinition: '1/e2' };
	const body = {
		path: {
			lines: [line],
			elements: [{ kind: 'propagate', length: 2 }],
			points: [{ id: 'p', position: 1, tissue: 'eye', exposureDuration: 0.25, kind: 'intrabeam' }],
			nohdExposureDuration: 0.25
		}
	};
	const ok = await mine.post('/api/assessments/preview', { data: body });
	expect(ok.status()).toBe(200);
	const preview = await ok.json();
	expect(preview.limitsSource).toBe('library');
	expect(preview.result.verdict).toBe('exceeds_limit'); // 5 W visible against the demo library
	expect(preview.result.points[0].breakdown.length).toBeGreaterThan(3);
	expect(preview.profile.samples.length).toBeGreaterThan(10);
	const bad = await mine.post('/api/assessments/preview', { data: { path: { ...body.path, lines: [{ ...line, wavelength: '5e-6', power: -1 }] } } });
	expect(bad.status()).toBe(400);
	expect(Object.keys((await bad.json()).fields)).toContain('lines.0.power');
	expect((await mine.post('/api/assessments/preview', { data: { ...body, extra: 1 } })).status()).toBe(400);
});

test('limits: officers only, 409 on a stale revision', async () => {
	const limit = {
		label: `API test limit ${Date.now()}`,
		tissue: 'skin',
		wavelengthMin: '190 nm',
		wavelengthMax: '200 nm',
		durationMin: '1 s',
		durationMax: '10 s',
		quantity: 'irradiance',
		k: '1 W/m²',
		n: '0',
		limitingAperture: '3.5 mm',
		pulseBasis: 'continuous',
		pulseTrainExponent: '',
		citation: 'test fixture',
		demonstration: true,
		validFrom: '',
		validUntil: '',
		version: 0
	};
	expect((await mine.post('/api/limits', { data: limit })).status()).toBe(403);
	const bad = await officer.post('/api/limits', { data: { ...limit, k: '-1 W/m²', wavelengthMax: '100 nm' } });
	expect(bad.status()).toBe(400);
	expect(Object.keys((await bad.json()).fields).sort()).toEqual(['k', 'wavelengthMax']);
	const created = await officer.post('/api/limits', { data: limit });
	expect(created.status()).toBe(201);
	const { id } = await created.json();
	expect((await officer.put(`/api/limits/${id}`, { data: { ...limit, version: 1, k: '2 W/m²' } })).status()).toBe(200);
	expect((await officer.put(`/api/limits/${id}`, { data: { ...limit, version: 1, k: '3 W/m²' } })).status()).toBe(409);
	const found = await (await mine.get(`/api/limits/${id}`)).json();
	expect(found.versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);
});
