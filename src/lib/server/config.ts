/**
 * The one configuration module. Read once from `process.env` through a zod schema so the web app,
 * the worker and the scripts agree. Defaults point at the private loopback services that
 * `scripts/services.sh` starts; nothing here reaches outside the machine.
 */
import { z } from 'zod';

const port = z.coerce.number().int().min(1).max(65535);

export const configSchema = z.object({
	NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
	DATABASE_HOST: z.string().default('127.0.0.1'),
	DATABASE_PORT: port.default(3407),
	DATABASE_USER: z.string().default('stillpoint'),
	DATABASE_PASSWORD: z.string().default('stillpoint'),
	DATABASE_NAME: z
		.string()
		.regex(/^[a-z0-9_]+$/, 'database names are lower-case letters, digits and _')
		.default('stillpoint'),
	REDIS_URL: z.url().default('redis://127.0.0.1:6391/0'),
	QUEUE_PREFIX: z.string().min(1).default('stillpoint'),
	STORAGE_DIR: z.string().default('.data/storage'),
	/**
	 * The zoom view's tile pyramids: derivatives keyed by the original's SHA-256, never evidence,
	 * safe to delete (they are rebuilt on demand). Beside the local storage folder by default.
	 */
	TILE_CACHE_DIR: z.string().default('.data/tiles'),
	/** Where originals and derivatives live: this disk, or an S3-compatible bucket for several workers. */
	STORAGE_DRIVER: z.enum(['local', 's3']).default('local'),
	/** A non-AWS endpoint (MinIO, a fake for tests); path-style addressing is used with it. */
	S3_ENDPOINT: z.url().optional(),
	S3_BUCKET: z.string().min(3).optional(),
	S3_REGION: z.string().min(1).default('us-east-1'),
	/** Leave both unset to use the SDK's default credential chain (instance roles, env, profile). */
	S3_ACCESS_KEY_ID: z.string().min(1).optional(),
	S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
	/** Largest original accepted, in bytes: 200 MiB. adapter-node's BODY_SIZE_LIMIT must exceed it. */
	UPLOAD_MAX_BYTES: z.coerce.number().int().min(1).default(200 * 1024 * 1024),
	/** Largest width × height accepted, checked from the header before any pixel is decoded. */
	UPLOAD_MAX_PIXELS: z.coerce.number().int().min(1).default(100_000_000),
	/** Where links in e-mails point: the app's public origin (adapter-node's ORIGIN). */
	ORIGIN: z.url().default('http://127.0.0.1:3000'),
	/** Outgoing mail. The defaults reach the local fake SMTP server (scripts/fake-smtp.ts). */
	SMTP_HOST: z.string().default('127.0.0.1'),
	SMTP_PORT: port.default(2526),
	SMTP_SECURE: z.stringbool().default(false),
	SMTP_USER: z.string().min(1).optional(),
	SMTP_PASSWORD: z.string().min(1).optional(),
	MAIL_FROM: z.string().default('Stillpoint <no-reply@stillpoint.example>'),
	/** Development and tests only: where the fake SMTP server stores messages; enables the mailbox page. */
	DEV_MAILBOX_DIR: z.string().min(1).optional(),
	/** Failed sign-ins allowed per e-mail and per client address in one window. */
	SIGNIN_MAX_FAILURES: z.coerce.number().int().min(1).default(5),
	SIGNIN_WINDOW_SECONDS: z.coerce.number().int().min(1).default(15 * 60),
	/** Times a restoration job is tried before its run is marked failed. */
	RUN_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(20).default(3),
	/** First retry delay; each further retry waits twice as long (BullMQ exponential backoff). */
	RUN_BACKOFF_MS: z.coerce.number().int().min(0).default(10_000),
	/** How often a running restoration re-reads its run row to notice a cancel. */
	RUN_CANCEL_POLL_MS: z.coerce.number().int().min(50).default(500),
	/** Jobs one worker process runs at once; each restoration uses one thread. */
	WORKER_CONCURRENCY: z.coerce.number().int().min(1).max(64).default(1),
	/**
	 * A worker holds a job's lock this long and renews it at half-time; a killed worker's lock
	 * lapses after it and the next stalled check (every WORKER_STALLED_INTERVAL_MS) re-queues the
	 * job, so a crash is recovered within about their sum (≤ 30 s with the defaults).
	 */
	WORKER_LOCK_MS: z.coerce.number().int().min(1000).default(15_000),
	WORKER_STALLED_INTERVAL_MS: z.coerce.number().int().min(500).default(10_000),
	/** Crashes a job survives before BullMQ fails it for good. */
	WORKER_MAX_STALLED: z.coerce.number().int().min(0).default(2)
}).superRefine((c, ctx) => {
	if (c.STORAGE_DRIVER === 's3' && !c.S3_BUCKET) {
		ctx.addIssue({ code: 'custom', path: ['S3_BUCKET'], message: 'required when STORAGE_DRIVER=s3' });
	}
	if (Boolean(c.S3_ACCESS_KEY_ID) !== Boolean(c.S3_SECRET_ACCESS_KEY)) {
		ctx.addIssue({ code: 'custom', path: ['S3_SECRET_ACCESS_KEY'], message: 'set both S3 keys or neither' });
	}
});

export type Config = z.infer<typeof configSchema>;

let cached: Config | undefined;

/** Parse the environment once; a bad value stops the process with the variable's name. */
export function config(): Config {
	if (cached) return cached;
	const parsed = configSchema.safeParse(process.env);
	if (!parsed.success) {
		const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
		throw new Error(`Invalid configuration: ${problems.join('; ')}`);
	}
	cached = parsed.data;
	return cached;
}
