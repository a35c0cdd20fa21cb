import { Readable } from 'node:stream';
import { db } from '$lib/server/db';
import { apiCall } from '$lib/server/http';
import { itemService } from '$lib/server/services/item.service';
import { storage } from '$lib/server/storage';
import type { RequestHandler } from './$types';

/** The display derivative. Its key is a content address, so a cached copy never goes stale. */
export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const { item, body } = await itemService(db(), storage()).openPreview(locals.user!, Number(params.id));
		return new Response(Readable.toWeb(body) as ReadableStream, {
			headers: {
				'content-type': 'image/png',
				// private: the preview is access-controlled, so shared caches must not keep it.
				'cache-control': 'private, max-age=31536000, immutable',
				etag: `"${item.previewKey}"`,
				'x-content-type-options': 'nosniff'
			}
		});
	});
