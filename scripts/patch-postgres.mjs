// postgres.js 3.4.9 can crash the process when the database closes a connection under load: a small
// write deferred with setImmediate runs after the socket is gone (`socket.write` on null, thrown from
// a timer, so no caller can catch it), and a connection torn down with a write pending keeps a stale
// timer and buffer that stall or corrupt its next use. Upstream: porsager/postgres issues #1066,
// #1154, #1208 (fixes proposed, not released). Until a release has the fix, this guards the two
// places, idempotently, in both builds of the package; run by `postinstall` and by scripts/lib.sh.
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', 'node_modules', 'postgres');
const MARK = '/* beamwarden: guarded write */';
const fixes = [
	[
		'  function nextWrite(fn) {\n    const x = socket.write(chunk, fn)',
		`  function nextWrite(fn) {\n    ${MARK}\n    if (!socket) {\n      nextWriteTimer !== null && clearImmediate(nextWriteTimer)\n      chunk = nextWriteTimer = null\n      return false\n    }\n    const x = socket.write(chunk, fn)`
	],
	['    clearImmediate(nextWriteTimer)\n    if (socket) {', '    clearImmediate(nextWriteTimer)\n    chunk = nextWriteTimer = null\n    if (socket) {'],
	['    clearImmediate(nextWriteTimer)\n    socket.removeListener', '    clearImmediate(nextWriteTimer)\n    chunk = nextWriteTimer = null\n    socket.removeListener']
];

for (const file of ['src/connection.js', 'cjs/src/connection.js']) {
	const path = join(root, file);
	let text = readFileSync(path, 'utf8');
	if (text.includes(MARK)) continue;
	for (const [from, to] of fixes) {
		if (!text.includes(from)) {
			console.error(`patch-postgres: ${file} does not look like postgres.js 3.4.9; check whether the upstream fix was released and remove this script.`);
			process.exit(1);
		}
		text = text.replace(from, to);
	}
	writeFileSync(path, text);
	console.log(`patch-postgres: guarded ${file}`);
}
