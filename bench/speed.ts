import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import ndarray from 'ndarray';
import { buildKernel, richardsonLucy } from '../src/lib/imaging';
import { loadPreviewFft } from '../src/lib/workbench/region-restore';
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
	previewMs?: { median: number; runs: number[]; backend: string };
	memory24mp?: { maxRssMiB: number; baselineMiB: number; seconds: number };
	note?: string;
	/** Load average and thread count when the speed figures were taken (the machine may be shared). */
	context?: string;
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

/**
 * Round every value to a `levels − 1` code, as decodeImage (16-bit files) or the workbench canvas
 * (8-bit) hands images to the engine: the engine's speed figures are for the data it really gets.
 */
export function quantise(img: SynthImage, levels: 255 | 65535): SynthImage {
	return { ...img, planes: img.planes.map((p) => p.map((v) => Math.round(Math.min(1, Math.max(0, v)) * levels) / levels)) };
}

/** Wiener (default taper boundary, fixed NSR) on a 16-bit RGB image, seconds for restore() alone. */
export function wienerSeconds(width: number, height: number): number {
	const img = quantise(lichenTexture(width, height, 6), 65535);
	return runEngine(img, shakeKernel(33, SHAKE_SEED), { method: 'wiener', nsr: 0.01 }).restoreMs / 1000;
}

/**
 * Live-preview latency: 512×512 8-bit RGB Wiener, one warm-up then the median of `runs`, with the
 * backend the workbench's Web Worker chooses (region-restore.ts loadPreviewFft: PFFFT's WASM on one
 * thread, fft.js / ndarray-fft if it fails to load; no thread pool).
 */
export async function previewMs(runs = 7): Promise<{ median: number; runs: number[]; backend: string }> {
	const img = quantise(lichenTexture(512, 512, 7), 255);
	const k = shakeKernel(33, SHAKE_SEED);
	const fft = await loadPreviewFft();
	const once = () => runEngine(img, k, { method: 'wiener', nsr: 0.01 }, fft).restoreMs;
	once();
	const times = Array.from({ length: runs }, once);
	const sorted = [...times].sort((a, b) => a - b);
	return { median: sorted[Math.floor(runs / 2)], runs: times, backend: fft.name };
}

/** Peak resident memory of a fresh process doing one 24 MP RGB Wiener (bench/memory-probe.ts). */
export function memory24mp(): { maxRssMiB: number; baselineMiB: number; seconds: number } {
	const r = spawnSync(process.execPath, ['--import', 'tsx', 'bench/memory-probe.ts', '6000', '4000'], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] });
	if (r.status !== 0) throw new Error(`memory probe exited with status ${r.status}`);
	return JSON.parse(r.stdout);
}
