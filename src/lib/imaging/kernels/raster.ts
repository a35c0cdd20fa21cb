import { createPlane, type Plane } from '../types';

/**
 * Square odd-sized accumulation grid for kernel rasterisation, centre pixel at (radius, radius).
 * Values are accumulated in Float64 and converted once at the end.
 */
export class KernelGrid {
	readonly size: number;
	readonly values: Float64Array;

	constructor(readonly radius: number) {
		if (!Number.isInteger(radius) || radius < 0) throw new RangeError(`grid radius must be a non-negative integer, got ${radius}`);
		this.size = 2 * radius + 1;
		this.values = new Float64Array(this.size * this.size);
	}

	/** Add `amount` at offset (x, y) from the centre, x to the right, y down. */
	add(x: number, y: number, amount: number): void {
		const col = x + this.radius;
		const row = y + this.radius;
		if (col < 0 || row < 0 || col >= this.size || row >= this.size) {
			throw new RangeError(`kernel sample (${x}, ${y}) falls outside the grid of radius ${this.radius}`);
		}
		this.values[row * this.size + col] += amount;
	}

	/**
	 * Bilinear splat of `amount` at a sub-pixel offset: Σ weights = 1 and Σ weight·position equals
	 * the sample position exactly, so the kernel's centroid equals the samples' centroid.
	 */
	splat(x: number, y: number, amount: number): void {
		const x0 = Math.floor(x);
		const y0 = Math.floor(y);
		const fx = x - x0;
		const fy = y - y0;
		this.add(x0, y0, amount * (1 - fx) * (1 - fy));
		this.add(x0 + 1, y0, amount * fx * (1 - fy));
		this.add(x0, y0 + 1, amount * (1 - fx) * fy);
		this.add(x0 + 1, y0 + 1, amount * fx * fy);
	}

	/** Trim all-zero borders (symmetrically, so the centre stays the centre) and normalise to sum 1. */
	toKernel(): Plane {
		return finishKernel(this.values, this.size, this.size);
	}
}

/**
 * Normalise an odd-sized, centred Float64 kernel to sum 1 and strip zero border rings of equal
 * width on opposite sides (the centre pixel stays the centre).
 * @throws RangeError when the kernel sums to zero or its size is even.
 */
export function finishKernel(values: Float64Array, height: number, width: number): Plane {
	if (height % 2 === 0 || width % 2 === 0) throw new RangeError(`kernel size must be odd, got ${height}×${width}`);
	let sum = 0;
	for (let i = 0; i < values.length; i++) sum += values[i];
	if (!(sum > 0)) throw new RangeError('kernel has no positive weight');
	const rowUsed = (i: number) => {
		for (let j = 0; j < width; j++) if (values[i * width + j] !== 0) return true;
		return false;
	};
	const colUsed = (j: number) => {
		for (let i = 0; i < height; i++) if (values[i * width + j] !== 0) return true;
		return false;
	};
	let trimRows = 0;
	while (trimRows < (height - 1) / 2 && !rowUsed(trimRows) && !rowUsed(height - 1 - trimRows)) trimRows++;
	let trimCols = 0;
	while (trimCols < (width - 1) / 2 && !colUsed(trimCols) && !colUsed(width - 1 - trimCols)) trimCols++;
	const h = height - 2 * trimRows;
	const w = width - 2 * trimCols;
	const out = createPlane(h, w);
	for (let i = 0; i < h; i++) {
		for (let j = 0; j < w; j++) out.data[i * w + j] = values[(i + trimRows) * width + j + trimCols] / sum;
	}
	return out;
}

/** Centroid of a kernel as (x, y) offsets from its centre pixel. */
export function kernelCentroid(kernel: Plane): { x: number; y: number } {
	const [h, w] = kernel.shape;
	let sum = 0;
	let sx = 0;
	let sy = 0;
	for (let i = 0; i < h; i++) {
		for (let j = 0; j < w; j++) {
			const v = kernel.get(i, j);
			sum += v;
			sx += v * (j - (w - 1) / 2);
			sy += v * (i - (h - 1) / 2);
		}
	}
	return { x: sx / sum, y: sy / sum };
}
