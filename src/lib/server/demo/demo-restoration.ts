/**
 * The demo's worked example: the blurred car-park photo registered as an original in the
 * invented evidence unit's case, and a restoration run queued for it with the straight-motion
 * kernel a technician would trace along the lamp's streak. The worker started beside the web
 * app picks the run up, so a fresh demo shows a real queued restoration and its custody trail.
 */
import { createHash } from 'node:crypto';
import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { Knex } from 'knex';
import type { SessionUser } from '../../roles';
import { systemClock } from '../clock';
import { config } from '../config';
import { caseRepository } from '../repositories/case.repository';
import { itemRepository } from '../repositories/item.repository';
import { bullRunQueue } from '../run-queue';
import { intakeService } from '../services/intake.service';
import { runService } from '../services/run.service';
import { storage } from '../storage';
import { redis } from '../redis';
import { redisViewThrottle } from '../view-throttle';
import { demoBlurredPhoto } from './demo-photo';

export const DEMO_PHOTO_CASE = 'QCEU-2026-0142';
export const DEMO_PHOTO_NAME = 'fenwick-row-bay-14.png';

/** Register the photo and queue its run, unless the case already holds an original. */
export async function seedDemoRestoration(knex: Knex, technician: SessionUser): Promise<{ itemId: number; runId: number } | null> {
	const demoCase = await caseRepository(knex).findByReference(DEMO_PHOTO_CASE);
	if (!demoCase || (await itemRepository(knex).listForCase(demoCase.id)).length > 0) return null;

	const { png, kernel } = await demoBlurredPhoto();
	const c = config();
	const tmpDir = join(c.STORAGE_DIR, 'tmp');
	await mkdir(tmpDir, { recursive: true });
	const path = join(tmpDir, `demo-${process.pid}.png`);
	await writeFile(path, png);
	const digest = (algorithm: string) => createHash(algorithm).update(png).digest('hex');
	const intake = intakeService(knex, storage(), { maxPixels: c.UPLOAD_MAX_PIXELS });
	const { item } = await intake.ingest(technician, demoCase.id, async () => ({
		path,
		originalName: DEMO_PHOTO_NAME,
		digests: { sha256: digest('sha256'), md5: digest('md5'), size: png.length, head: png.subarray(0, 16) }
	}));

	const runs = runService(knex, {
		clock: systemClock,
		queue: bullRunQueue(),
		storage: storage(),
		views: redisViewThrottle(redis(), c.QUEUE_PREFIX)
	});
	const run = await runs.create(technician, item.id, { method: 'rltv', psf: kernel, params: { iterations: 40, tv: 0.001 } });
	return { itemId: item.id, runId: run.id };
}
