/**
 * Reading originals: who may see an item (whoever may see its case), its JSON form, and the two
 * ways its bytes leave the server — the display preview, and the exact original as an attachment,
 * which the custody ledger records as a dissemination.
 */
import type { Knex } from 'knex';
import type { Readable } from 'node:stream';
import type { SessionUser } from '../../roles';
import { systemClock, type Clock } from '../clock';
import { DomainError, NotFoundError } from '../errors';
import { itemRepository, type ItemRow } from '../repositories/item.repository';
import type { ObjectStorage } from '../storage';
import { reportRepository } from '../repositories/report.repository';
import { caseService } from './case.service';
import { assertClientMayRead } from './item-access';
import { custodyService } from './custody.service';

/** What the API answers for an item; `exif` only on the single-item read, to keep lists small. */
export function itemJson(row: ItemRow, options: { withExif: boolean }) {
	return {
		id: row.id,
		caseId: row.caseId,
		originalName: row.originalName,
		sha256: row.sha256,
		md5: row.md5,
		sizeBytes: row.sizeBytes,
		format: row.format,
		width: row.width,
		height: row.height,
		bitDepth: row.bitDepth,
		channels: row.channels,
		hasIcc: row.hasIcc,
		analysis: row.analysis,
		...(options.withExif ? { exif: row.exif } : {}),
		uploadedBy: { id: row.uploadedBy, name: row.uploadedByName },
		createdAt: row.createdAt,
		previewUrl: row.previewKey ? `/api/items/${row.id}/preview` : null,
		originalUrl: `/api/items/${row.id}/original`
	};
}

export type ItemJson = ReturnType<typeof itemJson>;

export function itemService(knex: Knex, storage: ObjectStorage, clock: Clock = systemClock) {
	const items = itemRepository(knex);
	const cases = caseService(knex, clock);
	const custody = custodyService(knex, clock);

	async function visibleItem(user: SessionUser, itemId: number): Promise<ItemRow> {
		const item = await items.findById(itemId);
		if (!item) throw new NotFoundError('Item');
		try {
			await cases.get(user, item.caseId);
		} catch (err) {
			// An item in a case the caller cannot see is, to them, no item at all.
			if (err instanceof DomainError && err.status === 404) throw new NotFoundError('Item');
			throw err;
		}
		await assertClientMayRead(knex, user, item);
		return item;
	}

	return {
		get: visibleItem,

		async listForCase(user: SessionUser, caseId: number): Promise<ItemRow[]> {
			await cases.get(user, caseId);
			const all = await items.listForCase(caseId);
			if (user.role !== 'client') return all;
			const released = await reportRepository(knex).releasedItemIds(caseId);
			return all.filter((item) => released.has(item.id));
		},

		async openPreview(user: SessionUser, itemId: number): Promise<{ item: ItemRow; body: Readable }> {
			const item = await visibleItem(user, itemId);
			if (!item.previewKey) throw new NotFoundError('Preview');
			return { item, body: await storage.read(item.previewKey) };
		},

		/** The stored original, byte for byte; the download is recorded before the first byte leaves. */
		async openOriginal(user: SessionUser, itemId: number): Promise<{ item: ItemRow; body: Readable }> {
			const item = await visibleItem(user, itemId);
			const body = await storage.read(item.storageKey);
			await custody.record({
				action: 'original_downloaded',
				actor: { id: user.id, role: user.role },
				caseId: item.caseId,
				itemId: item.id,
				detail: { name: item.originalName, size: item.sizeBytes },
				hashBefore: item.sha256,
				hashAfter: item.sha256
			});
			return { item, body };
		}
	};
}
