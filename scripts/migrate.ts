// Applies the committed migrations as the owner role, then grants the app role what it may do:
// everything on the tables except rewriting or deleting audit rows.
import { drizzle } from 'drizzle-orm/postgres-js';
import { migrate } from 'drizzle-orm/postgres-js/migrator';
import PgBoss from 'pg-boss';
import postgres from 'postgres';
import { queueDefinitions } from '../src/lib/server/jobs/queues';

export async function migrateDatabase(ownerUrl: string, appRole = 'beamwarden_app') {
	const sql = postgres(ownerUrl, { max: 1, onnotice: () => {} });
	try {
		await sql`SELECT pg_advisory_lock(74201)`; // two starters never migrate at once
		await migrate(drizzle(sql), { migrationsFolder: 'drizzle' });
		await installJobQueue(ownerUrl);
		const [{ exists }] = await sql`SELECT EXISTS (SELECT FROM pg_roles WHERE rolname = ${appRole}) AS exists`;
		if (exists) {
			const role = sql(appRole);
			await sql`GRANT USAGE, CREATE ON SCHEMA pgboss TO ${role}`;
			await sql`GRANT ALL ON ALL TABLES IN SCHEMA pgboss TO ${role}`;
			await sql`GRANT ALL ON ALL SEQUENCES IN SCHEMA pgboss TO ${role}`;
			await sql`GRANT EXECUTE ON ALL FUNCTIONS IN SCHEMA pgboss TO ${role}`;
			await sql`GRANT USAGE ON SCHEMA public TO ${role}`;
			await sql`GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO ${role}`;
			await sql`GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO ${role}`;
			// Records a regulator may ask for are append-only for the app.
			for (const t of ['audit_log', 'review_decision', 'required_control', 'review_reply', 'procedure_version', 'procedure_signoff', 'authorisation_condition', 'authorisation_lapse'])
				await sql`REVOKE UPDATE, DELETE, TRUNCATE ON ${sql(t)} FROM ${role}`;
		}
		await sql`SELECT pg_advisory_unlock(74201)`;
	} finally {
		await sql.end();
	}
}

/** pg-boss's own schema and our queues, installed by the owner so the app role needs no DDL rights. */
async function installJobQueue(ownerUrl: string) {
	const boss = new PgBoss({ connectionString: ownerUrl, max: 1, supervise: false, schedule: false });
	boss.on('error', (e) => console.error('job queue install:', e.message));
	await boss.start();
	for (const q of queueDefinitions) if (!(await boss.getQueue(q.name))) await boss.createQueue(q.name, { name: q.name, policy: q.policy });
	await boss.stop({ graceful: false, wait: true });
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
