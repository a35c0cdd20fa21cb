import { loadPffftBackend, setDefaultFftBackend } from '../../imaging/index';
import { parseCliArgs, USAGE, UsageError } from './cli-args';
import { ImageInputError } from './errors';
import { PsfError } from './psf-file';
import { restoreFile } from './restore-file';

/**
 * The `npm run restore` command: returns the exit status. Expected failures (bad arguments,
 * unreadable or unsupported files, unusable kernels, engine range checks) print one line;
 * anything else is a bug and keeps its stack trace.
 * Exit statuses: 0 success, 1 input or processing error, 2 usage error.
 */
export async function runRestoreCli(argv: string[], stderr: { write(s: string): unknown }): Promise<number> {
	const say = (line: string) => stderr.write(`restore: ${line}\n`);
	try {
		const args = parseCliArgs(argv);
		if (args === null) {
			stderr.write(`${USAGE}\n`);
			return 0;
		}
		// The WASM FFT, as in the worker, so both give the same bytes for the same engine version.
		setDefaultFftBackend(await loadPffftBackend());
		await restoreFile(args, say);
		return 0;
	} catch (e) {
		if (e instanceof UsageError) {
			say(`error: ${e.message} (see --help)`);
			return 2;
		}
		if (e instanceof ImageInputError || e instanceof PsfError || e instanceof RangeError) {
			say(`error: ${e.message.replace(/\s*\n\s*/g, ' ')}`);
			return 1;
		}
		throw e;
	}
}
