// Applies the committed migrations as the owner role, then grants the app role what it may do:
// everything on the tables except rewriting or deleting audit rows.
import { drizzle } from 'drizzle-orm/postgres-js';
import { migrate } from 'drizzle-orm/postgres-js/migrator';
import postgres from 'postgres';

export async function migrateDatabase(ownerUrl: string, appRole = 'beamwarden_app') {
	const sql = postgres(ownerUrl, { max: 1, onnotice: () => {} });
	try {
		await sql`SELECT pg_advisory_lock(74201)`; // two starters never migrate at once
		await migrate(drizzle(sql), { migrationsFolder: 'drizzle' });
		const [{ exists }] = await sql`SELECT EXISTS (SELECT FROM pg_roles WHERE rolname = ${appRole}) AS exists`;
		if (exists) {
			const role = sql(appRole);
			await sql`GRANT USAGE ON SCHEMA public TO ${role}`;
			await sql`GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO ${role}`;
			await sql`GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO ${role}`;
			await sql`REVOKE UPDATE, DELETE, TRUNCATE ON audit_log FROM ${role}`;
		}
		await sql`SELECT pg_advisory_unlock(74201)`;
	} finally {
		await sql.end();
	}
}

if (import.meta.url === `file://${process.argv[1]}`) {
	const url = process.env.DATABASE_OWNER_URL;
	if (!url) {
		console.error('DATABASE_OWNER_URL is not set (the role that owns the schema).');
		process.exit(2);
	}
	await migrateDatabase(url);
	console.log('Migrations applied.');
}
