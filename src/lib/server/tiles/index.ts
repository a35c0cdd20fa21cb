/** The process's tile cache, from configuration, and the fire-and-forget build after intake. */
import { config } from '../config';
import { storage } from '../storage';
import { tileCache, type TileCache, type TileSource } from './tile-cache';

let instance: TileCache | undefined;

export function tiles(): TileCache {
	const c = config();
	instance ??= tileCache({ dir: c.TILE_CACHE_DIR, storage: storage(), maxPixels: c.UPLOAD_MAX_PIXELS });
	return instance;
}

/**
 * Start an original's pyramid in the background so the first zoom is quick. The upload has already
 * succeeded; a failure here only means the first tile request builds (and reports) it instead.
 */
export function warmTiles(source: TileSource): void {
	tiles()
		.ensure(source)
		.catch((err: unknown) => console.warn(`tile pyramid for ${source.sha256} not prebuilt:`, err instanceof Error ? err.message : err));
}

export type { TileCache, TileSource } from './tile-cache';

/**
 * A tile or region PNG: private (access-controlled) and immutable (keyed by the original's
 * content, which never changes).
 */
export function displayPngResponse(bytes: Buffer): Response {
	return new Response(new Uint8Array(bytes), {
		headers: {
			'content-type': 'image/png',
			'content-length': String(bytes.length),
			'cache-control': 'private, max-age=31536000, immutable',
			'x-content-type-options': 'nosniff'
		}
	});
}
