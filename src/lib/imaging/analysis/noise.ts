import { planeValues, type Plane } from '../types';

/**
 * Fast noise standard deviation of a plane, after Immerkær:
 * σ = √(π/2) · Σ|I ∗ M| / (6 (W − 2)(H − 2)),  M = [[1, −2, 1], [−2, 4, −2], [1, −2, 1]],
 * summed over interior pixels. M is the difference of two Laplacians, so smooth image structure
 * largely cancels and the mean absolute response measures Gaussian noise.
 * @see J. Immerkær, "Fast Noise Variance Estimation", Computer Vision and Image Understanding
 *   64(2):300–302, 1996, doi:10.1006/cviu.1996.0060.
 * @throws RangeError when the plane is smaller than 3×3.
 */
export function estimateNoiseSigma(plane: Plane): number {
	const [height, width] = plane.shape;
	if (height < 3 || width < 3) {
		throw new RangeError(`noise estimate needs at least 3×3 pixels, got ${height}×${width}`);
	}
	const d = planeValues(plane);
	let total = 0;
	for (let i = 1; i < height - 1; i++) {
		let rowSum = 0;
		const up = (i - 1) * width;
		const mid = i * width;
		const down = (i + 1) * width;
		// The 3×3 window slides right: two of its columns are carried over, one is loaded per pixel.
		let a0 = d[up];
		let a1 = d[up + 1];
		let b0 = d[mid];
		let b1 = d[mid + 1];
		let c0 = d[down];
		let c1 = d[down + 1];
		for (let j = 1; j < width - 1; j++) {
			const a2 = d[up + j + 1];
			const b2 = d[mid + j + 1];
			const c2 = d[down + j + 1];
			const r = a0 - 2 * a1 + a2 - 2 * (b0 - 2 * b1 + b2) + c0 - 2 * c1 + c2;
			rowSum += Math.abs(r);
			a0 = a1;
			a1 = a2;
			b0 = b1;
			b1 = b2;
			c0 = c1;
			c1 = c2;
		}
		total += rowSum;
	}
	return (Math.sqrt(Math.PI / 2) * total) / (6 * (width - 2) * (height - 2));
}
