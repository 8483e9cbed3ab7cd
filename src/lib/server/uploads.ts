// Uploaded files: the type comes from the file's own first bytes (never from its name or the
// browser's claim), against an allowlist; images have their dimensions read from the header
// before anything decodes them. The user's file name is kept as metadata only.
import { createHash } from 'node:crypto';
import { failure, type Failure } from './failure';

export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;
export const MAX_IMAGE_SIDE = 10000;
export const allowedTypes = ['image/png', 'image/jpeg', 'image/webp', 'application/pdf'] as const;
export type AllowedType = (typeof allowedTypes)[number];

export type StoredUpload = { fileName: string; mediaType: AllowedType; size: number; sha256: string; width: number | null; height: number | null; data: Buffer };

export function sniff(b: Buffer): AllowedType | null {
	if (b.length >= 8 && b.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'image/png';
	if (b.length >= 3 && b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff) return 'image/jpeg';
	if (b.length >= 12 && b.toString('latin1', 0, 4) === 'RIFF' && b.toString('latin1', 8, 12) === 'WEBP') return 'image/webp';
	if (b.length >= 5 && b.toString('latin1', 0, 5) === '%PDF-') return 'application/pdf';
	return null;
}

/** Width and height from the image header, or null when the header is not readable. */
export function imageSize(b: Buffer, type: AllowedType): { width: number; height: number } | null {
	try {
		if (type === 'image/png') return b.toString('latin1', 12, 16) === 'IHDR' ? { width: b.readUInt32BE(16), height: b.readUInt32BE(20) } : null;
		if (type === 'image/jpeg') {
			let i = 2;
			while (i + 9 < b.length) {
				if (b[i] !== 0xff) return null;
				const marker = b[i + 1];
				const length = b.readUInt16BE(i + 2);
				// SOF0–SOF15 carry the frame size; C4 (DHT), C8 and CC are not frames.
				if (marker >= 0xc0 && marker <= 0xcf && ![0xc4, 0xc8, 0xcc].includes(marker)) return { height: b.readUInt16BE(i + 5), width: b.readUInt16BE(i + 7) };
				i += 2 + length;
			}
			return null;
		}
		if (type === 'image/webp') {
			const chunk = b.toString('latin1', 12, 16);
			if (chunk === 'VP8X') return { width: 1 + b.readUIntLE(24, 3), height: 1 + b.readUIntLE(27, 3) };
			if (chunk === 'VP8 ') return { width: b.readUInt16LE(26) & 0x3fff, height: b.readUInt16LE(28) & 0x3fff };
			if (chunk === 'VP8L') {
				const bits = b.readUInt32LE(21);
				return { width: 1 + (bits & 0x3fff), height: 1 + ((bits >> 14) & 0x3fff) };
			}
			return null;
		}
	} catch {
		return null;
	}
	return null;
}

/** A file name fit to keep and to send back in a header: no path, no control characters. */
export function cleanFileName(name: string): string {
	const base = name.split(/[\\/]/).pop() ?? '';
	// eslint-disable-next-line no-control-regex
	const clean = base.replace(/[\u0000-\u001f\u007f"]/g, '').trim().slice(0, 200);
	return clean || 'upload';
}

/** Content-Disposition with an ASCII fallback and the UTF-8 name (RFC 6266 / 5987). */
export function contentDisposition(kind: 'inline' | 'attachment', fileName: string): string {
	const ascii = fileName.replace(/[^\x20-\x7e]/g, '_').replace(/[\\"]/g, '_');
	return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}

/** Read the files of a form field; every refusal names the file and the reason. */
export async function readUploads(form: FormData, field: string, maxFiles = 8): Promise<{ ok: true; files: StoredUpload[] } | Failure> {
	const entries = form.getAll(field).filter((v): v is File => typeof v !== 'string' && v.size > 0);
	if (entries.length > maxFiles) return failure(400, `At most ${maxFiles} files at once.`, { [field]: `At most ${maxFiles} files at once.` });
	const files: StoredUpload[] = [];
	for (const f of entries) {
		const name = cleanFileName(f.name);
		if (f.size > MAX_UPLOAD_BYTES) return failure(413, `“${name}” is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MB.`, { [field]: `“${name}” is too large.` });
		const data = Buffer.from(await f.arrayBuffer());
		const mediaType = sniff(data);
		if (!mediaType) return failure(400, `“${name}” is not a PNG, JPEG, WebP or PDF file.`, { [field]: `“${name}” is not a PNG, JPEG, WebP or PDF file.` });
		let width: number | null = null;
		let height: number | null = null;
		if (mediaType !== 'application/pdf') {
			const size = imageSize(data, mediaType);
			if (!size || size.width < 1 || size.height < 1) return failure(400, `“${name}” is not a readable image.`, { [field]: `“${name}” is not a readable image.` });
			if (size.width > MAX_IMAGE_SIDE || size.height > MAX_IMAGE_SIDE)
				return failure(400, `“${name}” is ${size.width} × ${size.height} pixels; at most ${MAX_IMAGE_SIDE} on a side.`, { [field]: `“${name}” has too many pixels.` });
			({ width, height } = size);
		}
		files.push({ fileName: name, mediaType, size: data.length, sha256: createHash('sha256').update(data).digest('hex'), width, height, data });
	}
	return { ok: true, files };
}
