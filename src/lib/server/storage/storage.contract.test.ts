/**
 * One contract, two back ends: local disk on a temporary folder, and the S3 client against s3rver
 * (a fake S3 server from npm) started in this process on a loopback port with a temporary folder.
 */
import { mkdtemp, rm, stat, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buffer } from 'node:stream/consumers';
import type { AddressInfo } from 'node:net';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { localStorage } from './local-storage';
import { s3Storage } from './s3-storage';
import { StorageNotFoundError, type ObjectStorage } from './storage';

interface Backend {
	name: string;
	open(dir: string): Promise<{ storage: ObjectStorage; close(): Promise<void> }>;
	/** Where the backend keeps a key's bytes on disk, when it keeps them as a plain file. */
	filePath?(dir: string, key: string): string;
}

const BUCKET = 'stillpoint-test';

const backends: Backend[] = [
	{
		name: 'local disk',
		open: async (dir) => ({ storage: localStorage(dir), close: async () => undefined }),
		filePath: (dir, key) => join(dir, key)
	},
	{
		name: 's3 (s3rver)',
		async open(dir) {
			const server = new S3rver({
				address: '127.0.0.1',
				port: 0,
				directory: dir,
				silent: true,
				configureBuckets: [{ name: BUCKET, configs: [] }]
			});
			const address: AddressInfo = await server.run();
			const storage = s3Storage({
				bucket: BUCKET,
				region: 'us-east-1',
				endpoint: `http://127.0.0.1:${address.port}`,
				// s3rver's built-in account (its documentation's default credentials).
				credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' }
			});
			return { storage, close: () => server.close() };
		}
	}
];

describe.each(backends)('ObjectStorage contract: $name', (backend) => {
	let dir: string;
	let scratch: string;
	let store: ObjectStorage;
	let close: () => Promise<void>;

	beforeAll(async () => {
		dir = await mkdtemp(join(tmpdir(), 'stillpoint-storage-'));
		scratch = await mkdtemp(join(tmpdir(), 'stillpoint-scratch-'));
		({ storage: store, close } = await backend.open(dir));
	});

	afterAll(async () => {
		await close();
		await rm(dir, { recursive: true, force: true });
		await rm(scratch, { recursive: true, force: true });
	});

	it('stores a buffer and reads back the same bytes, size and existence', async () => {
		const bytes = Buffer.from('first original bytes');
		expect(await store.putBuffer('originals/aa11', bytes, 'application/octet-stream')).toBe(true);
		expect(await store.exists('originals/aa11')).toBe(true);
		expect(await store.size('originals/aa11')).toBe(bytes.length);
		expect(await store.readBuffer('originals/aa11')).toEqual(bytes);
		expect(await buffer(await store.read('originals/aa11'))).toEqual(bytes);
	});

	it('copies a local file in', async () => {
		const bytes = Buffer.alloc(300_000, 7);
		const path = join(scratch, 'upload.bin');
		await writeFile(path, bytes);
		expect(await store.putFile('originals/bb22', path, 'image/tiff')).toBe(true);
		// Buffer#equals: vitest's deep equality walks large buffers byte by byte, for seconds.
		expect((await store.readBuffer('originals/bb22')).equals(bytes)).toBe(true);
	});

	it('is write-once: a second put answers false and leaves the first bytes', async () => {
		const first = Buffer.from('the original');
		await store.putBuffer('originals/cc33', first, 'application/octet-stream');
		expect(await store.putBuffer('originals/cc33', Buffer.from('a replacement'), 'application/octet-stream')).toBe(false);
		const path = join(scratch, 'other.bin');
		await writeFile(path, 'another replacement');
		expect(await store.putFile('originals/cc33', path, 'application/octet-stream')).toBe(false);
		expect(await store.readBuffer('originals/cc33')).toEqual(first);
	});

	it.each(['../escape', '/absolute', 'Upper/case', 'a//b', 'originals/', '', 'a/../b', 'spaces here'])(
		'rejects the key %j',
		async (key) => {
			await expect(store.putBuffer(key, Buffer.from('x'), 'text/plain')).rejects.toThrow(RangeError);
			await expect(store.exists(key)).rejects.toThrow(RangeError);
			await expect(store.readBuffer(key)).rejects.toThrow(RangeError);
		}
	);

	it('answers StorageNotFoundError for a missing key', async () => {
		expect(await store.exists('originals/missing')).toBe(false);
		await expect(store.read('originals/missing')).rejects.toBeInstanceOf(StorageNotFoundError);
		await expect(store.readBuffer('originals/missing')).rejects.toBeInstanceOf(StorageNotFoundError);
		await expect(store.size('originals/missing')).rejects.toBeInstanceOf(StorageNotFoundError);
	});

	it.runIf(backend.filePath)('leaves stored files read-only (mode 0444)', async () => {
		await store.putBuffer('previews/dd44-2048.png', Buffer.from('preview'), 'image/png');
		const { mode } = await stat(backend.filePath!(dir, 'previews/dd44-2048.png'));
		expect(mode & 0o777).toBe(0o444);
	});
});
