import type { FftBackend } from '../fft/backend';
import { nextPowerOfTwo } from '../fft/fast-size';

/**
 * A linear 2-D convolution of a real image with a small real kernel, described so that it can be
 * split into independent blocks:
 *
 *   out[i, j] = Σ_{a,b} kernel[a, b] · src[i + rowOffset + kh − 1 − a, j + colOffset + kw − 1 − b],
 *
 * where src outside its bounds is zero (`outside: 'zero'`) or periodic (`'wrap'`). With offsets 0 this
 * is the "valid" part of src ∗ kernel; with offsets −(kh − 1), −(kw − 1) and the flipped kernel it is
 * the "full" correlation, i.e. the adjoint.
 */
export interface ConvolutionJob {
	/** Float32 (SharedArrayBuffer-backed for the thread pool) or Float64 (always run on the calling thread). */
	src: Float32Array | Float64Array;
	srcRows: number;
	srcCols: number;
	out: Float32Array;
	outRows: number;
	outCols: number;
	rowOffset: number;
	colOffset: number;
	kernel: Float64Array;
	kernelRows: number;
	kernelCols: number;
	outside: 'zero' | 'wrap';
	/** FFT block edge (power of two), from {@link chooseBlockSize}. */
	blockSize: number;
}

/**
 * Block edge B (power of two) minimising the overlap-save cost per output pixel,
 * B²·(log₂B + 2) / ((B − kh + 1)(B − kw + 1)); the +2 stands for the per-element copy and multiply
 * passes. B stays at most 256 unless the kernel needs more, because the column pass of larger blocks
 * leaves the CPU cache (measured: 512² blocks cost about 1.5× more per point than 256², README.md).
 */
export function chooseBlockSize(kernelRows: number, kernelCols: number, outRows: number, outCols: number): number {
	const k = Math.max(kernelRows, kernelCols);
	const needed = Math.max(2, nextPowerOfTwo(Math.max(outRows + kernelRows - 1, outCols + kernelCols - 1)));
	const smallest = Math.max(16, nextPowerOfTwo(k + 1));
	const largest = Math.max(smallest, Math.min(needed, Math.max(256, nextPowerOfTwo(2 * k))));
	let best = 0;
	let bestCost = Infinity;
	for (let b = smallest; b <= largest; b *= 2) {
		const cost = (b * b * (Math.log2(b) + 2)) / ((b - kernelRows + 1) * (b - kernelCols + 1));
		if (cost < bestCost) {
			bestCost = cost;
			best = b;
		}
	}
	return best;
}

/** Number of output tiles and of tile pairs (two real tiles share one complex transform). */
export function tileLayout(job: ConvolutionJob): { tileRows: number; tileCols: number; across: number; count: number; pairs: number } {
	const tileRows = job.blockSize - job.kernelRows + 1;
	const tileCols = job.blockSize - job.kernelCols + 1;
	const across = Math.ceil(job.outCols / tileCols);
	const count = Math.ceil(job.outRows / tileRows) * across;
	return { tileRows, tileCols, across, count, pairs: Math.ceil(count / 2) };
}

/** Spectrum of the kernel placed at the top-left corner of a B×B block (interleaved complex). */
export function kernelBlockSpectrum(job: ConvolutionJob, backend: FftBackend): Float64Array {
	const b = job.blockSize;
	const spectrum = new Float64Array(2 * b * b);
	for (let a = 0; a < job.kernelRows; a++) {
		for (let c = 0; c < job.kernelCols; c++) spectrum[2 * (a * b + c)] = job.kernel[a * job.kernelCols + c];
	}
	backend.fft2(spectrum, b, b, false);
	return spectrum;
}

/** Validate a job's geometry before any block runs. */
export function assertConvolutionJob(job: ConvolutionJob): void {
	const { srcRows, srcCols, outRows, outCols, kernelRows, kernelCols, blockSize } = job;
	if (job.src.length !== srcRows * srcCols) throw new RangeError('convolution source size mismatch');
	if (job.out.length !== outRows * outCols) throw new RangeError('convolution output size mismatch');
	if (job.kernel.length !== kernelRows * kernelCols) throw new RangeError('convolution kernel size mismatch');
	if (blockSize < kernelRows || blockSize < kernelCols || (blockSize & (blockSize - 1)) !== 0) {
		throw new RangeError(`block size ${blockSize} must be a power of two ≥ the kernel size`);
	}
}

/**
 * Overlap-save convolution of tile pairs [firstPair, endPair): each B×B input block holds tile A in
 * the real and tile B in the imaginary part; since the kernel is real, one complex transform,
 * product and inverse convolve both, and the last (B − k + 1) rows/columns of each are exact linear
 * convolution values.
 * A backend with its own fused `convolvePairs` (PFFFT keeps the block in WASM memory) runs it instead.
 * @see A. V. Oppenheim, R. W. Schafer, Discrete-Time Signal Processing, 3rd ed., Pearson 2010,
 *   §8.7.3 (overlap-save); Press et al., Numerical Recipes, 3rd ed., §12.3.1 (two real FFTs at once).
 */
export function convolvePairs(
	job: ConvolutionJob,
	kernelSpectrum: Float64Array,
	backend: FftBackend,
	firstPair: number,
	endPair: number,
	block: Float64Array = new Float64Array(2 * job.blockSize * job.blockSize)
): void {
	if (backend.convolvePairs) {
		backend.convolvePairs(job, kernelSpectrum, firstPair, endPair);
		return;
	}
	const b = job.blockSize;
	const layout = tileLayout(job);
	for (let pair = firstPair; pair < endPair; pair++) {
		block.fill(0);
		const first = 2 * pair;
		gatherTile(job, layout, first, block, 0);
		if (first + 1 < layout.count) gatherTile(job, layout, first + 1, block, 1);
		backend.fft2(block, b, b, false);
		for (let p = 0; p < block.length; p += 2) {
			const xr = block[p];
			const xi = block[p + 1];
			const kr = kernelSpectrum[p];
			const ki = kernelSpectrum[p + 1];
			block[p] = xr * kr - xi * ki;
			block[p + 1] = xr * ki + xi * kr;
		}
		backend.fft2(block, b, b, true);
		scatterTile(job, layout, first, block, 0);
		if (first + 1 < layout.count) scatterTile(job, layout, first + 1, block, 1);
	}
}

/** Run a whole job on the calling thread. */
export function convolveSerial(job: ConvolutionJob, backend: FftBackend, kernelSpectrum = kernelBlockSpectrum(job, backend)): void {
	assertConvolutionJob(job);
	convolvePairs(job, kernelSpectrum, backend, 0, tileLayout(job).pairs);
}

/** Tile geometry of a job, from {@link tileLayout}. */
export type TileLayout = ReturnType<typeof tileLayout>;

/**
 * Copy the input block of `tile` into an interleaved complex B×B block starting at `offset` (0 for
 * the real parts, 1 for the imaginary parts, plus the block's start in a larger array). Values
 * outside a 'zero' source are skipped, so the block must be zero-filled first.
 */
export function gatherTile(job: ConvolutionJob, layout: TileLayout, tile: number, block: Float32Array | Float64Array, offset: number): void {
	const b = job.blockSize;
	const r0 = Math.floor(tile / layout.across) * layout.tileRows + job.rowOffset;
	const c0 = (tile % layout.across) * layout.tileCols + job.colOffset;
	const { src, srcRows, srcCols } = job;
	const wrap = job.outside === 'wrap';
	for (let u = 0; u < b; u++) {
		let r = r0 + u;
		if (wrap) r = ((r % srcRows) + srcRows) % srcRows;
		else if (r < 0 || r >= srcRows) continue;
		const rowBase = r * srcCols;
		const blockBase = 2 * u * b + offset;
		if (wrap) {
			// Column c0 + v wrapped into [0, srcCols), stepped instead of taking two remainders per value.
			let c = ((c0 % srcCols) + srcCols) % srcCols;
			for (let v = 0; v < b; v++) {
				block[blockBase + 2 * v] = src[rowBase + c];
				if (++c === srcCols) c = 0;
			}
		} else {
			const vStart = Math.max(0, -c0);
			const vEnd = Math.min(b, srcCols - c0);
			for (let v = vStart; v < vEnd; v++) block[blockBase + 2 * v] = src[rowBase + c0 + v];
		}
	}
}

/** Write the exact (last B − k + 1) rows/columns of a block, times `scale`, to the tile's place in the output. */
export function scatterTile(job: ConvolutionJob, layout: TileLayout, tile: number, block: Float32Array | Float64Array, offset: number, scale = 1): void {
	const b = job.blockSize;
	const r0 = Math.floor(tile / layout.across) * layout.tileRows;
	const c0 = (tile % layout.across) * layout.tileCols;
	const rows = Math.min(layout.tileRows, job.outRows - r0);
	const cols = Math.min(layout.tileCols, job.outCols - c0);
	const skipRows = job.kernelRows - 1;
	const skipCols = job.kernelCols - 1;
	for (let u = 0; u < rows; u++) {
		const outBase = (r0 + u) * job.outCols + c0;
		const blockBase = 2 * ((u + skipRows) * b + skipCols) + offset;
		for (let v = 0; v < cols; v++) job.out[outBase + v] = block[blockBase + 2 * v] * scale;
	}
}

/**
 * Run a job through the backend's thread pool when it has one and the buffers are shared,
 * otherwise on the calling thread. Both paths compute each block identically.
 */
export function convolve(job: ConvolutionJob, backend: FftBackend, kernelSpectrum?: Float64Array): void {
	assertConvolutionJob(job);
	const pool = backend.parallel;
	if (pool && isShared(job.src) && isShared(job.out)) pool.convolve(job);
	else convolveSerial(job, backend, kernelSpectrum);
}

function isShared(a: Float32Array | Float64Array): boolean {
	return typeof SharedArrayBuffer !== 'undefined' && a.buffer instanceof SharedArrayBuffer;
}
