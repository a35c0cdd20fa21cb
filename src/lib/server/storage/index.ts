/** The process's storage, chosen by configuration: local disk by default, S3 when configured. */
import { config, type Config } from '../config';
import { localStorage } from './local-storage';
import { s3Storage } from './s3-storage';
import type { ObjectStorage } from './storage';

let instance: ObjectStorage | undefined;

function fromConfig(c: Config): ObjectStorage {
	if (c.STORAGE_DRIVER === 'local') return localStorage(c.STORAGE_DIR);
	return s3Storage({
		bucket: c.S3_BUCKET!,
		region: c.S3_REGION,
		endpoint: c.S3_ENDPOINT,
		credentials:
			c.S3_ACCESS_KEY_ID && c.S3_SECRET_ACCESS_KEY
				? { accessKeyId: c.S3_ACCESS_KEY_ID, secretAccessKey: c.S3_SECRET_ACCESS_KEY }
				: undefined
	});
}

export function storage(): ObjectStorage {
	instance ??= fromConfig(config());
	return instance;
}

export type { ObjectStorage } from './storage';
export { StorageNotFoundError } from './storage';
