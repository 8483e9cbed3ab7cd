import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { png } from '../../../seed/png';
import { cleanFileName, contentDisposition, readTextUpload, readUploads, sniff } from './uploads';

const photo = (format: 'jpeg' | 'webp' | 'png', width = 64, height = 48) =>
	sharp({ create: { width, height, channels: 3, background: { r: 40, g: 120, b: 90 } } })[format]().toBuffer();
const upload = (data: Buffer | Uint8Array, name = 'photo') => {
	const form = new FormData();
	form.append('photos', new File([new Uint8Array(data)], name));
	return readUploads(form, 'photos');
};

describe('uploads', () => {
	it('recognises PNG, JPEG, WebP and PDF by their bytes, and nothing else', async () => {
		expect(await sniff(png(2, 3))).toBe('image/png');
		expect(await sniff(await photo('jpeg'))).toBe('image/jpeg');
		expect(await sniff(await photo('webp'))).toBe('image/webp');
		expect(await sniff(Buffer.from('%PDF-1.7\n1 0 obj\n<<>>\nendobj\n'))).toBe('application/pdf');
		expect(await sniff(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>'))).toBeNull();
		expect(await sniff(Buffer.from('<!doctype html><script>alert(1)</script>'))).toBeNull();
		expect(await sniff(Buffer.from('GIF89a\x01\x00\x01\x00', 'latin1'))).toBeNull();
	});

	it('refuses a type outside the allowlist whatever its name, and an image that does not decode', async () => {
		expect(await upload(Buffer.from('<svg/>'), 'photo.png')).toMatchObject({ ok: false, status: 400 });
		const truncated = (await photo('jpeg')).subarray(0, 40);
		expect(await upload(truncated, 'cut.jpg')).toMatchObject({ ok: false, status: 400 });
	});

	it('refuses a small file that claims a huge picture (10,000 × 10,000 pixels) before decoding it', async () => {
		const bomb = png(10000, 10000);
		expect(bomb.length).toBeLessThan(200 * 1024);
		const r = await upload(bomb, 'bomb.png');
		expect(r).toMatchObject({ ok: false, status: 400 });
		if (!r.ok) expect(r.message).toMatch(/10000 × 10000 pixels; at most 50 megapixels/);
	});

	it('re-encodes photos: what a phone wrote into them (such as the place) is gone, the picture stays', async () => {
		const tagged = await sharp(await photo('jpeg', 80, 60))
			.withExif({ IFD0: { Make: 'PhoneMaker', Copyright: 'Somebody' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1' } })
			.jpeg()
			.toBuffer();
		expect((await sharp(tagged).metadata()).exif).toBeDefined();
		expect(tagged.includes(Buffer.from('PhoneMaker'))).toBe(true);
		const r = await upload(tagged, 'IMG_0001.jpg');
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		const [file] = r.files;
		expect(file).toMatchObject({ mediaType: 'image/jpeg', width: 80, height: 60 });
		const meta = await sharp(file.data).metadata();
		expect(meta.exif).toBeUndefined();
		expect(file.data.includes(Buffer.from('PhoneMaker'))).toBe(false);
		expect(file.size).toBe(file.data.length);
	});

	it('turns a photo upright as it was taken before dropping its orientation tag', async () => {
		const sideways = await sharp(await photo('jpeg', 80, 60)).withMetadata({ orientation: 6 }).jpeg().toBuffer();
		const r = await upload(sideways, 'portrait.jpg');
		expect(r.ok && r.files[0]).toMatchObject({ width: 60, height: 80 });
	});

	it('keeps file names as safe metadata: no path, no control or bidirectional-override characters', async () => {
		expect(cleanFileName('C:\\x\\evil"\r\nname.pdf')).toBe('evilname.pdf');
		expect(cleanFileName('invoice\u202Efdp.exe')).toBe('invoicefdp.exe');
		expect(cleanFileName('\u2066a\u2069\u200Fb\u061C.png')).toBe('ab.png');
		const r = await upload(png(4, 4), '../../etc/bench\u202E photo.png');
		expect(r).toMatchObject({ ok: true });
		if (r.ok) expect(r.files[0]).toMatchObject({ fileName: 'bench photo.png', mediaType: 'image/png', width: 4, height: 4 });
	});

	it('sends names back in a safe Content-Disposition header', () => {
		expect(contentDisposition('attachment', 'Prüfbericht "A".pdf')).toBe(`attachment; filename="Prüfbericht A.pdf"`);
		expect(contentDisposition('inline', 'Bericht €\u202E.png')).toBe(`inline; filename="Bericht ?.png"; filename*=UTF-8''Bericht%20%E2%82%AC.png`);
	});
});

describe('text uploads (data files)', () => {
	const text = (parts: (Uint8Array | string)[], name = 'set.json', max = 1024) => {
		const form = new FormData();
		for (const p of parts) form.append('file', new File([typeof p === 'string' ? p : new Uint8Array(p)], name));
		return readTextUpload(form, 'file', max);
	};
	it('reads one UTF-8 file and keeps a clean file name', async () => {
		expect(await text(['{"a": "700 nm"}'], 'set\u202e.json')).toEqual({ ok: true, fileName: 'set.json', text: '{"a": "700 nm"}' });
	});
	it('refuses no file, two files, a binary file and a file over the limit, naming the reason', async () => {
		expect(await text([])).toMatchObject({ ok: false, status: 400, message: 'Choose a file to upload.' });
		expect(await text(['{}', '{}'])).toMatchObject({ ok: false, status: 400, message: 'Upload one file at a time.' });
		expect(await text([png(2, 2)], 'set.json')).toMatchObject({ ok: false, status: 400, message: '“set.json” is not a text file (UTF-8). Nothing was imported.' });
		expect(await text([new Uint8Array([0x7b, 0xff, 0xfe, 0x7d])])).toMatchObject({ ok: false, status: 400 });
		expect(await text(['x'.repeat(2 * 1024 * 1024 + 1)], 'big.json', 2 * 1024 * 1024)).toMatchObject({ ok: false, status: 413, message: '“big.json” is larger than 2 MB. Nothing was imported.' });
	});
});
