import { readFile, rm } from 'node:fs/promises';
import { join } from 'node:path';
import { json } from '@sveltejs/kit';
import { config } from '$lib/server/config';
import { apiCall } from '$lib/server/http';
import { receiveFile } from '$lib/server/intake/multipart';
import { kernelFromUpload, PSF_UPLOAD_MAX_BYTES } from '$lib/server/services/kernel-source.service';
import type { RequestHandler } from './$types';

/**
 * One PSF image (PNG, TIFF or JPEG, at most 8 MiB and 1024 × 1024 pixels) as multipart/form-data
 * in the field `file`, like an original's upload → `{kernel, source}`: the engine's
 * `{kind: 'image', origin: 'upload'}` spec and what the file was. Nothing is stored.
 */
export const POST: RequestHandler = ({ request }) =>
	apiCall(async () => {
		const received = await receiveFile(request, { tmpDir: join(config().STORAGE_DIR, 'tmp'), maxBytes: PSF_UPLOAD_MAX_BYTES });
		try {
			return json(await kernelFromUpload(await readFile(received.path), received.originalName));
		} finally {
			await rm(received.path, { force: true });
		}
	});
