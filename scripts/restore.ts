/**
 * Command-line restoration: `npm run restore -- --input IN --output OUT.tif --psf PSF.png|PSF.json …`
 * (see src/lib/server/imaging/cli-args.ts for every option). Writes OUT.tif and OUT.json.
 */
import { runRestoreCli } from '../src/lib/server/imaging/restore-cli';

process.exitCode = await runRestoreCli(process.argv.slice(2), process.stderr);
