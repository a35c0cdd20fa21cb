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
		for (let j = 1; j < width - 1; j++) {
			const r =
				d[up + j - 1] - 2 * d[up + j] + d[up + j + 1] -
				2 * (d[mid + j - 1] - 2 * d[mid + j] + d[mid + j + 1]) +
				d[down + j - 1] - 2 * d[down + j] + d[down + j + 1];
			rowSum += Math.abs(r);
		}
		total += rowSum;
	}
	return (Math.sqrt(Math.PI / 2) * total) / (6 * (width - 2) * (height - 2));
}
