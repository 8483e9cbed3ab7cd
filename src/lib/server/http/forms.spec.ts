import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { zod4 } from 'sveltekit-superforms/adapters';
import { stringify } from 'devalue';
import { readForm } from './forms';

function sources(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const p = join(dir, name);
		if (statSync(p).isDirectory()) return sources(p);
		return /\.ts$/.test(name) && !/\.spec\.ts$/.test(name) ? [p] : [];
	});
}

const post = (body: Record<string, string>) => new Request('http://x/', { method: 'POST', body: new URLSearchParams(body) });
const schema = z.object({
	name: z.string().min(1),
	line: z.object({ wavelength: z.string().min(1) }),
	items: z.array(z.object({ text: z.string().min(1), outcome: z.enum(['pass', 'fail']) })).min(1)
});

describe('reading form posts', () => {
	it('every form action reads its body through forms.ts (readForm or formFields), never superValidate(request) or request.formData() directly', () => {
		const offenders = [...sources('src/routes'), ...sources('src/lib/server')]
			.filter((f) => !f.endsWith(join('server', 'http', 'forms.ts')))
			.filter((f) => /superValidate\(\s*(event\.)?request\b|request\.formData\(\)/.test(readFileSync(f, 'utf8')));
		expect(offenders).toEqual([]);
	});

	it('answers a nested field sent as a plain field with an invalid form and a message, not an exception', async () => {
		const form = await readForm(post({ name: 'Kept', line: '{}' }), zod4(schema));
		expect(form.valid).toBe(false);
		expect(form.message).toMatch(/could not be read/);
		expect(form.data.name).toBe('Kept');
	});

	it('answers array items of unknown keys in the JSON part with an invalid form, keeping what was typed', async () => {
		for (const data of [{ name: 'Kept', line: { wavelength: '532 nm' }, items: [{ a: { b: {} } }] }, { name: 'Kept', items: [{ x: 1 }], line: [] }, { items: 'plain' }]) {
			const form = await readForm(post({ __superform_json: stringify(data) }), zod4(schema));
			expect(form.valid, JSON.stringify(data)).toBe(false);
			expect(form.message).toBeTruthy();
		}
		// what comes back can be shown again: every value in the schema's shape
		const odd = await readForm(post({ __superform_json: stringify({ name: 'Kept', line: [], items: [{ x: 1 }, { text: 'ok', outcome: 'pass' }, [1], 'str'] }) }), zod4(schema));
		expect(odd.data).toEqual({ name: 'Kept', line: { wavelength: '' }, items: [{ text: 'ok', outcome: 'pass' }] });
		const kept = await readForm(post({ __superform_json: stringify({ name: 'Kept', line: { wavelength: '532 nm' }, items: [{ a: { b: {} } }] }) }), zod4(schema));
		expect(kept.data.name).toBe('Kept');
		expect(kept.data.line.wavelength).toBe('532 nm');
	});

	it('answers a JSON part that is not devalue, and a body that is not a form at all', async () => {
		expect((await readForm(post({ __superform_json: '{not json' }), zod4(schema))).valid).toBe(false);
		const broken = new Request('http://x/', { method: 'POST', headers: { 'content-type': 'multipart/form-data; boundary=zzz' }, body: '--zzz\r\nnonsense' });
		expect((await readForm(broken, zod4(schema))).message).toMatch(/could not be read/);
	});

	it('never fills a field that was not posted with a made-up default: only the schema says what may be left out', async () => {
		const people = z.object({ role: z.enum(['researcher', 'officer']), labIds: z.array(z.string()).default([]), version: z.coerce.number().int() });
		for (const body of [{}, { version: '1' }, { __superform_json: stringify({ version: 1 }) }] as Record<string, string>[]) {
			const form = await readForm(post(body), zod4(people));
			expect(form.valid, JSON.stringify(body)).toBe(false);
			expect(form.errors.role).toBeTruthy();
		}
		const ok = await readForm(post({ role: 'officer', version: '3' }), zod4(people));
		expect(ok.valid).toBe(true);
		expect(ok.data).toEqual({ role: 'officer', labIds: [], version: 3 });
	});

	it('gives an ordinary invalid form a message too', async () => {
		const form = await readForm(post({ name: '' }), zod4(schema));
		expect(form.valid).toBe(false);
		expect(form.message).toBe('Some fields need attention.');
		expect(form.errors.name).toBeTruthy();
	});
});
