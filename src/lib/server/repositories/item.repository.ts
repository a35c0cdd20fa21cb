/** All SQL touching `items` (originals). Items are inserted once and never updated. */
import type { Knex } from 'knex';

export type ImageFormat = 'jpeg' | 'png' | 'tiff';

export interface ItemRow {
	id: number;
	caseId: number;
	originalName: string;
	sha256: string;
	md5: string;
	sizeBytes: number;
	format: ImageFormat;
	width: number;
	height: number;
	bitDepth: number;
	channels: number;
	hasIcc: boolean;
	exif: Record<string, unknown> | null;
	analysis: Record<string, unknown> | null;
	storageKey: string;
	previewKey: string | null;
	uploadedBy: number;
	uploadedByName: string;
	createdAt: Date;
}

export type NewItemRow = Omit<ItemRow, 'id' | 'uploadedByName' | 'createdAt'>;

const columns = [
	'i.id',
	'i.case_id as caseId',
	'i.original_name as originalName',
	'i.sha256',
	'i.md5',
	'i.size_bytes as sizeBytes',
	'i.format',
	'i.width',
	'i.height',
	'i.bit_depth as bitDepth',
	'i.channels',
	'i.has_icc as hasIcc',
	'i.exif',
	'i.analysis',
	'i.storage_key as storageKey',
	'i.preview_key as previewKey',
	'i.uploaded_by as uploadedBy',
	'u.name as uploadedByName',
	'i.created_at as createdAt'
];

const parseJson = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : (value ?? null));

function fromDb(row: Record<string, unknown>): ItemRow {
	return {
		...(row as unknown as ItemRow),
		sizeBytes: Number(row.sizeBytes),
		hasIcc: Boolean(row.hasIcc),
		exif: parseJson(row.exif),
		analysis: parseJson(row.analysis)
	};
}

export function itemRepository(knex: Knex) {
	const select = (trx: Knex) => trx('items as i').join('users as u', 'u.id', 'i.uploaded_by').select(columns);

	return {
		async findById(id: number, trx: Knex = knex): Promise<ItemRow | undefined> {
			const row = await select(trx).where('i.id', id).first();
			return row ? fromDb(row) : undefined;
		},

		async findInCaseByHash(caseId: number, sha256: string, trx: Knex = knex): Promise<ItemRow | undefined> {
			const row = await select(trx).where({ 'i.case_id': caseId, 'i.sha256': sha256 }).first();
			return row ? fromDb(row) : undefined;
		},

		async listForCase(caseId: number, trx: Knex = knex): Promise<ItemRow[]> {
			const rows = await select(trx).where('i.case_id', caseId).orderBy('i.id');
			return rows.map(fromDb);
		},

		async insert(item: NewItemRow, trx: Knex = knex): Promise<number> {
			const [id] = await trx('items').insert({
				case_id: item.caseId,
				original_name: item.originalName,
				sha256: item.sha256,
				md5: item.md5,
				size_bytes: item.sizeBytes,
				format: item.format,
				width: item.width,
				height: item.height,
				bit_depth: item.bitDepth,
				channels: item.channels,
				has_icc: item.hasIcc,
				exif: item.exif === null ? null : JSON.stringify(item.exif),
				analysis: item.analysis === null ? null : JSON.stringify(item.analysis),
				storage_key: item.storageKey,
				preview_key: item.previewKey,
				uploaded_by: item.uploadedBy
			});
			return id;
		}
	};
}
