import { createHash } from 'node:crypto';
import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { InvalidError, TooLargeError, UnsupportedMediaError } from '../errors';
import { cleanFileName, receiveFile } from './multipart';

let tmpDir: string;
beforeAll(async () => {
	tmpDir = await mkdtemp(join(tmpdir(), 'stillpoint-multipart-'));
});
afterAll(() => rm(tmpDir, { recursive: true, force: true }));

function formRequest(parts: [field: string, bytes: Buffer | string, name?: string][]): Request {
	const form = new FormData();
	for (const [field, value, name] of parts) {
		if (typeof value === 'string') form.append(field, value);
		else form.append(field, new Blob([new Uint8Array(value)]), name);
	}
	return new Request('http://localhost/upload', { method: 'POST', body: form });
}

describe('receiveFile', () => {
	it('spools the file to the temporary folder with its digests, size, head and name', async () => {
		const bytes = Buffer.from('\x89PNG\r\n\x1a\n and the rest of a file');
		const got = await receiveFile(formRequest([['note', 'hello'], ['file', bytes, 'Überblick.png']]), { tmpDir, maxBytes: 1024 });
		expect(got.originalName).toBe('Überblick.png');
		expect(got.digests.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
		expect(got.digests.size).toBe(bytes.length);
		expect(got.digests.head.equals(bytes.subarray(0, 8))).toBe(true);
		expect((await readFile(got.path)).equals(bytes)).toBe(true);
		await rm(got.path);
	});

	it.each([
		['a file one byte over the limit', [['file', Buffer.alloc(101), 'big.bin']], TooLargeError],
		['two files', [['file', Buffer.from('a'), 'a.png'], ['file', Buffer.from('b'), 'b.png']], InvalidError],
		['a file in another field', [['upload', Buffer.from('a'), 'a.png']], InvalidError],
		['no file at all', [['note', 'just text']], InvalidError]
	] as const)('refuses %s and leaves no temporary file', async (_label, parts, error) => {
		await expect(
			receiveFile(formRequest(parts as unknown as [string, Buffer | string, string?][]), { tmpDir, maxBytes: 100 })
		).rejects.toBeInstanceOf(error);
		expect(await readdir(tmpDir)).toEqual([]);
	});

	it('refuses a body that is not multipart/form-data with 415', async () => {
		const request = new Request('http://localhost/upload', { method: 'POST', body: '{}', headers: { 'content-type': 'application/json' } });
		await expect(receiveFile(request, { tmpDir, maxBytes: 100 })).rejects.toBeInstanceOf(UnsupportedMediaError);
	});
});

describe('cleanFileName', () => {
	it.each([
		['C:\\cases\\042\\plate.tif', 'plate.tif'],
		['../../etc/passwd', 'passwd'],
		['bell\u0007name.jpg', 'bellname.jpg'],
		['', 'unnamed'],
		[undefined, 'unnamed']
	])('%j → %j', (input, expected) => {
		expect(cleanFileName(input)).toBe(expected);
	});
});
