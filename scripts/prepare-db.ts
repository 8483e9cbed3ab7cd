// scripts/prepare-db.ts NAME [--fresh] [--seed]: (re)create a database of the project cluster,
// migrate it and optionally load the demo data. Used by the end-to-end server and benchmarks.
import postgres from 'postgres';
import { migrateDatabase } from './migrate';

const [name, ...flags] = process.argv.slice(2);
if (!name || !/^[a-z_][a-z0-9_]*$/.test(name)) {
	console.error('usage: tsx scripts/prepare-db.ts NAME [--fresh] [--seed]');
	process.exit(2);
}
const port = process.env.BEAMWARDEN_PGPORT ?? '54329';
const admin = postgres(`postgres://postgres@127.0.0.1:${port}/postgres`, { max: 1, onnotice: () => {} });
if (flags.includes('--fresh')) await admin.unsafe(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
const [{ exists }] = await admin`SELECT EXISTS (SELECT FROM pg_database WHERE datname = ${name}) AS exists`;
if (!exists) await admin.unsafe(`CREATE DATABASE ${name}`);
await admin.end();
await migrateDatabase(`postgres://postgres@127.0.0.1:${port}/${name}`);
if (flags.includes('--seed')) {
	process.env.DATABASE_URL = `postgres://beamwarden_app@127.0.0.1:${port}/${name}`;
	const { loadDemo } = await import('../seed/load');
	const { client } = await import('../src/lib/server/db');
	await loadDemo();
	await client.end();
}
console.log(`Database ${name} ready.`);
