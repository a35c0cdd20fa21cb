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
	/** Failed sign-ins allowed per e-mail and per client address in one window. */
	SIGNIN_MAX_FAILURES: z.coerce.number().int().min(1).default(5),
	SIGNIN_WINDOW_SECONDS: z.coerce.number().int().min(1).default(15 * 60)
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
