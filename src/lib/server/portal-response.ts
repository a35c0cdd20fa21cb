/** HTTP responses for portal files: attachments carry the ledger's digest (RFC 9530 Repr-Digest). */
import type { PortalFile } from './services/portal.service';

export function portalFileResponse(file: PortalFile): Response {
	const headers: Record<string, string> = {
		'content-type': file.contentType,
		'content-length': String(file.bytes.length),
		'content-disposition': `attachment; filename="${file.filename}"`,
		'cache-control': 'private, no-store'
	};
	if (file.sha256) headers['repr-digest'] = `sha-256=:${Buffer.from(file.sha256, 'hex').toString('base64')}:`;
	return new Response(new Uint8Array(file.bytes), { headers });
}

export function portalPictureResponse(png: Buffer): Response {
	return new Response(new Uint8Array(png), {
		headers: { 'content-type': 'image/png', 'cache-control': 'private, no-store', 'x-content-type-options': 'nosniff' }
	});
}
