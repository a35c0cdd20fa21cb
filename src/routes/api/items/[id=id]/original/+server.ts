import { Readable } from 'node:stream';
import { db } from '$lib/server/db';
import { apiCall } from '$lib/server/http';
import { MEDIA_TYPES } from '$lib/server/intake/sniff';
import type { ItemRow } from '$lib/server/repositories/item.repository';
import { itemService } from '$lib/server/services/item.service';
import { storage } from '$lib/server/storage';
import type { RequestHandler } from './$types';

/**
 * Content-Disposition with an ASCII fallback and the exact name in `filename*` (RFC 6266 §4.3,
 * RFC 8187 encoding), so any name survives without breaking the header.
 */
function attachment(name: string): string {
	const fallback = name.replace(/[^\x20-\x7e]|["\\%]/g, '_');
	return `attachment; filename="${fallback}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}

function originalHeaders(item: ItemRow): HeadersInit {
	return {
		'content-type': MEDIA_TYPES[item.format],
		'content-length': String(item.sizeBytes),
		'content-disposition': attachment(item.originalName),
		// The digest of the representation (RFC 9530), so the receiver can check what arrived.
		'repr-digest': `sha-256=:${Buffer.from(item.sha256, 'hex').toString('base64')}:`,
		// no-store: each download must reach the server, where the ledger records it.
		'cache-control': 'private, no-store',
		'x-content-type-options': 'nosniff'
	};
}

/** The exact original bytes, never resized or re-encoded; every download is a custody event. */
export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const { item, body } = await itemService(db(), storage()).openOriginal(locals.user!, Number(params.id));
		return new Response(Readable.toWeb(body) as ReadableStream, { headers: originalHeaders(item) });
	});

/** Headers only: SvelteKit would otherwise answer HEAD with GET and record a download that sent nothing. */
export const HEAD: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const item = await itemService(db(), storage()).get(locals.user!, Number(params.id));
		return new Response(null, { headers: originalHeaders(item) });
	});
