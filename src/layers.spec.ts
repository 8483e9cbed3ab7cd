// The layer rules of DEVELOPERS.md ("What may import what"), checked over the real import graph so
// that a change which breaks them fails `npm test`, not a later review.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const SRC = resolve(__dirname);
const LIB = join(SRC, 'lib');
const ROUTES = join(SRC, 'routes');

function filesUnder(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const full = join(dir, name);
		if (statSync(full).isDirectory()) return filesUnder(full);
		return /\.(ts|svelte)$/.test(name) && !/\.spec\.ts$/.test(name) && !name.endsWith('.d.ts') ? [full] : [];
	});
}

const EXTENSIONS = ['', '.ts', '.svelte', '.svelte.ts', '/index.ts'];
function resolveImport(from: string, spec: string): string | null {
	let base: string;
	if (spec === '$lib' || spec.startsWith('$lib/')) base = join(LIB, spec.slice(5));
	else if (spec.startsWith('.')) base = resolve(dirname(from), spec);
	else return null; // packages and SvelteKit's own modules
	for (const ext of EXTENSIONS) {
		const candidate = base + ext;
		try {
			if (statSync(candidate).isFile()) return candidate;
		} catch {
			/* try the next extension */
		}
	}
	return base; // a generated module (e.g. ./$types): kept by name
}

type Edge = { from: string; to: string; spec: string; typeOnly: boolean };
const IMPORT = /(?:^|\n)\s*(import|export)\s+(type\s+)?(?:[^'";]*?\s+from\s+)?['"]([^'"]+)['"]/g;
function importsOf(file: string): Edge[] {
	const text = readFileSync(file, 'utf8');
	const edges: Edge[] = [];
	for (const m of text.matchAll(IMPORT)) {
		const to = resolveImport(file, m[3]);
		if (to) edges.push({ from: file, to, spec: m[3], typeOnly: Boolean(m[2]) });
	}
	return edges;
}

const files = filesUnder(SRC);
const edges = files.flatMap(importsOf);
const rel = (f: string) => relative(SRC, f);
const show = (e: Edge) => `${rel(e.from)} → ${e.spec}`;

/** Server-only by SvelteKit's rules: $lib/server, *.server.ts, +server.ts and the hooks. */
const serverOnly = (f: string) => f.startsWith(join(LIB, 'server') + '/') || /\.server\.ts$/.test(f) || /\/\+server\.ts$/.test(f);
const inLibServer = (f: string) => f.startsWith(join(LIB, 'server') + '/');

describe('layers', () => {
	it('the graph was read (sanity: the checks below look at real files)', () => {
		expect(files.length).toBeGreaterThan(100);
		expect(edges.some((e) => rel(e.to) === 'lib/server/db/index.ts')).toBe(true);
	});

	it('no client file imports from $lib/server, not even a type', () => {
		const bad = edges.filter((e) => !serverOnly(e.from) && inLibServer(e.to));
		expect(bad.map(show)).toEqual([]);
	});

	it('no route imports another route’s files (shared UI lives in $lib/components)', () => {
		const bad = edges.filter((e) => e.from.startsWith(ROUTES) && e.to.startsWith(ROUTES) && dirname(e.to) !== dirname(e.from));
		expect(bad.map(show)).toEqual([]);
	});

	it('only the data modules under $lib/server touch the database client', () => {
		const db = join(LIB, 'server', 'db');
		const bad = edges.filter((e) => e.to.startsWith(db) && !e.typeOnly && !inLibServer(e.from) && !rel(e.from).startsWith('hooks.server'));
		expect(bad.map(show)).toEqual([]);
	});

	it('the hazard engine is pure: no database, environment, framework or other server module', () => {
		const hazard = join(LIB, 'server', 'hazard');
		const bad = edges.filter((e) => e.from.startsWith(hazard) && ((inLibServer(e.to) && !e.to.startsWith(hazard)) || /^\$env|^\$app|^@sveltejs/.test(e.spec)));
		const raw = files
			.filter((f) => f.startsWith(hazard))
			.flatMap((f) => [...readFileSync(f, 'utf8').matchAll(/from\s+['"](\$env[^'"]*|\$app[^'"]*|@sveltejs[^'"]*|postgres|drizzle-orm[^'"]*)['"]/g)].map((m) => `${rel(f)} → ${m[1]}`));
		expect([...bad.map(show), ...raw]).toEqual([]);
	});

	it('no import circle among the modules of $lib, type imports included', () => {
		const graph = new Map<string, string[]>();
		for (const e of edges) if (e.from.startsWith(LIB) && e.to.startsWith(LIB)) graph.set(e.from, [...(graph.get(e.from) ?? []), e.to]);
		const state = new Map<string, 'open' | 'done'>();
		const circles: string[] = [];
		const visit = (f: string, trail: string[]) => {
			if (state.get(f) === 'done') return;
			if (state.get(f) === 'open') {
				circles.push([...trail.slice(trail.indexOf(f)), f].map(rel).join(' → '));
				return;
			}
			state.set(f, 'open');
			for (const to of graph.get(f) ?? []) visit(to, [...trail, f]);
			state.set(f, 'done');
		};
		for (const f of graph.keys()) visit(f, []);
		expect(circles).toEqual([]);
	});
});

describe('one way per thing', () => {
	it('form failures use one `fail` (superforms’, which also drops files from the returned form)', () => {
		const twice = files.filter((f) => /import \{[^}]*\bfail\b[^}]*\} from '@sveltejs\/kit'/.test(readFileSync(f, 'utf8'))).map(rel);
		expect(twice).toEqual([]);
	});

	it('a form action answers a refusal through failForm only: `fail` itself carries nothing but an invalid superform', () => {
		const own = files
			.filter((f) => f.startsWith(ROUTES) || f.includes(join('lib', 'server')))
			.filter((f) => !f.endsWith(join('server', 'http', 'forms.ts')))
			.flatMap((f) => [...readFileSync(f, 'utf8').matchAll(/\bfail\(([^)]{0,60})|\brefused:/g)].filter((m) => !/^\d+, \{ (\w+Form|form)\b/.test(m[1] ?? '')).map((m) => `${rel(f)}: ${m[0]}`));
		expect(own).toEqual([]);
	});

	it('every data module’s `find` answers the record or a Failure, never null', () => {
		const finds = files
			.filter((f) => f.includes(join('lib', 'server')) && f.endsWith('.ts'))
			.flatMap((f) => {
				const text = readFileSync(f, 'utf8');
				const at = text.indexOf('export async function find(');
				if (at < 0) return [];
				const body = text.slice(at, text.indexOf('\n}\n', at));
				return /return null\b|\| null>/.test(body) || !/notFound\(|Failure/.test(body) ? [rel(f)] : [];
			});
		expect(finds).toEqual([]);
	});
});

describe('role rules', () => {
	it('pages, actions and endpoints ask the written abilities, never a role by name', async () => {
		const { routePolicy } = await import('$lib/server/auth/policy');
		const { abilities } = await import('$lib/abilities');
		const lists = Object.values(abilities) as readonly unknown[];
		const inline = files
			.filter((f) => f.startsWith(ROUTES) && /\/\+(page|layout)(\.server)?\.(ts|svelte)$|\/\+server\.ts$/.test(f))
			.flatMap((f) => [...readFileSync(f, 'utf8').matchAll(/\.role\s*[!=]==?\s*'\w+'|requireRole\(/g)].map((m) => `${rel(f)}: ${m[0]}`));
		const policyLists = Object.entries(routePolicy).flatMap(([route, rule]) =>
			[rule.read, rule.write].filter((a) => Array.isArray(a) && a.length && !lists.includes(a)).map(() => route)
		);
		expect({ inline, policyLists }).toEqual({ inline: [], policyLists: [] });
	});
});
