// The app's routes, read from src/routes (pages, their named form actions, JSON endpoints), and a
// set of real record ids to fill their parameters. Shared by the access matrix and the fuzz tests,
// so a new route or action is covered by both without editing them.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import postgres from 'postgres';
import type { APIRequestContext } from '@playwright/test';
import { demo } from './helpers';

export type Endpoint = { routeId: string; kind: 'page' | 'api'; method: string; action?: string };

export function discover(dir = 'src/routes'): Endpoint[] {
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
				if (block) {
					const actions = [...block.matchAll(/^\t(\w+): async function/gm)].map((m) => m[1]);
					// Actions are named functions (DEVELOPERS.md); one written otherwise would escape these tests.
					if (actions.length === 0) throw new Error(`${id}: actions not written as \`name: async function name(…)\``);
					for (const action of actions) found.push({ routeId: id, kind: 'page', method: 'POST', action });
				}
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

export const e2eDatabaseUrl = () => `postgres://beamwarden_app@127.0.0.1:${process.env.BEAMWARDEN_PGPORT ?? '54329'}/beamwarden_e2e`;

/** Real ids for every route parameter: records the demo researcher may see (their lab's laser, line, path), a limit, an inspection with a document. */
export async function sampleIds(admin: APIRequestContext): Promise<Record<string, string>> {
	const list = (await (await admin.get('/api/admin/users')).json()) as { users: { id: string; email: string }[] };
	const inventory = await (await admin.get('/api/lasers?q=Solace')).json();
	const laser = await (await admin.get(`/api/lasers/${inventory.items[0].id}`)).json();
	const { limits } = await (await admin.get('/api/limits')).json();
	// Records without a JSON listing are looked up in the end-to-end database itself.
	const sql = postgres(e2eDatabaseUrl(), { max: 1 });
	const [spx] = await sql`SELECT i.id AS inspection_id, d.id AS document_id FROM inspection i JOIN area a ON a.id = i.area_id JOIN lab l ON l.id = a.lab_id LEFT JOIN document d ON d.entity_id = i.id::text WHERE l.code = 'SPX' AND d.id IS NOT NULL LIMIT 1`;
	const [goggles] = await sql`SELECT id FROM eyewear LIMIT 1`;
	const [incident] = await sql`SELECT id FROM incident WHERE state <> 'draft' ORDER BY number LIMIT 1`;
	// Procedures, authorisations and areas of the demo researcher's lab SPX.
	const [spxArea] = await sql`SELECT a.id FROM area a JOIN lab l ON l.id = a.lab_id WHERE l.code = 'SPX' LIMIT 1`;
	const [spxProcedure] = await sql`SELECT p.id FROM procedure p JOIN lab l ON l.id = p.lab_id WHERE l.code = 'SPX' LIMIT 1`;
	const [spxAuthorisation] = await sql`SELECT a.id FROM authorisation a JOIN lab l ON l.id = a.lab_id WHERE l.code = 'SPX' LIMIT 1`;
	// The demo has no limit-set import until a test uploads one; an unknown id answers 404 to officers.
	const [limitImport] = await sql`SELECT id FROM limit_import ORDER BY created_at LIMIT 1`;
	// A register import, when a test has made one (else an unknown id: the route answers 404 to officers).
	const [registerImport] = await sql`SELECT id FROM register_import ORDER BY created_at LIMIT 1`;
	const [snapshot] = await sql`SELECT id FROM assessment WHERE path_id = ${laser.paths[0].id} ORDER BY created_at DESC LIMIT 1`;
	await sql.end();
	return {
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
		importId: limitImport?.id ?? '00000000-0000-4000-8000-000000000000',
		registerImportId: registerImport?.id ?? '00000000-0000-4000-8000-000000000017',
		snapshotId: snapshot.id,
		token: 'not-a-real-token'
	};
}

/** The URL of a route (and action) with its parameters filled from the sample ids. */
export function urlOf(routeId: string, sample: Record<string, string>, action?: string) {
	const path = routeId.replace(/\/\([^)]+\)/g, '').replace(/\[(\w+)\]/g, (_, name: string) => sample[name]) || '/';
	return action && action !== 'default' ? `${path}?/${action}` : path;
}
