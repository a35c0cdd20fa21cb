/**
 * Child process for the memory figure: one Wiener restoration of a width×height RGB image,
 * then the process's peak resident set size (getrusage ru_maxrss via process.resourceUsage),
 * which counts everything the restoration held at its worst moment, input image included.
 * The input is a cheap seeded pattern written straight into its planes, so no generator
 * temporaries inflate the peak.
 *     node --import tsx bench/memory-probe.ts 6000 4000
 */
import { setDefaultFftBackend } from '../src/lib/imaging';
import { createNodeFftBackend } from '../src/lib/imaging/node';
import { runEngine } from './engine';
import { shakeKernel } from './kernels';
import { Prng } from './prng';

const [width, height] = process.argv.slice(2).map(Number);
if (!(width > 0 && height > 0)) throw new RangeError('usage: memory-probe.ts WIDTH HEIGHT');
const rng = new Prng(8);
const planes = [0, 1, 2].map((c) => {
	const p = new Float32Array(width * height);
	// Rounded to 16-bit codes in place, as decodeImage delivers a 16-bit file (no extra copy).
	for (let i = 0; i < p.length; i++) p[i] = Math.round((0.3 + 0.2 * Math.sin((i % width) / (17 + c)) * Math.cos(i / width / 23) + 0.1 * rng.next()) * 65535) / 65535;
	return p;
});
const fast = await createNodeFftBackend();
setDefaultFftBackend(fast.backend);
const baselineMiB = process.memoryUsage().rss / 2 ** 20;
const { restoreMs: ms } = runEngine({ width, height, planes }, shakeKernel(33, 33033), { method: 'wiener', nsr: 0.01 });
process.stdout.write(JSON.stringify({ maxRssMiB: process.resourceUsage().maxRSS / 1024, baselineMiB, seconds: ms / 1000 }) + '\n');
await fast.close();
