// Procedure text: people write it as Markdown (headings, lists, emphasis, tables); it is turned
// into HTML and then sanitised with sanitize-html against a short allowlist every time it is
// shown, so no HTML a person typed (raw tags inside the Markdown included) reaches a page unchecked.
import { Marked } from 'marked';
import sanitizeHtml from 'sanitize-html';

const markdown = new Marked({ gfm: true, breaks: false, async: false });

// The page's own heading is the h1: a procedure's "#" becomes an h2, and so on down.
const shift = (to: string) => (_tag: string, attribs: sanitizeHtml.Attributes) => ({ tagName: to, attribs });

const policy: sanitizeHtml.IOptions = {
	allowedTags: ['h2', 'h3', 'h4', 'h5', 'h6', 'p', 'br', 'hr', 'ul', 'ol', 'li', 'strong', 'em', 'b', 'i', 'del', 'code', 'pre', 'blockquote', 'table', 'thead', 'tbody', 'tr', 'th', 'td', 'a'],
	allowedAttributes: { a: ['href', 'rel'], ol: ['start'] },
	allowedSchemes: ['http', 'https', 'mailto'],
	allowProtocolRelative: false,
	disallowedTagsMode: 'discard',
	transformTags: {
		h1: shift('h2'),
		h2: shift('h3'),
		h3: shift('h4'),
		h4: shift('h5'),
		h5: shift('h6'),
		a: sanitizeHtml.simpleTransform('a', { rel: 'noopener noreferrer nofollow' })
	}
};

/** Safe HTML for a procedure's Markdown text. */
export function procedureHtml(text: string): string {
	const html = markdown.parse(text) as string;
	return sanitizeHtml(html, policy);
}
