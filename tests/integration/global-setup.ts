// Runs once before the integration tests: a fresh test database (never the demo one), migrated.
import { execFileSync } from 'node:child_process';
import postgres from 'postgres';
import { migrateDatabase } from '../../scripts/migrate';
import { testDatabase } from './database';

export default async function setup() {
	execFileSync('bash', ['scripts/db.sh', 'start'], { stdio: 'inherit' });
	const admin = postgres(testDatabase.adminUrl, { max: 1, onnotice: () => {} });
	try {
		await admin.unsafe(`DROP DATABASE IF EXISTS ${testDatabase.name} WITH (FORCE)`);
		await admin.unsafe(`CREATE DATABASE ${testDatabase.name}`);
	} finally {
		await admin.end();
	}
	await migrateDatabase(testDatabase.ownerUrl);
}
