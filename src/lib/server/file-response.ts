/** Streams a stored file (a run's master or preview) as an HTTP response. */
import { Readable } from 'node:stream';
import type { StoredFile } from './services/run.service';

export function fileResponse(file: StoredFile, contentType: string, disposition: 'attachment' | 'inline'): Response {
	const headers: Record<string, string> = {
		'content-type': contentType,
		'content-length': String(file.size),
		'content-disposition': `${disposition}; filename="${file.filename}"`,
		// Evidence is not left in shared caches or on a shared machine's disk.
		'cache-control': 'private, no-store'
	};
	// The receiver can check the bytes against the ledger (RFC 9530 Repr-Digest, base64 of the raw digest).
	if (file.sha256) headers['repr-digest'] = `sha-256=:${Buffer.from(file.sha256, 'hex').toString('base64')}:`;
	return new Response(Readable.toWeb(file.body) as ReadableStream, { headers });
}
