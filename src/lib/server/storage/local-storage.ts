/**
 * Local-disk storage: one file per key under a root folder, made read-only once written. A new
 * object is written to a temporary name and linked into place, so a crash never leaves a partial
 * file under a real key, and `link` fails rather than replacing an existing object.
 */
import { createReadStream } from 'node:fs';
import { chmod, copyFile, link, mkdir, readFile, stat, unlink, writeFile } from 'node:fs/promises';
import { randomUUID } from 'node:crypto';
import { dirname, join, resolve } from 'node:path';
import type { Readable } from 'node:stream';
import { assertValidKey, StorageNotFoundError, type ObjectStorage } from './storage';

export function localStorage(root: string): ObjectStorage {
	const base = resolve(root);
	const pathOf = (key: string) => {
		assertValidKey(key);
		return join(base, key);
	};

	async function place(key: string, write: (tmp: string) => Promise<void>): Promise<boolean> {
		const target = pathOf(key);
		await mkdir(dirname(target), { recursive: true });
		const tmp = join(dirname(target), `.incoming-${randomUUID()}`);
		try {
			await write(tmp);
			await chmod(tmp, 0o444);
			await link(tmp, target);
			return true;
		} catch (err) {
			if ((err as NodeJS.ErrnoException).code === 'EEXIST') return false;
			throw err;
		} finally {
			await unlink(tmp).catch(() => undefined);
		}
	}

	async function existing(key: string): Promise<string> {
		const path = pathOf(key);
		try {
			await stat(path);
			return path;
		} catch {
			throw new StorageNotFoundError(key);
		}
	}

	return {
		putFile: (key, localPath) => place(key, (tmp) => copyFile(localPath, tmp)),
		putBuffer: (key, bytes) => place(key, (tmp) => writeFile(tmp, bytes)),
		async exists(key) {
			return stat(pathOf(key)).then(
				() => true,
				() => false
			);
		},
		async read(key): Promise<Readable> {
			return createReadStream(await existing(key));
		},
		async readBuffer(key) {
			return readFile(await existing(key));
		},
		async size(key) {
			return (await stat(await existing(key))).size;
		}
	};
}
