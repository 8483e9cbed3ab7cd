import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

// scripts/patch-postgres.mjs guards postgres.js against a crash when the database drops connections
// under load (tests/e2e/durability.spec.ts triggers it); every install must carry the guard.
describe('the installed postgres.js', () => {
	it('carries the guarded write in both of its builds', () => {
		for (const file of ['node_modules/postgres/src/connection.js', 'node_modules/postgres/cjs/src/connection.js']) {
			const text = readFileSync(file, 'utf8');
			expect(text, file).toContain('/* beamwarden: guarded write */');
			expect(text.match(/chunk = nextWriteTimer = null/g)?.length, file).toBe(4);
		}
	});
});
