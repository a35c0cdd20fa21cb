/**
 * Where originals, results and previews live. Keys are content addresses chosen by the caller
 * (e.g. `originals/<sha256>`); objects are write-once: putting an existing key is a no-op that
 * reports `false`, never an overwrite, so an original can never be replaced.
 */
import type { Readable } from 'node:stream';

export interface StoredObject {
	key: string;
	size: number;
}

export interface ObjectStorage {
	/** Copy a local file in under `key` unless the key exists. Returns whether it was written. */
	putFile(key: string, localPath: string, contentType: string): Promise<boolean>;
	putBuffer(key: string, bytes: Buffer, contentType: string): Promise<boolean>;
	exists(key: string): Promise<boolean>;
	/** Stream an object's bytes; throws StorageNotFoundError for a missing key. */
	read(key: string): Promise<Readable>;
	readBuffer(key: string): Promise<Buffer>;
	size(key: string): Promise<number>;
}

export class StorageNotFoundError extends Error {
	constructor(readonly key: string) {
		super(`stored object not found: ${key}`);
		this.name = 'StorageNotFoundError';
	}
}

/** Keys are plain relative paths of [a-z0-9._-] segments: no traversal, no surprises on S3. */
export function assertValidKey(key: string): void {
	if (!/^[a-z0-9][a-z0-9._-]*(\/[a-z0-9][a-z0-9._-]*)*$/.test(key) || key.includes('..')) {
		throw new RangeError(`invalid storage key: ${JSON.stringify(key)}`);
	}
}
