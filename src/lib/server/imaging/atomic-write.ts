import { randomBytes } from 'node:crypto';
import { rename, unlink, writeFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';

/**
 * Write several files so that none appears until all bytes are on disk: each goes to a hidden
 * temporary file in its own directory (same file system, so rename is atomic on POSIX) and is
 * renamed into place only after every write succeeded. On failure the temporaries are removed,
 * so a crash or a full disk never leaves a partial result that could be mistaken for a real one.
 */
export async function writeFilesAtomically(files: { path: string; bytes: Uint8Array | string }[]): Promise<void> {
	const temps = files.map((f) => join(dirname(f.path), `.${basename(f.path)}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`));
	try {
		for (let i = 0; i < files.length; i++) await writeFile(temps[i], files[i].bytes, { flag: 'wx' });
		for (let i = 0; i < files.length; i++) await rename(temps[i], files[i].path);
	} catch (e) {
		await Promise.all(temps.map((t) => unlink(t).catch(() => undefined)));
		throw e;
	}
}
