/**
 * `npx tsx bench/auto-tune.ts [--filter REGEX]`: auto's PSNR on the benchmark cases (bench/cases.ts)
 * against the best-tuned scikit-image PSNR stored by the last full `npm run bench`
 * (bench/out/results.json), without re-running Python, for tuning the auto rule quickly.
 * The truth is used here only to score outputs, never inside the engine.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { setDefaultFftBackend } from '../src/lib/imaging';
import { createNodeFftBackend } from '../src/lib/imaging/node';
import { buildCases } from './cases';
import { quality, runEngine } from './engine';

const { values } = parseArgs({ options: { filter: { type: 'string' } } });
const filter = new RegExp(values.filter ?? '.');
const stored = JSON.parse(readFileSync(resolve(import.meta.dirname, 'out/results.json'), 'utf8')) as {
	quality: { rows: { id: string; skimage?: { wiener: { psnr: number }; rl: { psnr: number } } }[] };
};
const skBest = new Map(stored.quality.rows.filter((r) => r.skimage).map((r) => [r.id, Math.max(r.skimage!.wiener.psnr, r.skimage!.rl.psnr)]));

const fast = await createNodeFftBackend();
setDefaultFftBackend(fast.backend);
const cases = (await buildCases()).filter((c) => filter.test(c.id));
const margins: number[] = [];
const gains: number[] = [];
const print = (cells: (string | number)[]) => process.stdout.write(cells.map((c) => (typeof c === 'number' ? c.toFixed(2) : c).toString().padStart(8)).join(' ') + '\n');
print(['case', 'blurred', 'auto', 'sk best', 'margin', 'ms', 'iter', 'rule']);
for (const c of cases) {
	const best = skBest.get(c.id);
	if (best === undefined) throw new Error(`no stored scikit-image result for ${c.id}`);
	const blurred = quality(c.blurred, c.truth).psnr;
	const auto = runEngine(c.blurred, c.kernel, { method: 'auto' });
	const a = quality(auto.output, c.truth).psnr;
	margins.push(a - best);
	gains.push(a - blurred);
	print([c.id.padEnd(26), blurred, a, best, a - best, auto.ms.toFixed(0), String(auto.record.iterationsRun ?? '-'), String(auto.record.parameters.auto ?? '').slice(0, 60)]);
}
const mean = margins.reduce((x, y) => x + y, 0) / margins.length;
process.stdout.write(`average margin auto − best scikit-image over ${margins.length} cases: ${mean.toFixed(2)} dB (min ${Math.min(...margins).toFixed(2)}); smallest gain over the blurred input ${Math.min(...gains).toFixed(2)} dB\n`);
await fast.close();
