import { demoUsers } from './demo';

for (const u of demoUsers) console.log(`    ${u.role.padEnd(11)} ${u.email.padEnd(34)} ${u.password}`);
