import { describe, expect, it } from 'vitest';
import { procedureHtml } from './richText';

describe('procedure text', () => {
	it('keeps headings (one level down), lists, emphasis and tables', () => {
		const html = procedureHtml('# Before you start\n\n1. Put on the goggles\n2. Close the shutter\n\n- **never** look into the beam\n- *always* use a card\n\n| Step | Who |\n| --- | --- |\n| 1 | LSO |');
		expect(html).toContain('<h2>Before you start</h2>');
		expect(html).toContain('<ol>');
		expect(html).toContain('<li>Put on the goggles</li>');
		expect(html).toContain('<strong>never</strong>');
		expect(html).toContain('<em>always</em>');
		expect(html).toContain('<td>LSO</td>');
	});

	it('removes scripts, event handlers, styles, frames, forms and unsafe links', () => {
		const evil = [
			'<script>alert(1)</script>',
			'<img src=x onerror="alert(2)">',
			'<p onclick="alert(3)" style="color:red">text</p>',
			'<iframe src="https://evil.example"></iframe>',
			'<form action="https://evil.example"><input name=a></form>',
			'[click](javascript:alert(4))',
			'<a href="data:text/html,<script>alert(5)</script>">data</a>',
			'<svg><script>alert(6)</script></svg>',
			'<style>body{display:none}</style>',
			'<a href="//evil.example/x">protocol-relative</a>'
		].join('\n\n');
		const html = procedureHtml(evil);
		expect(html).not.toMatch(/<script|onerror|onclick|style=|<iframe|<form|<input|<img|<svg|<style|javascript:|data:text|href="\/\//i);
		expect(html).toContain('text');
	});

	it('keeps ordinary links, marked so the page they open cannot reach back', () => {
		expect(procedureHtml('[manual](https://example.org/manual.pdf)')).toBe('<p><a href="https://example.org/manual.pdf" rel="noopener noreferrer nofollow">manual</a></p>\n');
	});
});
