// Uploaded files. The type comes from the file's own bytes (file-type), never from its name or the
// browser's claim, against an allowlist. Images are measured from their header and refused above a
// pixel count before anything decodes them; the rest are decoded (sharp, with the same pixel limit)
// and re-encoded, which also drops what a camera or phone writes into a photo (place, device, time).
// PDFs are kept as sent and only ever served as attachments. The user's file name is metadata only.
import { createHash } from 'node:crypto';
import makeContentDisposition from 'content-disposition';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { failure, type Failure } from '$lib/server/http/failure';

export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;
/** 50 megapixels: above any phone or camera photo, far below a decompression bomb. */
export const MAX_IMAGE_PIXELS = 50_000_000;
export const allowedTypes = ['image/png', 'image/jpeg', 'image/webp', 'application/pdf'] as const;
export type AllowedType = (typeof allowedTypes)[number];

export type StoredUpload = { fileName: string; mediaType: AllowedType; size: number; sha256: string; width: number | null; height: number | null; data: Buffer };

/** The file's type from its bytes, when it is one we accept. */
export async function sniff(b: Buffer): Promise<AllowedType | null> {
	const found = await fileTypeFromBuffer(b);
	return found && (allowedTypes as readonly string[]).includes(found.mime) ? (found.mime as AllowedType) : null;
}

type ImageProblem = { reason: 'unreadable' } | { reason: 'too many pixels'; width: number; height: number };

/** Decode with the pixel limit, upright the photo as it was taken, and encode it again in its own format without metadata. */
export async function reencodeImage(data: Buffer, type: Exclude<AllowedType, 'application/pdf'>): Promise<{ ok: true; data: Buffer; width: number; height: number } | ({ ok: false } & ImageProblem)> {
	let header: sharp.Metadata;
	try {
		header = await sharp(data).metadata();
	} catch {
		return { ok: false, reason: 'unreadable' };
	}
	const { width, height } = header;
	if (!width || !height) return { ok: false, reason: 'unreadable' };
	if (width * height > MAX_IMAGE_PIXELS) return { ok: false, reason: 'too many pixels', width, height };
	try {
		const image = sharp(data, { limitInputPixels: MAX_IMAGE_PIXELS, failOn: 'error', animated: false }).rotate();
		const encoded = type === 'image/png' ? image.png() : type === 'image/webp' ? image.webp({ quality: 85 }) : image.jpeg({ quality: 85, mozjpeg: true });
		const { data: out, info } = await encoded.toBuffer({ resolveWithObject: true });
		return { ok: true, data: out, width: info.width, height: info.height };
	} catch {
		return { ok: false, reason: 'unreadable' };
	}
}

/** A file name fit to keep and to show: no path, no control or bidirectional-override characters. */
export function cleanFileName(name: string): string {
	const base = name.normalize('NFC').split(/[\\/]/).pop() ?? '';
	// Cc: control characters (CR, LF, NUL…); Cf: format characters, among them the bidi controls
	// (U+202A–202E, U+2066–2069, U+200E/200F, U+061C) that make "gnp.exe" display as "exe.png".
	const clean = base.replace(/[\p{Cc}\p{Cf}"]/gu, '').trim().slice(0, 200);
	return clean || 'upload';
}

/** Content-Disposition with an ASCII fallback and the UTF-8 name (RFC 6266 / 5987). */
export function contentDisposition(kind: 'inline' | 'attachment', fileName: string): string {
	return makeContentDisposition(cleanFileName(fileName), { type: kind });
}

/** Read the files of a form field; every refusal names the file and the reason. */
export async function readUploads(form: FormData, field: string, maxFiles = 8, only?: 'application/pdf'): Promise<{ ok: true; files: StoredUpload[] } | Failure> {
	const entries = form.getAll(field).filter((v): v is File => typeof v !== 'string' && v.size > 0);
	if (entries.length > maxFiles) return failure(400, `At most ${maxFiles} files at once.`, { [field]: `At most ${maxFiles} files at once.` });
	const files: StoredUpload[] = [];
	for (const f of entries) {
		const name = cleanFileName(f.name);
		if (f.size > MAX_UPLOAD_BYTES) return failure(413, `“${name}” is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MB.`, { [field]: `“${name}” is too large.` });
		let data: Buffer = Buffer.from(await f.arrayBuffer());
		const mediaType = await sniff(data);
		if (!mediaType) return failure(400, `“${name}” is not a PNG, JPEG, WebP or PDF file.`, { [field]: `“${name}” is not a PNG, JPEG, WebP or PDF file.` });
		// A field for PDFs only says so before trying to read an image.
		if (only && mediaType !== only) return failure(400, `“${name}” is not a PDF file.`, { [field]: `“${name}” is not a PDF file.` });
		let width: number | null = null;
		let height: number | null = null;
		if (mediaType !== 'application/pdf') {
			const image = await reencodeImage(data, mediaType);
			if (!image.ok && image.reason === 'too many pixels') {
				const message = `“${name}” is ${image.width} × ${image.height} pixels; at most ${MAX_IMAGE_PIXELS / 1_000_000} megapixels.`;
				return failure(400, message, { [field]: message });
			}
			if (!image.ok) return failure(400, `“${name}” is not a readable image.`, { [field]: `“${name}” is not a readable image.` });
			({ data, width, height } = image);
		}
		files.push({ fileName: name, mediaType, size: data.length, sha256: createHash('sha256').update(data).digest('hex'), width, height, data });
	}
	return { ok: true, files };
}

/**
 * One text file of a form field (a data file such as a limit set, never stored as a document): at
 * most `maxBytes`, strict UTF-8 and no NUL byte, so a binary file is named as such before anything parses it.
 */
export async function readTextUpload(form: FormData, field: string, maxBytes: number): Promise<{ ok: true; fileName: string; text: string } | Failure> {
	const entries = form.getAll(field).filter((v): v is File => typeof v !== 'string' && v.size > 0);
	if (entries.length === 0) return failure(400, 'Choose a file to upload.', { [field]: 'Choose a file to upload.' });
	if (entries.length > 1) return failure(400, 'Upload one file at a time.', { [field]: 'Upload one file at a time.' });
	const f = entries[0];
	const name = cleanFileName(f.name);
	if (f.size > maxBytes) {
		const message = `“${name}” is larger than ${maxBytes / 1024 / 1024} MB. Nothing was imported.`;
		return failure(413, message, { [field]: message });
	}
	const bytes = new Uint8Array(await f.arrayBuffer());
	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
	} catch {
		text = '\0';
	}
	if (text.includes('\0')) {
		const message = `“${name}” is not a text file (UTF-8). Nothing was imported.`;
		return failure(400, message, { [field]: message });
	}
	return { ok: true, fileName: name, text };
}
