import type { Plane } from '../types';
import { KERNEL_LIMITS } from './spec';
import { KernelGrid } from './raster';

/** Options of {@link pathKernel}. */
export interface PathKernelOptions {
	/** Exposure share of each segment (dwell); @default proportional to segment length (uniform speed). */
	weights?: number[];
	/** Draw a uniform Catmull–Rom curve through the points instead of straight segments. @default false */
	smooth?: boolean;
}

/** Samples per pixel of path length; bilinear splats of samples this dense leave no gaps. */
const SAMPLES_PER_PIXEL = 8;
/** Curve pieces per span between two points of a smoothed path. */
const PIECES_PER_SPAN = 16;

interface Segment {
	ax: number;
	ay: number;
	bx: number;
	by: number;
	energy: number;
}

/**
 * Camera-shake kernel from a trajectory drawn in image pixels. The exposure is spread along the
 * path (segment s receives the share weights[s] / Σ weights, uniformly along its length), sampled
 * SAMPLES_PER_PIXEL times per pixel and splatted bilinearly; the trajectory is first shifted so its
 * energy centroid is the centre pixel, so restored images are not displaced. This is the kernel
 * model of random camera-shake trajectories after G. Boracchi, A. Foi, "Modeling the Performance of
 * Image Restoration From Motion Blur", IEEE Trans. Image Processing 21(8):3502–3517, 2012,
 * doi:10.1109/TIP.2012.2192126. Smoothing uses the uniform Catmull–Rom spline (E. Catmull, R. Rom,
 * "A class of local interpolating splines", Computer Aided Geometric Design, Academic Press 1974).
 * @throws RangeError for an empty or too long path, non-finite coordinates, or weights that do
 *   not match the segments or sum to zero.
 */
export function pathKernel(points: [number, number][], options: PathKernelOptions = {}): Plane {
	if (points.length < 1 || points.length > KERNEL_LIMITS.maxPathPoints) {
		throw new RangeError(`path needs 1 to ${KERNEL_LIMITS.maxPathPoints} points, got ${points.length}`);
	}
	for (const [x, y] of points) {
		if (!Number.isFinite(x) || !Number.isFinite(y)) throw new RangeError('path coordinates must be finite');
	}
	const segmentCount = points.length - 1;
	const weights = options.weights;
	if (weights !== undefined) {
		if (weights.length !== segmentCount) {
			throw new RangeError(`path weights must have one value per segment (${segmentCount}), got ${weights.length}`);
		}
		if (weights.some((w) => !(w >= 0) || !Number.isFinite(w))) throw new RangeError('path weights must be finite and non-negative');
		if (segmentCount > 0 && !weights.some((w) => w > 0)) throw new RangeError('path weights must not all be zero');
	}
	const segments = buildSegments(points, weights, options.smooth ?? false);
	const samples = sampleSegments(segments);
	let total = 0;
	let cx = 0;
	let cy = 0;
	for (const [x, y, e] of samples) {
		total += e;
		cx += e * x;
		cy += e * y;
	}
	if (!(total > 0)) {
		// A path without length or dwell is a still camera: a single tap.
		samples.length = 0;
		samples.push([0, 0, 1]);
		total = 1;
		cx = 0;
		cy = 0;
	}
	cx /= total;
	cy /= total;
	let reach = 0;
	for (const s of samples) {
		s[0] -= cx;
		s[1] -= cy;
		reach = Math.max(reach, Math.abs(s[0]), Math.abs(s[1]));
	}
	const grid = new KernelGrid(Math.ceil(reach) + 1);
	for (const [x, y, e] of samples) grid.splat(x, y, e);
	return grid.toKernel();
}

function buildSegments(points: [number, number][], weights: number[] | undefined, smooth: boolean): Segment[] {
	const out: Segment[] = [];
	if (points.length === 1) return [{ ax: points[0][0], ay: points[0][1], bx: points[0][0], by: points[0][1], energy: 1 }];
	for (let s = 0; s < points.length - 1; s++) {
		const pieces = smooth && points.length > 2 ? catmullRomSpan(points, s) : [points[s], points[s + 1]];
		const lengths: number[] = [];
		let spanLength = 0;
		for (let p = 0; p + 1 < pieces.length; p++) {
			const len = Math.hypot(pieces[p + 1][0] - pieces[p][0], pieces[p + 1][1] - pieces[p][1]);
			lengths.push(len);
			spanLength += len;
		}
		const energy = weights ? weights[s] : spanLength;
		for (let p = 0; p + 1 < pieces.length; p++) {
			const share = spanLength > 0 ? lengths[p] / spanLength : 1 / lengths.length;
			out.push({ ax: pieces[p][0], ay: pieces[p][1], bx: pieces[p + 1][0], by: pieces[p + 1][1], energy: energy * share });
		}
	}
	return out;
}

/** Points of the uniform Catmull–Rom curve from points[s] to points[s + 1] (end tangents mirrored). */
function catmullRomSpan(points: [number, number][], s: number): [number, number][] {
	const p1 = points[s];
	const p2 = points[s + 1];
	const p0: [number, number] = s > 0 ? points[s - 1] : [2 * p1[0] - p2[0], 2 * p1[1] - p2[1]];
	const p3: [number, number] = s + 2 < points.length ? points[s + 2] : [2 * p2[0] - p1[0], 2 * p2[1] - p1[1]];
	const out: [number, number][] = [];
	for (let i = 0; i <= PIECES_PER_SPAN; i++) {
		const t = i / PIECES_PER_SPAN;
		const t2 = t * t;
		const t3 = t2 * t;
		const f = (a: number, b: number, c: number, d: number) =>
			0.5 * (2 * b + (-a + c) * t + (2 * a - 5 * b + 4 * c - d) * t2 + (-a + 3 * b - 3 * c + d) * t3);
		out.push([f(p0[0], p1[0], p2[0], p3[0]), f(p0[1], p1[1], p2[1], p3[1])]);
	}
	return out;
}

/** Midpoint samples [x, y, energy] along every segment; a zero-length segment is one dwell sample. */
function sampleSegments(segments: Segment[]): [number, number, number][] {
	const samples: [number, number, number][] = [];
	for (const seg of segments) {
		if (seg.energy === 0) continue;
		const len = Math.hypot(seg.bx - seg.ax, seg.by - seg.ay);
		const n = Math.max(1, Math.ceil(len * SAMPLES_PER_PIXEL));
		for (let i = 0; i < n; i++) {
			const t = (i + 0.5) / n;
			samples.push([seg.ax + t * (seg.bx - seg.ax), seg.ay + t * (seg.by - seg.ay), seg.energy / n]);
		}
	}
	return samples;
}
