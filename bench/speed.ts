import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import ndarray from 'ndarray';
import { buildKernel, richardsonLucy } from '../src/lib/imaging';
import { kernelSpecOf, runEngine } from './engine';
import { writeF32, writeF64 } from './files';
import type { SynthImage } from './image';
import { shakeKernel } from './kernels';
import { runPython } from './python';
import { lichenTexture } from './scenes';

export interface RlSpeed {
	width: number;
	height: number;
	iterations: number;
	oursSeconds: number;
	leanSeconds?: number;
	skimageSeconds?: number;
	/** ms per iteration per megapixel, ours. */
	oursMsPerIterMp: number;
	leanMsPerIterMp?: number;
	skimageMsPerIterMp?: number;
}

export interface SpeedSection {
	rl?: RlSpeed;
	wiener12mpSeconds?: number;
	previewMs?: { median: number; runs: number[] };
	memory24mp?: { maxRssMiB: number; baselineMiB: number; seconds: number };
	note?: string;
}

const SHAKE_SEED = 33033;

/**
 * Richardson–Lucy, 30 plain iterations (no acceleration, no early stop, so all three do the
 * same work), on one channel with a 33×33 camera-shake kernel: ours, then the lean scipy.fft
 * version and scikit-image's own in the same run on the same data.
 */
export function rlSpeed(outDir: string, width: number, height: number, withPython: boolean, withSkimage: boolean, log: (s: string) => void): RlSpeed {
	const channel = lichenTexture(width, height, 5).planes[1];
	const kernel = shakeKernel(33, SHAKE_SEED);
	const psf = buildKernel(kernelSpecOf(kernel));
	const iterations = 30;
	log(`speed: RL ${iterations} iterations on ${width}×${height} (ours) …`);
	const t0 = performance.now();
	const { iterationsRun } = richardsonLucy(ndarray(channel, [height, width]), psf, { iterations, accelerate: false, relativeChange: 0 });
	const oursSeconds = (performance.now() - t0) / 1000;
	if (iterationsRun !== iterations) throw new Error(`RL ran ${iterationsRun} iterations, expected ${iterations}`);
	const mp = (width * height) / 1e6;
	const perIter = (s: number) => (1000 * s) / iterations / mp;
	const result: RlSpeed = { width, height, iterations, oursSeconds, oursMsPerIterMp: perIter(oursSeconds) };
	if (!withPython) return result;
	const dir = join(outDir, 'speed');
	mkdirSync(dir, { recursive: true });
	const img: SynthImage = { width, height, planes: [channel] };
	writeF32(join(dir, 'channel.f32'), img);
	writeF64(join(dir, 'shake33.f64'), kernel.data);
	log(`speed: RL in scipy.fft (lean)${withSkimage ? ' and scikit-image' : ''} (bench/reference/lean_rl.py) …`);
	const py = runPython<{ leanSeconds: number; skimageSeconds?: number }>('bench/reference/lean_rl.py', [
		join(dir, 'channel.f32'), String(height), String(width), join(dir, 'shake33.f64'), '33', String(iterations), ...(withSkimage ? ['--skimage'] : [])
	]);
	result.leanSeconds = py.leanSeconds;
	result.leanMsPerIterMp = perIter(py.leanSeconds);
	if (py.skimageSeconds !== undefined) {
		result.skimageSeconds = py.skimageSeconds;
		result.skimageMsPerIterMp = perIter(py.skimageSeconds);
	}
	return result;
}

/** Wiener (default taper boundary, fixed NSR) on an RGB image, seconds for the whole call. */
export function wienerSeconds(width: number, height: number): number {
	const img = lichenTexture(width, height, 6);
	return runEngine(img, shakeKernel(33, SHAKE_SEED), { method: 'wiener', nsr: 0.01 }).ms / 1000;
}

/** Live-preview latency: 512×512 RGB Wiener, one warm-up then the median of `runs`. */
export function previewMs(runs = 7): { median: number; runs: number[] } {
	const img = lichenTexture(512, 512, 7);
	const k = shakeKernel(33, SHAKE_SEED);
	runEngine(img, k, { method: 'wiener', nsr: 0.01 });
	const times = Array.from({ length: runs }, () => runEngine(img, k, { method: 'wiener', nsr: 0.01 }).ms);
	const sorted = [...times].sort((a, b) => a - b);
	return { median: sorted[Math.floor(runs / 2)], runs: times };
}

/** Peak resident memory of a fresh process doing one 24 MP RGB Wiener (bench/memory-probe.ts). */
export function memory24mp(): { maxRssMiB: number; baselineMiB: number; seconds: number } {
	const r = spawnSync(process.execPath, ['--import', 'tsx', 'bench/memory-probe.ts', '6000', '4000'], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] });
	if (r.status !== 0) throw new Error(`memory probe exited with status ${r.status}`);
	return JSON.parse(r.stdout);
}
