import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildKernel } from '../kernels/build';
import { loadPffftBackend } from '../fft/pffft-loader';
import type { PffftBackend } from '../fft/pffft-backend';
import { NdarrayFftBackend } from '../fft/ndarray-backend';
import { seededRandom } from '../random';
import { restore } from '../restoration/restore';
import { richardsonLucy } from '../restoration/richardson-lucy';
import { wienerDeconvolve } from '../restoration/wiener';
import { convolveValidNaive, syntheticScene } from '../testing/fixtures';
import { createPlane, type RasterImage } from '../types';
import { createNodeFftBackend, pairRange, type NodeFftBackend } from './index';

const bytes = (a: Float32Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

/** A blurred scene large enough for several overlap-save tile pairs (600×500 with 256² blocks: 9 tiles). */
function blurred() {
	const psf = buildKernel({ kind: 'line', length: 15, angleDeg: 30 });
	const [kh, kw] = psf.shape;
	return { psf, plane: convolveValidNaive(syntheticScene(500 + kh - 1, 600 + kw - 1, 5), psf) };
}

describe('worker_threads pool: same bytes for every thread count', () => {
	let serial: PffftBackend;
	const pools: NodeFftBackend[] = [];
	beforeAll(async () => {
		serial = await loadPffftBackend();
		for (const threads of [1, 2, 3]) pools.push(await createNodeFftBackend(threads));
	});
	afterAll(async () => {
		for (const p of pools) await p.close();
	});

	it('partitions the tile pairs exactly once, in order', async () => {
		for (const threads of [1, 2, 3, 7]) {
			const covered: number[] = [];
			for (let t = 0; t < threads; t++) {
				const [a, b] = pairRange(10, t, threads);
				for (let p = a; p < b; p++) covered.push(p);
			}
			expect(covered).toEqual(Array.from({ length: 10 }, (_, i) => i));
		}
		await expect(createNodeFftBackend(0)).rejects.toThrow(RangeError);
	});

	it('Richardson–Lucy (extended and circular) gives identical bytes with 1, 2 and 3 threads and without a pool', () => {
		const { psf, plane } = blurred();
		for (const boundary of ['extended', 'circular'] as const) {
			const run = (fft: PffftBackend) => richardsonLucy(plane, psf, { iterations: 3, boundary, fft }).plane.data;
			const reference = bytes(run(serial));
			for (const p of pools) {
				expect(p.backend.parallel?.threads).toBe(pools.indexOf(p) + 1);
				expect(bytes(run(p.backend)).equals(reference)).toBe(true);
			}
		}
	});

	it('2-D FFTs of shared buffers split between 1, 2 and 3 threads give the bits of one thread', () => {
		// 720×400 complex (both axes 16·5-smooth, 288 000 points: above the pool's threshold); 400
		// columns are 12.5 groups of 32, so the last thread also gets a partial group.
		const rows = 720;
		const cols = 400;
		const random = seededRandom(11);
		const input = Float64Array.from({ length: 2 * rows * cols }, () => random() - 0.5);
		for (const inverse of [false, true]) {
			const reference = input.slice();
			serial.fft2(reference, rows, cols, inverse);
			for (const p of pools) {
				const pool = p.backend.parallel!;
				const direct = pool.allocate64!(input.length);
				direct.set(input);
				pool.fft2!(direct, rows, cols, inverse);
				expect(Buffer.from(direct.buffer).equals(Buffer.from(reference.buffer))).toBe(true);
				const routed = pool.allocate64!(input.length);
				routed.set(input);
				p.backend.fft2(routed, rows, cols, inverse);
				expect(Buffer.from(routed.buffer).equals(Buffer.from(reference.buffer))).toBe(true);
			}
		}
	});

	it('restore() Wiener on RGB gives identical bytes with 1, 2 and 3 threads and the same record', () => {
		const { plane } = blurred();
		const [h, w] = plane.shape;
		const img: RasterImage = { width: w, height: h, planes: [plane, plane, plane], transfer: 'srgb', sourceBitDepth: 16 };
		const spec = { kind: 'line' as const, length: 15, angleDeg: 30 };
		const first = restore(img, spec, { method: 'wiener', nsr: 0.01 }, { fft: pools[0].backend });
		for (const p of pools.slice(1)) {
			const other = restore(img, spec, { method: 'wiener', nsr: 0.01 }, { fft: p.backend });
			other.image.planes.forEach((q, c) => expect(bytes(q.data).equals(bytes(first.image.planes[c].data))).toBe(true));
			expect(other.record).toEqual(first.record);
		}
		expect(first.record.padding.fft).toBe('pffft-wasm-0.4.2-simd, else fft.js-4.0.4+ndarray-fft-1.0.3');
	});

	it('restore() Wiener large enough to split its FFTs and row passes between threads gives the bytes of one thread', () => {
		// 1000×800 pads to 864×1152 (995 328 values, packed 864×576 complex): above both split thresholds.
		const width = 1000;
		const height = 800;
		const random = seededRandom(12);
		const planes = [0, 1, 2].map(() => createPlane(height, width, Float32Array.from({ length: width * height }, () => Math.round(random() * 255) / 255)));
		const img: RasterImage = { width, height, planes, transfer: 'srgb', sourceBitDepth: 8 };
		const spec = { kind: 'line' as const, length: 21, angleDeg: 60 };
		for (const regulariser of ['constant', 'laplacian'] as const) {
			const reference = restore(img, spec, { method: 'wiener', nsr: 0.01, regulariser }, { fft: serial });
			for (const p of pools) {
				const ours = restore(img, spec, { method: 'wiener', nsr: 0.01, regulariser }, { fft: p.backend });
				ours.image.planes.forEach((q, c) => expect(bytes(q.data).equals(bytes(reference.image.planes[c].data))).toBe(true));
			}
		}
	});

	it('float32 PFFFT stays within 2e-6 of the Float64 ndarray-fft oracle through Wiener and 3 RL iterations', () => {
		const { psf, plane } = blurred();
		const oracle = new NdarrayFftBackend();
		const maxDiff = (a: Float32Array, b: Float32Array) => a.reduce((m, v, i) => Math.max(m, Math.abs(v - b[i])), 0);
		// Same geometry for both: the oracle pads to the PFFFT backend's fast sizes too.
		const padded = { ...oracle, name: oracle.name, supports: oracle.supports, fft2: oracle.fft2.bind(oracle), fastLength: (n: number) => serial.fastLength(n) };
		const wienerOurs = wienerDeconvolve(plane, psf, { nsr: 0.01, fft: serial }).data;
		const wienerRef = wienerDeconvolve(plane, psf, { nsr: 0.01, fft: padded }).data;
		expect(maxDiff(wienerOurs, wienerRef)).toBeLessThan(2e-6);
		const rlOurs = richardsonLucy(plane, psf, { iterations: 3, fft: serial }).plane.data;
		const rlRef = richardsonLucy(plane, psf, { iterations: 3, fft: oracle }).plane.data;
		expect(maxDiff(rlOurs, rlRef)).toBeLessThan(2e-6);
	});
});
