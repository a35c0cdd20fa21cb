/**
 * The tile cache: one pyramid per original, in `<TILE_CACHE_DIR>/v<version>/<sha256>/`. It is a
 * derivative, never evidence — deleting the folder only costs a rebuild. Keyed by the original's
 * SHA-256, so two items holding the same bytes share one pyramid and a tile never goes stale.
 *
 * A pyramid is built once: concurrent requests for the same original wait for the same build
 * (single flight), builds run one at a time per process (a 100 MP original decodes to ~400 MB),
 * and a build writes into a temporary folder that is renamed into place only when complete, so a
 * reader never sees half a pyramid and a crash leaves only a `.building-*` folder to delete.
 */
import { randomUUID } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdir, readFile, rename, rm } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { pipeline } from 'node:stream/promises';
import sharp from 'sharp';
import type { Region } from '../../imaging/estimation/region';
import type { ObjectStorage } from '../storage';
import { buildPyramid, PYRAMID_VERSION, tileFileName, type PyramidManifest } from './pyramid';

/** The original a pyramid is made from: its content address and where storage keeps it. */
export interface TileSource {
	sha256: string;
	storageKey: string;
}

export interface TileCacheOptions {
	dir: string;
	storage: ObjectStorage;
	maxPixels: number;
}

const isMissing = (err: unknown) => (err as NodeJS.ErrnoException).code === 'ENOENT';
const alreadyPlaced = (err: unknown) => ['ENOTEMPTY', 'EEXIST'].includes((err as NodeJS.ErrnoException).code ?? '');

export function tileCache({ dir, storage, maxPixels }: TileCacheOptions) {
	const root = join(resolve(dir), `v${PYRAMID_VERSION}`);
	const pyramidDir = (sha256: string) => {
		if (!/^[0-9a-f]{64}$/.test(sha256)) throw new RangeError(`not a SHA-256: ${sha256}`);
		return join(root, sha256);
	};
	const manifests = new Map<string, PyramidManifest>();
	const inFlight = new Map<string, Promise<PyramidManifest>>();
	let queue: Promise<unknown> = Promise.resolve();

	async function readManifest(sha256: string): Promise<PyramidManifest | null> {
		try {
			const manifest = JSON.parse(await readFile(join(pyramidDir(sha256), 'manifest.json'), 'utf8')) as PyramidManifest;
			return manifest.version === PYRAMID_VERSION ? manifest : null;
		} catch (err) {
			if (isMissing(err)) return null;
			throw err;
		}
	}

	async function build(source: TileSource): Promise<PyramidManifest> {
		await mkdir(root, { recursive: true });
		const work = join(root, `.building-${source.sha256}-${randomUUID()}`);
		try {
			await mkdir(work);
			// A local copy: libvips reads a file at random, and S3 storage only streams.
			const copy = join(work, 'original');
			await pipeline(await storage.read(source.storageKey), createWriteStream(copy));
			const manifest = await buildPyramid(copy, work, maxPixels);
			await rm(copy);
			try {
				await rename(work, pyramidDir(source.sha256));
			} catch (err) {
				// Another process finished the same pyramid first; theirs is identical.
				if (!alreadyPlaced(err)) throw err;
			}
			return manifest;
		} finally {
			await rm(work, { recursive: true, force: true });
		}
	}

	async function ensure(source: TileSource): Promise<PyramidManifest> {
		const known = manifests.get(source.sha256);
		if (known) return known;
		let pending = inFlight.get(source.sha256);
		if (!pending) {
			pending = (async () => {
				const onDisk = await readManifest(source.sha256);
				if (onDisk) return onDisk;
				const turn = queue.then(() => build(source));
				queue = turn.catch(() => undefined);
				return turn;
			})();
			inFlight.set(source.sha256, pending);
			pending.then(
				(manifest) => manifests.set(source.sha256, manifest),
				() => undefined
			).finally(() => inFlight.delete(source.sha256));
		}
		return pending;
	}

	function inGrid(manifest: PyramidManifest, level: number, column: number, row: number): boolean {
		const l = manifest.levels[level];
		return l !== undefined && column < l.columns && row < l.rows;
	}

	return {
		/** The pyramid's manifest, building the pyramid first if needed. */
		ensure,

		/** One tile's PNG bytes, or null for a position outside the level's grid. */
		async tile(source: TileSource, level: number, column: number, row: number): Promise<Buffer | null> {
			const manifest = await ensure(source);
			if (!inGrid(manifest, level, column, row)) return null;
			return readFile(join(pyramidDir(source.sha256), tileFileName(level, column, row)));
		},

		/**
		 * A full-resolution rectangle as PNG, assembled from level-0 tiles, so its values are the
		 * tiles' display values exactly. The caller checks the rectangle lies inside the image.
		 */
		async region(source: TileSource, rect: Region): Promise<Buffer> {
			const manifest = await ensure(source);
			const { tileSize, channels } = manifest;
			const out = Buffer.alloc(rect.width * rect.height * channels);
			const firstColumn = Math.floor(rect.x / tileSize);
			const lastColumn = Math.floor((rect.x + rect.width - 1) / tileSize);
			const firstRow = Math.floor(rect.y / tileSize);
			const lastRow = Math.floor((rect.y + rect.height - 1) / tileSize);
			for (let row = firstRow; row <= lastRow; row++) {
				for (let column = firstColumn; column <= lastColumn; column++) {
					const file = join(pyramidDir(source.sha256), tileFileName(0, column, row));
					const { data, info } = await sharp(file).raw().toBuffer({ resolveWithObject: true });
					const tileLeft = column * tileSize;
					const tileTop = row * tileSize;
					const left = Math.max(rect.x, tileLeft);
					const right = Math.min(rect.x + rect.width, tileLeft + info.width);
					const top = Math.max(rect.y, tileTop);
					const bottom = Math.min(rect.y + rect.height, tileTop + info.height);
					for (let y = top; y < bottom; y++) {
						const from = ((y - tileTop) * info.width + (left - tileLeft)) * channels;
						const to = ((y - rect.y) * rect.width + (left - rect.x)) * channels;
						data.copy(out, to, from, from + (right - left) * channels);
					}
				}
			}
			return sharp(out, { raw: { width: rect.width, height: rect.height, channels: channels as 3 | 4 } })
				.png()
				.toBuffer();
		}
	};
}

export type TileCache = ReturnType<typeof tileCache>;
