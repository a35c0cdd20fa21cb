import { parseArgs } from 'node:util';
import { z } from 'zod';

/** Thrown for a bad command line; the CLI prints the message and exits with status 2. */
export class UsageError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'UsageError';
	}
}

export const USAGE =
	'usage: npm run restore -- --input IN --output OUT.tif --psf PSF.png|PSF.json ' +
	'[--method wiener|rl|rltv|auto] [--iterations N] [--nsr X] [--tv λ] [--no-linear] ' +
	'[--boundary taper|extended|circular]';

const positiveNumber = (flag: string) =>
	z
		.string()
		.transform((s) => Number(s))
		.refine((n) => Number.isFinite(n) && n > 0, `${flag} must be a positive number`);

const argsSchema = z
	.object({
		input: z.string({ error: '--input is required' }).min(1),
		output: z
			.string({ error: '--output is required' })
			.regex(/\.tiff?$/i, '--output must name a .tif or .tiff file (the 16-bit master)'),
		psf: z.string({ error: '--psf is required' }).min(1),
		method: z.enum(['wiener', 'rl', 'rltv', 'auto'], { error: '--method must be wiener, rl, rltv or auto' }).default('auto'),
		iterations: z
			.string()
			.regex(/^\d+$/, '--iterations must be a whole number')
			.transform(Number)
			.refine((n) => n >= 1 && n <= 10_000, '--iterations must be between 1 and 10000')
			.optional(),
		nsr: positiveNumber('--nsr').optional(),
		tv: positiveNumber('--tv').optional(),
		'no-linear': z.boolean().default(false),
		boundary: z
			.enum(['taper', 'extended', 'circular'], { error: '--boundary must be taper, extended or circular' })
			.optional()
	})
	.superRefine((a, ctx) => {
		// Options that the chosen method would silently ignore are refused: the record must
		// hold only settings that shaped the result.
		if (a.tv !== undefined && a.method !== 'rltv') {
			ctx.addIssue({ code: 'custom', message: '--tv applies only to --method rltv' });
		}
		if (a.iterations !== undefined && (a.method === 'wiener' || a.method === 'auto')) {
			ctx.addIssue({ code: 'custom', message: '--iterations applies only to --method rl or rltv' });
		}
		if (a.nsr !== undefined && a.method !== 'wiener') {
			ctx.addIssue({ code: 'custom', message: '--nsr applies only to --method wiener' });
		}
	});

export interface CliArgs {
	input: string;
	output: string;
	psf: string;
	method: 'wiener' | 'rl' | 'rltv' | 'auto';
	iterations?: number;
	nsr?: number;
	tv?: number;
	linearLight: boolean;
	boundary?: 'taper' | 'extended' | 'circular';
}

/** Parse `process.argv.slice(2)`; returns null when help was asked for. */
export function parseCliArgs(argv: string[]): CliArgs | null {
	let values: Record<string, string | boolean | undefined>;
	try {
		({ values } = parseArgs({
			args: argv,
			strict: true,
			allowPositionals: false,
			options: {
				input: { type: 'string' },
				output: { type: 'string' },
				psf: { type: 'string' },
				method: { type: 'string' },
				iterations: { type: 'string' },
				nsr: { type: 'string' },
				tv: { type: 'string' },
				'no-linear': { type: 'boolean' },
				boundary: { type: 'string' },
				help: { type: 'boolean', short: 'h' }
			}
		}));
	} catch (e) {
		throw new UsageError((e as Error).message.split('\n')[0]);
	}
	if (values.help) return null;
	const parsed = argsSchema.safeParse(values);
	if (!parsed.success) throw new UsageError(parsed.error.issues.map((i) => i.message).join('; '));
	const { 'no-linear': noLinear, ...rest } = parsed.data;
	return { ...rest, linearLight: !noLinear };
}
