/**
 * Intake: turning a received upload into an item in custody. Every check runs before anything is
 * stored — type by content, pixel count from the header (decompression bombs), one full decode
 * (truncated or corrupt files) — so a refused upload leaves no object and no row. An accepted
 * original is stored write-once under its SHA-256, exactly as received, and its row and custody
 * events commit together.
 */
import { rm } from 'node:fs/promises';
import type { Knex } from 'knex';
import type { SessionUser } from '../../roles';
import { systemClock, type Clock } from '../clock';
import { ForbiddenError, InvalidError, UnsupportedMediaError } from '../errors';
import { analyse } from '../intake/analysis';
import { readHeader, verifyDecodes } from '../intake/inspect';
import { readExif } from '../intake/metadata';
import type { ReceivedFile } from '../intake/multipart';
import { makePreview, previewKey } from '../intake/preview';
import { MEDIA_TYPES, sniffFormat } from '../intake/sniff';
import { itemRepository, type ItemRow } from '../repositories/item.repository';
import type { ObjectStorage } from '../storage';
import { caseService } from './case.service';
import { custodyService } from './custody.service';

export interface IntakeLimits {
	maxPixels: number;
}

export interface IntakeResult {
	item: ItemRow;
	/** The same bytes were already an item of this case: nothing new was stored or recorded. */
	duplicate: boolean;
}

export const originalKey = (sha256: string) => `originals/${sha256}`;

const DIGEST_ALGORITHMS = ['SHA-256 (FIPS 180-4)', 'MD5 (RFC 1321)'];

const isDuplicateKey = (err: unknown) => (err as { code?: string }).code === 'ER_DUP_ENTRY';

export function intakeService(knex: Knex, storage: ObjectStorage, limits: IntakeLimits, clock: Clock = systemClock) {
	const items = itemRepository(knex);
	const cases = caseService(knex, clock);
	const custody = custodyService(knex, clock);

	/** The item another upload of the same bytes committed first. */
	async function winner(caseId: number, sha256: string): Promise<IntakeResult> {
		return { item: (await items.findInCaseByHash(caseId, sha256))!, duplicate: true };
	}

	async function accept(user: SessionUser, caseId: number, upload: ReceivedFile): Promise<IntakeResult> {
		const { sha256, md5, size, head } = upload.digests;
		if (size === 0) throw new InvalidError('The file is empty (0 bytes)', { file: ['The file is empty'] });
		const format = sniffFormat(head);
		if (!format) {
			throw new UnsupportedMediaError(
				`"${upload.originalName}" is not a JPEG, PNG or TIFF image (recognised by its content, not its name)`
			);
		}
		// Recognised by hash before any decoding: the same bytes were checked when first received.
		// Nothing is recorded for a resubmission — nothing new entered custody, and the answer
		// tells the uploader which item already holds these bytes.
		const already = await items.findInCaseByHash(caseId, sha256);
		if (already) return { item: already, duplicate: true };

		const header = await readHeader(upload.path, format, limits.maxPixels);
		await verifyDecodes(upload.path, limits.maxPixels);
		const [analysis, { exif, status: exifStatus }, preview] = await Promise.all([
			analyse(upload.path, header, limits.maxPixels),
			readExif(upload.path),
			makePreview(upload.path, limits.maxPixels)
		]);

		const actor = { id: user.id, role: user.role };
		try {
			return await knex.transaction(async (trx) => {
				// The row goes first: a concurrent upload of the same bytes into this case waits on
				// the unique (case_id, sha256) key and then fails here, before it stores anything.
				const itemId = await items.insert(
					{
						caseId,
						originalName: upload.originalName,
						sha256,
						md5,
						sizeBytes: size,
						format,
						width: header.width,
						height: header.height,
						bitDepth: header.bitDepth,
						channels: header.channels,
						hasIcc: header.hasIcc,
						exif,
						analysis: { ...analysis },
						storageKey: originalKey(sha256),
						previewKey: previewKey(sha256),
						uploadedBy: user.id
					},
					trx
				);
				// Write-once and content-addressed: `false` means these bytes are already stored
				// (another case holds the same original), which is the object we want.
				await storage.putFile(originalKey(sha256), upload.path, MEDIA_TYPES[format]);
				await storage.putBuffer(previewKey(sha256), preview, 'image/png');

				const ids = { caseId, itemId };
				await custody.record(
					{
						...ids,
						action: 'original_received',
						actor,
						detail: { name: upload.originalName, size, format, md5 },
						hashAfter: sha256
					},
					trx
				);
				await custody.record(
					{ ...ids, action: 'digests_computed', actor, detail: { sha256, md5, algorithms: DIGEST_ALGORITHMS } },
					trx
				);
				await custody.record(
					{
						...ids,
						action: 'metadata_extracted',
						actor,
						detail: {
							width: header.width,
							height: header.height,
							bitDepth: header.bitDepth,
							channels: header.channels,
							hasAlpha: header.hasAlpha,
							hasIcc: header.hasIcc,
							pages: header.pages,
							exif: exifStatus,
							exifTags: exif ? Object.keys(exif).length : 0
						},
						hashBefore: sha256,
						hashAfter: sha256
					},
					trx
				);
				return { item: (await items.findById(itemId, trx))!, duplicate: false };
			});
		} catch (err) {
			if (isDuplicateKey(err)) return winner(caseId, sha256);
			throw err;
		}
	}

	return {
		/**
		 * Take one upload into the case. Role and case are checked before `receive` reads the
		 * body, so nobody streams 200 MB into a case they cannot add to. The temporary file is
		 * removed whatever happens.
		 * @throws ForbiddenError, NotFoundError (case), InvalidError (empty), UnsupportedMediaError
		 *   (not JPEG/PNG/TIFF, or not grey/RGB 8/16-bit), TooLargeError (bytes or pixels),
		 *   UnprocessableError (truncated or corrupt).
		 */
		async ingest(user: SessionUser, caseId: number, receive: () => Promise<ReceivedFile>): Promise<IntakeResult> {
			if (user.role !== 'admin' && user.role !== 'technician') {
				throw new ForbiddenError('Only technicians and administrators add originals');
			}
			await cases.get(user, caseId);
			const upload = await receive();
			try {
				return await accept(user, caseId, upload);
			} finally {
				await rm(upload.path, { force: true });
			}
		}
	};
}
