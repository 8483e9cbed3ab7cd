// Every form action that takes files is allowed an upload-sized body; every other post keeps the
// small limit. Found from the code: an action that reads uploads but is missing from the list would
// answer 413 to any real photo or PDF.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { bodyLimitFor, DATA_FILE_LIMIT, FORM_AND_JSON_LIMIT, UPLOAD_LIMIT } from './bodyLimit';

function files(dir: string): string[] {
	return readdirSync(dir).flatMap((n) => (statSync(join(dir, n)).isDirectory() ? files(join(dir, n)) : [join(dir, n)]));
}

/** Actions (route id, action name) whose body reaches readUploads, directly or through the incident form helpers. */
function uploadActionsInCode(): [string, string][] {
	const out: [string, string][] = [];
	for (const f of files('src/routes').filter((f) => f.endsWith('+page.server.ts'))) {
		const text = readFileSync(f, 'utf8');
		const routeId = '/' + f.replace(/^src\/routes\//, '').replace(/\/?\+page\.server\.ts$/, '');
		for (const m of text.matchAll(/^\t(\w+): async function \w+\([^)]*\) \{([\s\S]*?)^\t\}/gm))
			if (/readUploads\(|saveReportForm\(|closeActionFromForm\(/.test(m[2])) out.push([routeId.replace(/\/$/, ''), m[1]]);
	}
	return out;
}

describe('body limits', () => {
	it('every action that reads uploads takes an upload-sized body', () => {
		const found = uploadActionsInCode();
		expect(found.length).toBeGreaterThanOrEqual(6);
		for (const [routeId, action] of found) expect(bodyLimitFor(routeId, new URL(`http://x/?/${action}`)), `${routeId} ?/${action}`).toBe(UPLOAD_LIMIT);
	});

	it('other posts keep the small limit', () => {
		expect(bodyLimitFor('/(app)/procedures/[procedureId]', new URL('http://x/?/sign'))).toBe(FORM_AND_JSON_LIMIT);
		expect(bodyLimitFor('/api/paths/[pathId]', new URL('http://x/'))).toBe(FORM_AND_JSON_LIMIT);
		expect(bodyLimitFor('/(app)/limits/import/[importId]', new URL('http://x/?/publish'))).toBe(FORM_AND_JSON_LIMIT);
	});

	it('every action that reads a data file takes a body of the file limit and its form, far below an upload', () => {
		const found: [string, string][] = [];
		for (const f of files('src/routes').filter((f) => f.endsWith('+page.server.ts'))) {
			const routeId = '/' + f.replace(/^src\/routes\//, '').replace(/\/?\+page\.server\.ts$/, '');
			for (const m of readFileSync(f, 'utf8').matchAll(/^\t(\w+): async function \w+\([^)]*\) \{([\s\S]*?)^\t\}/gm)) if (/readTextUpload\(/.test(m[2])) found.push([routeId, m[1]]);
		}
		expect(found).toEqual([['/(app)/limits/import', 'upload']]);
		for (const [routeId, action] of found) expect(bodyLimitFor(routeId, new URL(`http://x/?/${action}`))).toBe(DATA_FILE_LIMIT);
		expect(DATA_FILE_LIMIT).toBeLessThan(3 * 1024 * 1024);
	});
});
