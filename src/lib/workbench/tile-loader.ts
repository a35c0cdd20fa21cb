/**
 * Browser-side tile fetching for the zoom view: a few requests at a time, newest wishes first,
 * decoded bitmaps kept in a least-recently-used cache whose evicted bitmaps are closed, so memory
 * stays bounded however far a 50-megapixel original is explored. Pixel values for the readout are
 * read from full-resolution tiles decoded without colour conversion (the tiles are already sRGB).
 */

export interface TileKey {
	level: number;
	column: number;
	row: number;
}

const keyOf = (t: TileKey) => `${t.level}/${t.column}/${t.row}`;

export interface TileLoaderOptions {
	/** Where a tile is fetched from. */
	url: (tile: TileKey) => string;
	/** Called whenever a tile arrives, so the view can redraw. */
	onLoad: () => void;
	/** Bitmaps kept (256 × 256 × 4 bytes each: 256 ≈ 64 MB). @default 256 */
	capacity?: number;
	/** Requests in flight at once. @default 6 */
	concurrency?: number;
}

export class TileLoader {
	private readonly bitmaps = new Map<string, ImageBitmap>();
	private readonly pending = new Map<string, Promise<ImageBitmap | null>>();
	private readonly failed = new Set<string>();
	private readonly pixelData = new Map<string, ImageData>();
	private queue: TileKey[] = [];
	private active = 0;
	private disposed = false;
	private readonly capacity: number;
	private readonly concurrency: number;

	constructor(private readonly options: TileLoaderOptions) {
		this.capacity = options.capacity ?? 256;
		this.concurrency = options.concurrency ?? 6;
	}

	/** A loaded tile, marked as recently used; undefined while it is not loaded. */
	get(tile: TileKey): ImageBitmap | undefined {
		const key = keyOf(tile);
		const bitmap = this.bitmaps.get(key);
		if (bitmap) {
			this.bitmaps.delete(key);
			this.bitmaps.set(key, bitmap);
		}
		return bitmap;
	}

	/** The tiles the view needs now, most important first; earlier wishes not yet started are dropped. */
	want(tiles: TileKey[]): void {
		this.queue = tiles.filter((t) => {
			const key = keyOf(t);
			return !this.bitmaps.has(key) && !this.pending.has(key) && !this.failed.has(key);
		});
		this.pump();
	}

	/**
	 * The RGBA values of one full-resolution tile (fetched now if needed). Alpha is kept
	 * unpremultiplied, so opaque pixels read back exactly as stored in the PNG.
	 */
	async pixels(column: number, row: number): Promise<ImageData | null> {
		const tile = { level: 0, column, row };
		const key = keyOf(tile);
		const known = this.pixelData.get(key);
		if (known) return known;
		const bitmap = this.get(tile) ?? (await this.load(tile));
		if (!bitmap || this.disposed) return null;
		const canvas = typeof OffscreenCanvas === 'function' ? new OffscreenCanvas(bitmap.width, bitmap.height) : Object.assign(document.createElement('canvas'), { width: bitmap.width, height: bitmap.height });
		const context = canvas.getContext('2d', { willReadFrequently: true }) as CanvasRenderingContext2D | OffscreenCanvasRenderingContext2D | null;
		if (!context) return null;
		context.drawImage(bitmap, 0, 0);
		const data = context.getImageData(0, 0, bitmap.width, bitmap.height);
		this.pixelData.set(key, data);
		// A handful of decoded tiles is plenty for a moving cursor.
		if (this.pixelData.size > 16) this.pixelData.delete(this.pixelData.keys().next().value!);
		return data;
	}

	dispose(): void {
		this.disposed = true;
		this.queue = [];
		for (const bitmap of this.bitmaps.values()) bitmap.close();
		this.bitmaps.clear();
		this.pixelData.clear();
	}

	private pump(): void {
		while (this.active < this.concurrency && this.queue.length) {
			const tile = this.queue.shift()!;
			if (this.bitmaps.has(keyOf(tile)) || this.pending.has(keyOf(tile))) continue;
			void this.load(tile);
		}
	}

	private load(tile: TileKey): Promise<ImageBitmap | null> {
		const key = keyOf(tile);
		const running = this.pending.get(key);
		if (running) return running;
		this.active++;
		const request = this.fetchBitmap(tile)
			.then((bitmap) => {
				if (this.disposed) {
					bitmap.close();
					return null;
				}
				this.bitmaps.set(key, bitmap);
				this.evict();
				this.options.onLoad();
				return bitmap;
			})
			.catch(() => {
				// A tile that cannot be had is not asked for again; the coarser level stays shown.
				this.failed.add(key);
				return null;
			})
			.finally(() => {
				this.pending.delete(key);
				this.active--;
				if (!this.disposed) this.pump();
			});
		this.pending.set(key, request);
		return request;
	}

	private async fetchBitmap(tile: TileKey): Promise<ImageBitmap> {
		const response = await fetch(this.options.url(tile), { credentials: 'same-origin' });
		if (!response.ok) throw new Error(`tile ${keyOf(tile)}: HTTP ${response.status}`);
		return createImageBitmap(await response.blob(), { colorSpaceConversion: 'none', premultiplyAlpha: 'none' });
	}

	private evict(): void {
		while (this.bitmaps.size > this.capacity) {
			const [oldest, bitmap] = this.bitmaps.entries().next().value!;
			bitmap.close();
			this.bitmaps.delete(oldest);
		}
	}
}
