/**
 * FFT-layer micro-benchmark: `npx tsx bench/fft-speed.ts [--backend pffft|reference] [--threads N]
 * [--repeat R] [--only rfft,rl,wiener12,preview,memory] [--scipy]`.
 * Prints the minimum of R runs in ms (the minimum is the figure least disturbed by other load on the
 * machine) and the load average before and after, for:
 *   rfft      2-D real FFT 4096×3072
 *   rl        one Richardson–Lucy iteration, 3000×4000, 33×33 shake kernel, extended boundary:
 *             R + 1 iterations timed between progress callbacks; the first (with set-up) is apart
 *   wiener12  Wiener, 12 MP one channel (4000×3000), taper boundary
 *   preview   Wiener, 512×512 RGB through restore() (what the workbench preview runs)
 *   memory    peak RSS of a fresh process running a 24 MP RGB Wiener through restore()
 * --scipy adds the lean scipy.fft RL (bench/reference/lean_rl.py) per iteration on the same data,
 * as (min t(4 iterations) − min t(2 iterations)) / 2, in the same minute (runs listed: t2…, t4…).
 * `--backend reference` is the pre-PFFFT engine (fft.js powers of two, ndarray-fft otherwise, one thread).
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import ndarray from 'ndarray';
import { buildKernel, defaultFftBackend, richardsonLucy, rfft2Buffer, setDefaultFftBackend, wienerDeconvolve, type FftBackend } from '../src/lib/imaging';
import { createNodeFftBackend } from '../src/lib/imaging/node';
import { kernelSpecOf, runEngine } from './engine';
import { writeF32, writeF64 } from './files';
import { shakeKernel } from './kernels';
import { runPython } from './python';
import { lichenTexture } from './scenes';

const { values } = parseArgs({
	options: {
		backend: { type: 'string', default: 'pffft' },
		threads: { type: 'string', default: '2' },
		repeat: { type: 'string', default: '3' },
		only: { type: 'string', default: 'rfft,rl,wiener12,preview,memory' },
		scipy: { type: 'boolean' },
		'memory-child': { type: 'boolean' }
	}
});
const threads = Number(values.threads);
const repeat = Number(values.repeat);
const only = new Set(values.only.split(','));
const kernel = shakeKernel(33, 33033);
const psf = buildKernel(kernelSpecOf(kernel));
const load = () => loadavg().map((l) => l.toFixed(1)).join(' ');

let close = async () => {};
if (values.backend === 'pffft') {
	const fast = await createNodeFftBackend(threads);
	setDefaultFftBackend(fast.backend);
	close = fast.close;
} else if (values.backend !== 'reference') throw new RangeError(`--backend must be pffft or reference, got ${values.backend}`);
const fft: FftBackend = defaultFftBackend();

if (values['memory-child']) {
	const [width, height] = [6000, 4000];
	const planes = [0, 1, 2].map((c) => Float32Array.from({ length: width * height }, (_, i) => 0.3 + 0.2 * Math.sin((i % width) / (17 + c)) * Math.cos(i / width / 23)));
	const { ms } = runEngine({ width, height, planes }, kernel, { method: 'wiener', nsr: 0.01 });
	process.stdout.write(JSON.stringify({ maxRssMiB: process.resourceUsage().maxRSS / 1024, ms }) + '\n');
	await close();
	process.exit(0);
}

function minMs(f: () => void, runs = repeat): { min: number; runs: number[] } {
	const times = Array.from({ length: runs }, () => {
		const t0 = performance.now();
		f();
		return performance.now() - t0;
	});
	return { min: Math.min(...times), runs: times };
}

const report = (label: string, r: { min: number; runs: number[] }) =>
	process.stdout.write(`${label.padEnd(44)} ${r.min.toFixed(0).padStart(7)} ms  (runs ${r.runs.map((t) => t.toFixed(0)).join(', ')}; load ${load()})\n`);

process.stdout.write(`backend ${fft.name}, threads ${fft.parallel?.threads ?? 1}, node ${process.version}, load before ${load()}\n`);

if (only.has('rfft')) {
	const x = new Float32Array(4096 * 3072).map((_, i) => (i % 255) / 255);
	report('2-D real FFT 4096×3072', minMs(() => rfft2Buffer(x, 3072, 4096, fft)));
}

const [width, height] = [4000, 3000];
const channel = only.has('rl') || only.has('wiener12') ? lichenTexture(width, height, 5).planes[1] : new Float32Array(0);
if (only.has('rl')) {
	// Iteration times are the gaps between progress callbacks, so set-up is excluded.
	const stamps = [performance.now()];
	richardsonLucy(ndarray(channel, [height, width]), psf, { iterations: repeat + 1, accelerate: false, relativeChange: 0, fft, onProgress: () => stamps.push(performance.now()) });
	const gaps = stamps.slice(1).map((t, i) => t - stamps[i]);
	report('RL, set-up + first iteration, 3000×4000', { min: gaps[0], runs: gaps.slice(0, 1) });
	report('RL, one iteration, 3000×4000', { min: Math.min(...gaps.slice(1)), runs: gaps.slice(1) });
	if (values.scipy) {
		const dir = resolve(import.meta.dirname, 'out', 'speed');
		mkdirSync(dir, { recursive: true });
		writeF32(join(dir, 'channel.f32'), { width, height, planes: [channel] });
		writeF64(join(dir, 'shake33.f64'), kernel.data);
		const lean = (iterations: number) =>
			runPython<{ leanSeconds: number }>('bench/reference/lean_rl.py', [join(dir, 'channel.f32'), String(height), String(width), join(dir, 'shake33.f64'), '33', String(iterations)]).leanSeconds * 1000;
		// Minimum of each count first: a difference of single noisy runs can even come out negative.
		const two = Array.from({ length: repeat }, () => lean(2));
		const four = Array.from({ length: repeat }, () => lean(4));
		report('lean scipy.fft RL, per iteration (min t4 − min t2)/2', { min: (Math.min(...four) - Math.min(...two)) / 2, runs: [...two, ...four] });
	}
}
if (only.has('wiener12')) report('Wiener 12 MP, one channel', minMs(() => wienerDeconvolve(ndarray(channel, [height, width]), psf, { nsr: 0.01, fft })));
if (only.has('preview')) {
	const img = lichenTexture(512, 512, 7);
	runEngine(img, kernel, { method: 'wiener', nsr: 0.01 });
	report('Wiener preview 512×512 RGB (restore)', minMs(() => runEngine(img, kernel, { method: 'wiener', nsr: 0.01 }), Math.max(repeat, 5)));
}
if (only.has('memory')) {
	const child = spawnSync(process.execPath, ['--import', 'tsx', 'bench/fft-speed.ts', '--memory-child', '--backend', values.backend, '--threads', String(threads)], {
		cwd: resolve(import.meta.dirname, '..'),
		encoding: 'utf8',
		stdio: ['ignore', 'pipe', 'inherit']
	});
	if (child.status !== 0) throw new Error(`memory child exited with status ${child.status}`);
	const { maxRssMiB, ms } = JSON.parse(child.stdout) as { maxRssMiB: number; ms: number };
	process.stdout.write(`${'peak RSS, 24 MP RGB Wiener (fresh process)'.padEnd(44)} ${maxRssMiB.toFixed(0).padStart(7)} MiB (restore took ${(ms / 1000).toFixed(1)} s; load ${load()})\n`);
}
await close();
