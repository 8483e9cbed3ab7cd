import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/guard';
import { scopeOf } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import * as inspections from '$lib/server/inspections';
import * as procedures from '$lib/server/procedures';
import { contentDisposition } from '$lib/server/uploads';
import type { RequestHandler } from './$types';

/** Stored files, served with the type we detected, never sniffed, never run as a page. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const scope = await scopeOf(requireUser(locals));
	const doc = (await inspections.documentFor(scope, params.documentId)) ?? (await incidents.documentFor(scope, params.documentId)) ?? (await procedures.documentFor(scope, params.documentId));
	if (!doc) error(404, { message: 'No such document.' });
	const image = doc.mediaType.startsWith('image/');
	return new Response(new Uint8Array(doc.data), {
		headers: {
			'content-type': doc.mediaType,
			'content-length': String(doc.size),
			'content-disposition': contentDisposition(image ? 'inline' : 'attachment', doc.fileName),
			'x-content-type-options': 'nosniff',
			'content-security-policy': "default-src 'none'; sandbox",
			'cache-control': 'private, no-store'
		}
	});
};
