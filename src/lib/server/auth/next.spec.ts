import { describe, expect, it } from 'vitest';
import { safeNext } from './next';

const origin = 'http://127.0.0.1:3000';

describe('the page after sign-in', () => {
	it('keeps a path of this site, with its query and fragment', () => {
		expect(safeNext('/limits', origin)).toBe('/limits');
		expect(safeNext('/lasers?lab=x&page=2#top', origin)).toBe('/lasers?lab=x&page=2#top');
	});
	it('never leaves the site, whatever the browser would make of the text (WHATWG URL parsing)', () => {
		for (const next of ['//evil.example', '/\\evil.example', '/\t/evil.example', '/\n/evil.example', '/\r\n/evil.example', 'https://evil.example/', 'javascript:alert(1)', '', null])
			expect(safeNext(next, origin), JSON.stringify(next)).toBe('/overview');
	});
});
