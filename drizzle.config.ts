import { defineConfig } from 'drizzle-kit';

export default defineConfig({
	schema: './src/lib/server/db/schema/index.ts',
	out: './drizzle',
	dialect: 'postgresql',
	casing: 'snake_case',
	dbCredentials: { url: process.env.DATABASE_OWNER_URL ?? 'postgres://postgres@127.0.0.1:54329/beamwarden' },
	strict: true
});
