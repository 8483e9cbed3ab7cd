import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

const pgPort = process.env.BEAMWARDEN_PGPORT ?? '54329';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	server: { host: '127.0.0.1' },
	test: {
		projects: [
			{
				extends: './vite.config.ts',
				test: {
					name: 'unit',
					environment: 'node',
					include: ['src/**/*.spec.ts']
				}
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'integration',
					environment: 'node',
					include: ['tests/integration/**/*.test.ts'],
					globalSetup: ['tests/integration/global-setup.ts'],
					// The app's own role on the test database: the demo database is never touched.
					env: { DATABASE_URL: `postgres://beamwarden_app@127.0.0.1:${pgPort}/beamwarden_test` },
					fileParallelism: false,
					testTimeout: 30000,
					hookTimeout: 60000
				}
			}
		]
	}
});
