// How large a request body may be, by kind of route. JSON endpoints and form posts carry a few
// hundred kB at most; only the upload actions take files. A larger body answers 413: at once when
// its Content-Length says so, otherwise as soon as the streamed bytes pass the limit.
// (adapter-node's BODY_SIZE_LIMIT stays the outer ceiling; set it at least to UPLOAD_LIMIT.)
import { MAX_LIMIT_SET_BYTES } from '$lib/schemas/limitSet';

export const FORM_AND_JSON_LIMIT = 256 * 1024;
export const UPLOAD_LIMIT = 40 * 1024 * 1024;
/** A limit-set file (at most MAX_LIMIT_SET_BYTES) and the form around it. */
export const DATA_FILE_LIMIT = MAX_LIMIT_SET_BYTES + 64 * 1024;

/** Form actions that take a data file (JSON), by route id: a smaller limit than photos and PDFs. */
const dataFileActions: Record<string, readonly string[]> = {
	'/(app)/limits/import': ['upload']
};

/** Form actions that take files, by route id. */
const uploadActions: Record<string, readonly string[]> = {
	'/(app)/inspections/[inspectionId]': ['photos'],
	'/(app)/incidents/report': ['save'],
	'/(app)/incidents/[incidentId]/edit': ['save'],
	'/(app)/incidents/[incidentId]': ['photos', 'closeAction'],
	'/(app)/incidents': ['closeAction'],
	'/(app)/procedures/[procedureId]': ['attach'],
	'/(app)/lasers/import': ['upload']
};

export const tooLargeMessage = 'The request is too large. Nothing was saved.';

export function bodyLimitFor(routeId: string | null, url: URL): number {
	if (!routeId || !(routeId in uploadActions || routeId in dataFileActions)) return FORM_AND_JSON_LIMIT;
	const action = [...url.searchParams.keys()].find((k) => k.startsWith('/'))?.slice(1) ?? 'default';
	if (uploadActions[routeId]?.includes(action)) return UPLOAD_LIMIT;
	if (dataFileActions[routeId]?.includes(action)) return DATA_FILE_LIMIT;
	return FORM_AND_JSON_LIMIT;
}

export class BodyTooLarge extends Error {
	readonly status = 413;
	constructor(limit: number) {
		super(`request body over ${limit} bytes`);
	}
}

/** Whether a failure to read a body was its size (ours, or adapter-node's BODY_SIZE_LIMIT). */
export function isTooLarge(e: unknown): boolean {
	for (let cur: unknown = e, depth = 0; cur && depth < 5; depth++) {
		if ((cur as { status?: unknown }).status === 413) return true;
		cur = (cur as { cause?: unknown }).cause;
	}
	return false;
}

/** A copy of the request whose body stream fails with BodyTooLarge once more than `limit` bytes have passed. */
export function withBodyLimit(request: Request, limit: number): Request {
	if (!request.body) return request;
	const source = request.body.getReader();
	let seen = 0;
	const counted = new ReadableStream<Uint8Array>({
		async pull(controller) {
			const { done, value } = await source.read();
			if (done) return controller.close();
			seen += value.byteLength;
			if (seen <= limit) return controller.enqueue(value);
			controller.error(new BodyTooLarge(limit));
			void drain(source);
		},
		cancel: (reason) => source.cancel(reason)
	});
	return new Request(request, { body: counted, duplex: 'half' } as RequestInit);
}

/**
 * Read and discard what is left of a refused body (adapter-node's BODY_SIZE_LIMIT bounds it), so the
 * client, still sending, receives our 413 instead of a reset connection (cancelling the body would
 * destroy the socket).
 */
export async function drain(body: ReadableStream<Uint8Array> | ReadableStreamDefaultReader<Uint8Array> | null): Promise<void> {
	if (!body) return;
	const reader = 'getReader' in body ? body.getReader() : body;
	try {
		while (!(await reader.read()).done) {
			/* discard */
		}
	} catch {
		/* the client went away */
	}
}
