import { describe, expect, it } from 'vitest';
import { png } from '../../../seed/png';
import { cleanFileName, contentDisposition, imageSize, readUploads, sniff } from './uploads';

describe('uploads', () => {
	it('recognises PNG, JPEG, WebP and PDF by their first bytes, and nothing else', () => {
		expect(sniff(png(2, 3))).toBe('image/png');
		expect(sniff(Buffer.from([0xff, 0xd8, 0xff, 0xe0]))).toBe('image/jpeg');
		expect(sniff(Buffer.from('RIFF\x00\x00\x00\x00WEBPVP8 ', 'latin1'))).toBe('image/webp');
		expect(sniff(Buffer.from('%PDF-1.7\n'))).toBe('application/pdf');
		expect(sniff(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>'))).toBeNull();
		expect(sniff(Buffer.from('<!doctype html><script>alert(1)</script>'))).toBeNull();
	});

	it('reads image dimensions from the header', () => {
		expect(imageSize(png(640, 480), 'image/png')).toEqual({ width: 640, height: 480 });
		// JPEG: SOI, an APP0 segment, then SOF0 with height 120 and width 160
		const jpeg = Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x04, 0x00, 0x00, 0xff, 0xc0, 0x00, 0x0b, 0x08, 0x00, 0x78, 0x00, 0xa0, 0x01, 0x01, 0x11, 0x00]);
		expect(imageSize(jpeg, 'image/jpeg')).toEqual({ width: 160, height: 120 });
	});

	it('refuses a type outside the allowlist whatever its name, and an oversized image', async () => {
		const form = new FormData();
		form.append('photos', new File(['<svg/>'], 'photo.png', { type: 'image/png' }));
		expect(await readUploads(form, 'photos')).toMatchObject({ ok: false, status: 400 });
		const big = new FormData();
		big.append('photos', new File([new Uint8Array(png(20000, 10))], 'wide.png'));
		expect(await readUploads(big, 'photos')).toMatchObject({ ok: false, status: 400 });
		const good = new FormData();
		good.append('photos', new File([new Uint8Array(png(4, 4))], '../../etc/bench photo.png'));
		const r = await readUploads(good, 'photos');
		expect(r).toMatchObject({ ok: true });
		if (r.ok) expect(r.files[0]).toMatchObject({ fileName: 'bench photo.png', mediaType: 'image/png', width: 4, height: 4 });
	});

	it('keeps file names as safe metadata and sends them back in a safe header', () => {
		expect(cleanFileName('C:\\x\\evil"\r\nname.pdf')).toBe('evilname.pdf');
		expect(contentDisposition('attachment', 'Prüfbericht "A".pdf')).toBe(`attachment; filename="Pr_fbericht _A_.pdf"; filename*=UTF-8''Pr%C3%BCfbericht%20%22A%22.pdf`);
	});
});
