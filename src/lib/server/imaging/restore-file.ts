import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { basename, resolve } from 'node:path';
import { restore, type RestoreOptions } from '../../imaging';
import type { CliArgs } from './cli-args';
import { UsageError } from './cli-args';
import { writeFilesAtomically } from './atomic-write';
import { decodeImage, type DecodeInfo } from './decode';
import { encodeTiff16, type QuantiseReport } from './encode';
import { ImageInputError } from './errors';
import { readPsf, type PsfSource } from './psf-file';

type EngineRecord = ReturnType<typeof restore>['record'];

/** The engine's run record plus what ties it to files: digests (SHA-256, FIPS 180-4) and names. */
export type FileRunRecord = EngineRecord & {
	files: {
		input: { file: string; sha256: string; decode: DecodeInfo };
		psf: PsfSource;
		output: { file: string; sha256: string; format: 'tiff'; bitDepth: 16; compression: 'deflate'; quantisation: QuantiseReport };
	};
};

/** Where the run record of `output` goes: OUT.tif → OUT.json. */
export function recordPathFor(output: string): string {
	return output.replace(/\.tiff?$/i, '.json');
}

/**
 * Restore one image file with one kernel, write the 16-bit TIFF master and its run record.
 * Everything is computed in memory first and both files are renamed into place together, so
 * an error at any step leaves no output behind. File names in the record are base names:
 * absolute paths differ between machines and would make identical runs produce different
 * records.
 */
export async function restoreFile(args: CliArgs, progress: (line: string) => void): Promise<FileRunRecord> {
	const inputPath = resolve(args.input);
	const outputPath = resolve(args.output);
	const recordPath = recordPathFor(outputPath);
	// Never overwrite evidence: the original stays unaltered (SWGIT Guidelines v2.1, Part II).
	for (const [flag, path] of [['--input', inputPath], ['--psf', resolve(args.psf)]] as const) {
		if (path === outputPath || path === recordPath) throw new UsageError(`--output would overwrite the file given as ${flag}`);
	}

	const inputBytes = await readInput(args.input, 'input');
	const { image, info } = await decodeImage(inputBytes);
	progress(`decoded ${info.format} ${info.width}×${info.height}, ${info.channels === 1 ? 'grey' : 'RGB'}, ${info.bitDepth}-bit${info.alphaDropped ? ', alpha dropped' : ''}`);
	const { spec, source } = await readPsf(await readInput(args.psf, 'PSF'), basename(args.psf));

	const options: RestoreOptions = {
		method: args.method,
		linearLight: args.linearLight,
		...(args.iterations !== undefined ? { iterations: args.iterations } : {}),
		...(args.nsr !== undefined ? { nsr: args.nsr } : {}),
		...(args.tv !== undefined ? { tv: args.tv } : {}),
		...(args.boundary !== undefined ? { boundary: args.boundary } : {})
	};
	let lastPercent = -1;
	const result = restore(image, spec, options, {
		onProgress: (done, total) => {
			const percent = Math.floor((100 * done) / Math.max(total, 1));
			if (percent >= lastPercent + 10 || done === total) {
				lastPercent = percent;
				progress(`restoring ${done}/${total}`);
			}
		}
	});
	const { bytes, quantisation } = await encodeTiff16(result.image);
	const record: FileRunRecord = {
		...result.record,
		files: {
			input: { file: basename(args.input), sha256: sha256(inputBytes), decode: info },
			psf: source,
			output: { file: basename(outputPath), sha256: sha256(bytes), format: 'tiff', bitDepth: 16, compression: 'deflate', quantisation }
		}
	};
	await writeFilesAtomically([
		{ path: outputPath, bytes },
		{ path: recordPath, bytes: JSON.stringify(record, null, 2) + '\n' }
	]);
	progress(`wrote ${outputPath} (sha256 ${record.files.output.sha256}) and ${recordPath}`);
	return record;
}

function sha256(bytes: Uint8Array): string {
	return createHash('sha256').update(bytes).digest('hex');
}

async function readInput(path: string, what: string): Promise<Buffer> {
	try {
		return await readFile(path);
	} catch (e) {
		const code = (e as NodeJS.ErrnoException).code;
		const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory' : code === 'EACCES' ? 'permission denied' : (e as Error).message;
		throw new ImageInputError('unsupported', `cannot read ${what} file ${path}: ${why}`);
	}
}
