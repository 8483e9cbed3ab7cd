import { defineConfig } from '@playwright/test';

// npm run test:scale: two app instances on one PostgreSQL (the test starts them itself, on free ports).
export default defineConfig({
	testDir: 'tests/scale',
	workers: 1,
	retries: 0,
	timeout: 240_000,
	reporter: [['list']]
});
