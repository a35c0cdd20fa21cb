/**
 * Receive one uploaded file from a multipart/form-data body (RFC 7578) into a temporary file,
 * digesting it on the way, without ever holding the whole file in memory. The part must be the
 * field `file`; one file per request keeps each upload's outcome (201, 200 duplicate or a 4xx)
 * unambiguous for a browser that shows one progress bar per file.
 */
import { createWriteStream } from 'node:fs';
import { mkdir, rm } from 'node:fs/promises';
import { randomUUID } from 'node:crypto';
import { basename, join } from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { ReadableStream as NodeWebStream } from 'node:stream/web';
import busboy from 'busboy';
import { InvalidError, TooLargeError, UnsupportedMediaError } from '../errors';
import { HashingStream, type Digests } from './hashing-stream';
import { SNIFF_BYTES } from './sniff';

export const FILE_FIELD = 'file';

export interface ReceivedFile {
	/** The temporary copy; the caller removes it when done. */
	path: string;
	originalName: string;
	digests: Digests;
}

export interface ReceiveOptions {
	tmpDir: string;
	maxBytes: number;
}

/** The client's file name as a label only: no folders, no control characters, at most 255 chars. */
export function cleanFileName(name: string | undefined): string {
	const cleaned = basename((name ?? '').replace(/\\/g, '/')).replace(/\p{Cc}/gu, '').trim();
	return cleaned.slice(0, 255) || 'unnamed';
}

/** The status a failed request body carries (adapter-node fails it with 413 past BODY_SIZE_LIMIT). */
const statusOf = (err: unknown) => (err as { status?: unknown }).status;

export async function receiveFile(request: Request, options: ReceiveOptions): Promise<ReceivedFile> {
	const contentType = request.headers.get('content-type') ?? '';
	if (!/^multipart\/form-data\s*;/i.test(contentType) || !request.body) {
		throw new UnsupportedMediaError(`Send the image as multipart/form-data in the field "${FILE_FIELD}"`);
	}
	await mkdir(options.tmpDir, { recursive: true });

	const parser = busboy({
		headers: { 'content-type': contentType },
		// Browsers send UTF-8 file names; busboy's default would read them as Latin-1.
		defParamCharset: 'utf8',
		limits: { files: 1, fileSize: options.maxBytes, fields: 16, fieldSize: 4096, parts: 20 }
	});

	let received: { path: string; name: string; hashing: HashingStream } | undefined;
	let tooLarge = false;
	let problem: Error | undefined;
	let writing: Promise<void> = Promise.resolve();

	parser.on('file', (field, stream, info) => {
		if (field !== FILE_FIELD) {
			problem ??= new InvalidError(`Unexpected file field "${field}"`, { [field]: [`Send the image in "${FILE_FIELD}"`] });
			stream.resume();
			return;
		}
		const path = join(options.tmpDir, `upload-${randomUUID()}`);
		const hashing = new HashingStream(SNIFF_BYTES);
		received = { path, name: info.filename, hashing };
		// Past the limit busboy stops handing us bytes and discards the rest of the body, so the
		// response can still be read by a client that is sending the remainder.
		stream.on('limit', () => (tooLarge = true));
		writing = pipeline(stream, hashing, createWriteStream(path, { flags: 'wx', mode: 0o600 })).catch((err) => {
			parser.destroy(err);
			throw err;
		});
		// Awaited below; a failure of the body itself must not leave this promise unhandled meanwhile.
		writing.catch(() => undefined);
	});
	parser.on('filesLimit', () => {
		problem ??= new InvalidError('Send one file per request', { [FILE_FIELD]: ['One file per request'] });
	});

	try {
		await pipeline(Readable.fromWeb(request.body as NodeWebStream<Uint8Array>), parser);
		await writing;
	} catch (err) {
		await discard(received?.path, writing);
		if (statusOf(err) === 413) throw new TooLargeError('The request body is larger than the server accepts');
		if (err instanceof Error && /multipart|boundary|unexpected end of form/i.test(err.message)) {
			throw new InvalidError(`Malformed multipart body: ${err.message}`);
		}
		throw err;
	}

	if (problem || tooLarge || !received) {
		await discard(received?.path, writing);
		if (problem) throw problem;
		if (tooLarge) throw new TooLargeError(`The file is larger than the limit of ${options.maxBytes} bytes`);
		throw new InvalidError(`No file: send the image in the multipart field "${FILE_FIELD}"`, {
			[FILE_FIELD]: ['Choose a file']
		});
	}
	return { path: received.path, originalName: cleanFileName(received.name), digests: received.hashing.digests() };
}

async function discard(path: string | undefined, writing: Promise<void>): Promise<void> {
	await writing.catch(() => undefined);
	if (path) await rm(path, { force: true });
}
