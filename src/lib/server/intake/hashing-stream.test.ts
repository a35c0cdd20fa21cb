import { createHash, randomBytes } from 'node:crypto';
import { Readable, Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { describe, expect, it } from 'vitest';
import { HashingStream } from './hashing-stream';

async function digestOf(chunks: Buffer[], headBytes?: number) {
	const hashing = new HashingStream(headBytes);
	const passed: Buffer[] = [];
	const sink = new Writable({
		write(chunk: Buffer, _enc, done) {
			passed.push(chunk);
			done();
		}
	});
	await pipeline(Readable.from(chunks), hashing, sink);
	return { ...hashing.digests(), passed: Buffer.concat(passed) };
}

describe('HashingStream', () => {
	it('digests "abc" to the published vectors', async () => {
		const d = await digestOf([Buffer.from('abc')]);
		// FIPS 180-4 example (NIST CSRC "SHA256.pdf", one-block message "abc").
		expect(d.sha256).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
		// RFC 1321 §A.5 test suite: MD5 ("abc").
		expect(d.md5).toBe('900150983cd24fb0d6963f7d28e17f72');
		expect(d.size).toBe(3);
	});

	it('digests the empty input to the published vectors', async () => {
		const d = await digestOf([]);
		// FIPS 180-4 / NIST: SHA-256 of the empty string; RFC 1321 §A.5: MD5 ("").
		expect(d.sha256).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
		expect(d.md5).toBe('d41d8cd98f00b204e9800998ecf8427e');
		expect(d.size).toBe(0);
	});

	it('agrees with node:crypto over many odd-sized chunks, passes the bytes unchanged and keeps the head', async () => {
		const bytes = randomBytes(1_000_003);
		const chunks: Buffer[] = [];
		for (let at = 0, n = 1; at < bytes.length; at += n, n = (n * 7 + 3) % 65_537) chunks.push(bytes.subarray(at, at + n));
		const d = await digestOf(chunks, 8);
		expect(d.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
		expect(d.md5).toBe(createHash('md5').update(bytes).digest('hex'));
		expect(d.size).toBe(bytes.length);
		expect(d.passed.equals(bytes)).toBe(true);
		expect(d.head.equals(bytes.subarray(0, 8))).toBe(true);
	});

	it('refuses to report digests before the input has ended', () => {
		expect(() => new HashingStream().digests()).toThrow(/not ended/);
	});
});
