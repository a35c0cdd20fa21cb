import { join } from 'node:path';
import { json } from '@sveltejs/kit';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { apiCall } from '$lib/server/http';
import { receiveFile } from '$lib/server/intake/multipart';
import { intakeService } from '$lib/server/services/intake.service';
import { itemJson, itemService } from '$lib/server/services/item.service';
import { storage } from '$lib/server/storage';
import { warmTiles } from '$lib/server/tiles';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const rows = await itemService(db(), storage()).listForCase(locals.user!, Number(params.id));
		return json({ items: rows.map((row) => itemJson(row, { withExif: false })) });
	});

/** One original per request, multipart field `file`: 201 when new, 200 `duplicate: true` when the case already holds these bytes. */
export const POST: RequestHandler = ({ locals, params, request }) =>
	apiCall(async () => {
		const c = config();
		const intake = intakeService(db(), storage(), { maxPixels: c.UPLOAD_MAX_PIXELS });
		const { item, duplicate } = await intake.ingest(locals.user!, Number(params.id), () =>
			receiveFile(request, { tmpDir: join(c.STORAGE_DIR, 'tmp'), maxBytes: c.UPLOAD_MAX_BYTES })
		);
		// The zoom view's pyramid, started now so the first zoom is quick; never fails the upload.
		if (!duplicate) warmTiles({ sha256: item.sha256, storageKey: item.storageKey });
		return json(
			{ ...itemJson(item, { withExif: true }), duplicate },
			{ status: duplicate ? 200 : 201, headers: { location: `/api/items/${item.id}` } }
		);
	});
