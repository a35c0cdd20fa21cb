/**
 * The zoom view's reads: a pyramid's manifest, one tile, a full-resolution region. Whoever may
 * see an item may zoom into it (the same rule as its preview); nothing here is recorded in the
 * custody ledger, because these are display values derived from the original, not the original.
 */
import type { Knex } from 'knex';
import type { SessionUser } from '../../roles';
import type { RegionQuery, TilePosition } from '../../schemas/tiles';
import { InvalidError, NotFoundError } from '../errors';
import type { ItemRow } from '../repositories/item.repository';
import { itemService } from '../services/item.service';
import type { ObjectStorage } from '../storage';
import type { TileCache } from './tile-cache';

const source = (item: ItemRow) => ({ sha256: item.sha256, storageKey: item.storageKey });

function displayNote(item: ItemRow): string {
	const base =
		'Tiles are 8-bit sRGB display values; level 0 holds the original\'s pixels one for one, each further level halves the one before (2 × 2 mean).';
	if (item.bitDepth === 16) return `${base} The original has 16-bit samples: these values are its 8-bit display conversion, not the stored samples.`;
	if (item.hasIcc) return `${base} The original's embedded ICC profile was converted to sRGB, so values may differ from the stored samples.`;
	return base;
}

export function tileService(knex: Knex, storage: ObjectStorage, cache: TileCache) {
	const items = itemService(knex, storage);

	return {
		async manifest(user: SessionUser, itemId: number) {
			const item = await items.get(user, itemId);
			const m = await cache.ensure(source(item));
			return {
				width: m.width,
				height: m.height,
				tileSize: m.tileSize,
				levels: m.levels,
				/** The original's sample depth; tiles are always 8-bit. */
				bitDepth: item.bitDepth,
				/** Samples per tile pixel: 3 (RGB) or 4 (RGB + alpha); a grey original is shown as equal R, G, B. */
				channels: m.channels,
				originalChannels: item.channels,
				note: displayNote(item)
			};
		},

		/** @throws NotFoundError for a position outside the level's grid (or a level that does not exist). */
		async tile(user: SessionUser, itemId: number, position: TilePosition): Promise<Buffer> {
			const item = await items.get(user, itemId);
			const bytes = await cache.tile(source(item), position.level, position.column, position.row);
			if (!bytes) throw new NotFoundError('Tile');
			return bytes;
		},

		/** @throws InvalidError naming the field when the rectangle leaves the image. */
		async region(user: SessionUser, itemId: number, rect: RegionQuery): Promise<Buffer> {
			const item = await items.get(user, itemId);
			const fields: Record<string, string[]> = {};
			if (rect.x >= item.width) fields.x = [`x must be below the image width ${item.width}`];
			if (rect.y >= item.height) fields.y = [`y must be below the image height ${item.height}`];
			if (!fields.x && rect.x + rect.width > item.width) fields.width = [`x + width must be at most the image width ${item.width}`];
			if (!fields.y && rect.y + rect.height > item.height) fields.height = [`y + height must be at most the image height ${item.height}`];
			if (Object.keys(fields).length) throw new InvalidError('The region leaves the image', fields);
			return cache.region(source(item), rect);
		}
	};
}
