// The built app: no external URLs in served pages, no server code or secrets in the client bundle.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { expect, test } from '@playwright/test';
import { demo, signedInClient } from './helpers';

function files(dir: string): string[] {
	return readdirSync(dir).flatMap((n) => (statSync(join(dir, n)).isDirectory() ? files(join(dir, n)) : [join(dir, n)]));
}

test('the client bundle holds no server code or secrets', () => {
	const client = files('build/client').filter((f) => /\.(js|css|html)$/.test(f));
	expect(client.length).toBeGreaterThan(5);
	for (const f of client) {
		const text = readFileSync(f, 'utf8');
		expect(text, f).not.toMatch(/DATABASE_URL|password_hash|argon2|drizzle-orm|postgres:\/\//i);
	}
});

test('pages load nothing from another host, and the font is served by the app', async () => {
	const officer = await signedInClient(demo('officer'));
	for (const path of ['/overview', '/limits']) {
		const html = await (await officer.get(path)).text();
		const external = [...html.matchAll(/(?:src|href)="(https?:)?\/\/[^"]*"/g)].map((m) => m[0]);
		expect(external, path).toEqual([]);
	}
	const css = files('build/client').filter((f) => f.endsWith('.css')).map((f) => readFileSync(f, 'utf8')).join('\n');
	expect(css).toMatch(/font-family:\s*Atkinson Hyperlegible/);
	const fontUrls = [...css.matchAll(/url\(([^)]+)\)/g)].map((m) => m[1]);
	expect(fontUrls.length).toBeGreaterThan(0);
	expect(fontUrls.filter((u) => /^["']?(https?:)?\/\//.test(u))).toEqual([]);
});
