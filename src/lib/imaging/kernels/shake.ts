import { seededRandom } from '../random';
import type { KernelSpec } from './spec';

/** Options of {@link randomShakePath}. */
export interface ShakePathOptions {
	/** Trajectory length in pixels (MaxTotLength). @default 30 */
	length?: number;
	/** Number of trajectory samples. @default 500 */
	samples?: number;
	/** Anxiety (erratic motion) in [0, 1]. @default drawn as 0.1·U(0, 1) as in the reference code */
	anxiety?: number;
}

/**
 * Random camera-shake trajectory after Boracchi & Foi: a particle moving at constant speed whose
 * velocity receives Gaussian jitter, a centripetal pull towards the start and rare abrupt reversals,
 * sampled at `samples` equal time steps (so uniform dwell). Used to make test and benchmark blurs.
 * @see G. Boracchi, A. Foi, "Modeling the Performance of Image Restoration From Motion Blur",
 *   IEEE Trans. Image Processing 21(8):3502–3517, 2012, doi:10.1109/TIP.2012.2192126.
 * @throws RangeError for a non-integer seed or options out of range.
 */
export function randomShakePath(seed: number, opts: ShakePathOptions = {}): Extract<KernelSpec, { kind: 'path' }> {
	if (!Number.isInteger(seed)) throw new RangeError(`seed must be an integer, got ${seed}`);
	const length = opts.length ?? 30;
	const n = opts.samples ?? 500;
	if (!(length > 0 && length <= 512)) throw new RangeError(`length must lie in (0, 512], got ${length}`);
	if (!Number.isInteger(n) || n < 2 || n > 2000) throw new RangeError(`samples must be an integer in [2, 2000], got ${n}`);
	const rand = seededRandom(seed);
	const gauss = () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
	const anxiety = opts.anxiety ?? 0.1 * rand();
	if (!(anxiety >= 0 && anxiety <= 1)) throw new RangeError(`anxiety must lie in [0, 1], got ${anxiety}`);
	const centripetal = 0.7 * rand();
	const bigShake = 0.2 * rand();
	const gaussianTerm = 10 * rand();
	const angle = 2 * Math.PI * rand();
	const stepLength = length / (n - 1);
	let vx = Math.cos(angle) * stepLength;
	let vy = Math.sin(angle) * stepLength;
	let x = 0;
	let y = 0;
	const points: [number, number][] = [[0, 0]];
	for (let t = 1; t < n; t++) {
		let dx = 0;
		let dy = 0;
		if (rand() < bigShake * anxiety) {
			const turn = Math.PI + (rand() - 0.5);
			dx = 2 * (vx * Math.cos(turn) - vy * Math.sin(turn));
			dy = 2 * (vx * Math.sin(turn) + vy * Math.cos(turn));
		}
		dx += anxiety * (gaussianTerm * gauss() - centripetal * x) * stepLength;
		dy += anxiety * (gaussianTerm * gauss() - centripetal * y) * stepLength;
		vx += dx;
		vy += dy;
		const speed = Math.hypot(vx, vy);
		vx = (vx / speed) * stepLength;
		vy = (vy / speed) * stepLength;
		x += vx;
		y += vy;
		points.push([x, y]);
	}
	return { kind: 'path', points };
}
