/**
 * `npm run bench [-- --quick] [-- --no-python]`: quality against best-tuned scikit-image on an
 * invented benchmark set, then speed and memory. Results print as tables with one verdict line
 * per target of issue 3 and are written to bench/out/ (git-ignored).
 *   --quick      skip the 12 MP and 24 MP measurements (RL speed then runs at 1 MP, no scikit-image)
 *   --no-python  skip the scikit-image / scipy reference columns
 *   --speed      the speed and memory section alone (written to bench/out/speed-report.txt, speed-results.json)
 * The blur-estimation accuracy tables (issue 7) follow; `npx tsx bench/estimation-run.ts` runs them alone.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { availableParallelism, loadavg } from 'node:os';
import { parseArgs } from 'node:util';
import { ENGINE_VERSION, setDefaultFftBackend } from '../src/lib/imaging';
import { createNodeFftBackend } from '../src/lib/imaging/node';
import { runEstimationBench } from './estimation';
import { pythonReference } from './python';
import { runQuality } from './quality';
import { qualityReport, speedReport } from './report';
import { memory24mp, previewMs, rlSpeed, wienerSeconds, type SpeedSection } from './speed';

const { values } = parseArgs({ options: { quick: { type: 'boolean' }, 'no-python': { type: 'boolean' }, speed: { type: 'boolean' } } });
const quick = Boolean(values.quick);
const speedOnly = Boolean(values.speed);
const outDir = resolve(import.meta.dirname, 'out');
mkdirSync(outDir, { recursive: true });
process.chdir(resolve(import.meta.dirname, '..'));
const log = (s: string) => process.stderr.write(`bench: ${s}\n`);
// The product's Node path: PFFFT with a worker_threads pool over every core (bench/memory-probe.ts does the same).
const fast = await createNodeFftBackend();
setDefaultFftBackend(fast.backend);
log(`FFT backend ${fast.backend.name}, ${fast.backend.parallel?.threads ?? 1} threads`);

const reference = values['no-python'] ? { missing: '--no-python given' } : pythonReference();
const withPython = 'versions' in reference;
if (!withPython) log(`Python reference unavailable: ${reference.missing}`);

const started = performance.now();
const quality = speedOnly ? undefined : await runQuality(outDir, withPython, log);
if (quality && !withPython) quality.skimageNote = reference.missing;

const speed: SpeedSection = {};
const loadNow = () => loadavg().map((l) => l.toFixed(2)).join(' ');
const loadBefore = loadNow();
speed.previewMs = await previewMs();
if (quick) {
	speed.rl = rlSpeed(outDir, 1000, 1000, withPython, false, log);
	speed.note = '--quick given';
} else {
	speed.rl = rlSpeed(outDir, 4000, 3000, withPython, true, log);
	log('speed: Wiener 12 MP RGB …');
	speed.wiener12mpSeconds = wienerSeconds(4000, 3000);
	log('speed: peak memory, 24 MP RGB Wiener in a fresh process …');
	speed.memory24mp = memory24mp();
}

speed.context = `${availableParallelism()} cores, engine on ${fast.backend.parallel?.threads ?? 1} threads; load average ${loadBefore} before the speed section, ${loadNow()} after`;

if (!speedOnly) log('estimation: motion, defocus, noise and 12 MP timing …');
const estimation = speedOnly ? '' : await runEstimationBench({ perBand: quick ? 4 : 12 });

const q = quality ? qualityReport(quality) : { text: 'Quality and estimation: skipped (--speed)', verdicts: [] };
const s = speedReport(speed);
const text = [
	`Stillpoint benchmark — ${ENGINE_VERSION} — node ${process.version} — ${quick ? 'quick' : 'full'}${speedOnly ? ' speed-only' : ''} run in ${((performance.now() - started) / 1000).toFixed(0)} s`,
	'',
	q.text,
	'',
	s.text,
	'',
	'Verdicts',
	...[...q.verdicts, ...s.verdicts].map((v) => `  ${v}`),
	'',
	estimation
].join('\n');
process.stdout.write(text + '\n');
const prefix = speedOnly ? 'speed-' : '';
writeFileSync(join(outDir, `${prefix}report.txt`), text + '\n');
writeFileSync(join(outDir, `${prefix}results.json`), JSON.stringify({ engineVersion: ENGINE_VERSION, quick, reference, quality, speed }, null, 1));
log(`wrote ${join(outDir, `${prefix}report.txt`)} and ${prefix}results.json`);
await fast.close();
