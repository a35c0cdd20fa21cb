/**
 * Drawing a blur kernel over the photograph (issue 5, the technician's workbench): the camera's
 * path traced along a light streak, edited point by point, with a dwell weight per segment, and
 * the straight-motion and box drags beside it. Everything here is in original image pixels
 * (x right, y down) and pure, so the overlay component stays a thin layer of pointer handling and
 * the result is the engine's own kernel spec, validated by the engine's own schema.
 */
import type { Region } from '../imaging/estimation/region';
import { KERNEL_LIMITS, kernelSpecSchema, type KernelSpec } from '../imaging/kernels/spec';

export type Point = [number, number];

/**
 * A path being drawn. `weights[s]` is the dwell of segment s (points[s] → points[s + 1]) relative
 * to moving at uniform speed: 1 = the camera crossed it at the same speed as the rest, 2 = it
 * lingered twice as long per pixel, 0 = it jumped. One weight per segment, always.
 */
export interface PathDraft {
	points: Point[];
	weights: number[];
	smooth: boolean;
}

export type PathSpec = Extract<KernelSpec, { kind: 'path' }>;
export type LineSpec = Extract<KernelSpec, { kind: 'line' }>;


/** Largest dwell weight the editor offers; past this the segment simply holds the whole exposure. */
export const MAX_DWELL = 20;
/** Coordinates are kept to 1/100 pixel: far below what a hand can place, and the JSON stays short. */
const round2 = (v: number) => Math.round(v * 100) / 100;

export function emptyDraft(smooth = false): PathDraft {
	return { points: [], weights: [], smooth };
}

const point = ([x, y]: Point): Point => [round2(x), round2(y)];
const dwell = (w: number) => (Number.isFinite(w) ? Math.min(MAX_DWELL, Math.max(0, w)) : 1);

/** Append a point at the end of the path; the new segment gets uniform speed (weight 1). */
export function addPoint(draft: PathDraft, p: Point): PathDraft {
	if (draft.points.length >= KERNEL_LIMITS.maxPathPoints) return draft;
	const points = [...draft.points, point(p)];
	return { ...draft, points, weights: points.length > 1 ? [...draft.weights, 1] : [] };
}

export function movePoint(draft: PathDraft, index: number, p: Point): PathDraft {
	if (index < 0 || index >= draft.points.length) return draft;
	return { ...draft, points: draft.points.map((q, i) => (i === index ? point(p) : q)) };
}

/**
 * Remove a point. An end point takes its one segment with it; an interior point joins its two
 * segments into one whose dwell is their mean, so removing a point does not silently drop a
 * lingering the technician set on either side.
 */
export function deletePoint(draft: PathDraft, index: number): PathDraft {
	const n = draft.points.length;
	if (index < 0 || index >= n) return draft;
	const points = draft.points.filter((_, i) => i !== index);
	let weights: number[];
	if (n <= 2) weights = [];
	else if (index === 0) weights = draft.weights.slice(1);
	else if (index === n - 1) weights = draft.weights.slice(0, -1);
	else weights = [...draft.weights.slice(0, index - 1), (draft.weights[index - 1] + draft.weights[index]) / 2, ...draft.weights.slice(index + 1)];
	return { ...draft, points, weights };
}

/** Split segment s at p (normally a point on it); both halves keep the segment's dwell. */
export function insertPoint(draft: PathDraft, segment: number, p: Point): PathDraft {
	if (segment < 0 || segment >= draft.weights.length || draft.points.length >= KERNEL_LIMITS.maxPathPoints) return draft;
	const points = [...draft.points.slice(0, segment + 1), point(p), ...draft.points.slice(segment + 1)];
	const w = draft.weights[segment];
	const weights = [...draft.weights.slice(0, segment), w, w, ...draft.weights.slice(segment + 1)];
	return { ...draft, points, weights };
}

/** Set segment s's dwell, clamped to [0, MAX_DWELL]; a non-number resets it to 1. */
export function setWeight(draft: PathDraft, segment: number, weight: number): PathDraft {
	if (segment < 0 || segment >= draft.weights.length) return draft;
	return { ...draft, weights: draft.weights.map((w, i) => (i === segment ? dwell(weight) : w)) };
}

/** The point of segment s nearest to p, and its distance: where a click on the segment inserts. */
export function nearestOnSegment(draft: PathDraft, segment: number, p: Point): { point: Point; distance: number } {
	const [ax, ay] = draft.points[segment];
	const [bx, by] = draft.points[segment + 1];
	const dx = bx - ax;
	const dy = by - ay;
	const len2 = dx * dx + dy * dy;
	const t = len2 > 0 ? Math.min(1, Math.max(0, ((p[0] - ax) * dx + (p[1] - ay) * dy) / len2)) : 0;
	const q: Point = [ax + t * dx, ay + t * dy];
	return { point: q, distance: Math.hypot(p[0] - q[0], p[1] - q[1]) };
}

/**
 * Ramer–Douglas–Peucker simplification: keep the end points, find the point farthest from the
 * chord between them, keep it and recurse on both halves if it is farther than `epsilon`, else
 * drop everything between. Distances are to the chord segment (to the end point when the
 * projection falls outside it), which keeps loops in a stroke. U. Ramer, "An iterative procedure
 * for the polygonal approximation of plane curves", Computer Graphics and Image Processing 1(3),
 * 1972, doi:10.1016/S0146-664X(72)80017-0; D. H. Douglas, T. K. Peucker, "Algorithms for the
 * reduction of the number of points required to represent a digitized line or its caricature",
 * Cartographica 10(2):112–122, 1973, doi:10.3138/FM57-6770-U75U-7727.
 * Iterative (explicit stack), so a long stroke cannot overflow the call stack.
 * @throws RangeError for a negative or non-finite epsilon.
 */
export function simplifyPolyline(points: Point[], epsilon: number): Point[] {
	if (!(epsilon >= 0 && Number.isFinite(epsilon))) throw new RangeError(`epsilon must be finite and ≥ 0, got ${epsilon}`);
	if (points.length <= 2) return points.slice();
	const keep = new Uint8Array(points.length);
	keep[0] = 1;
	keep[points.length - 1] = 1;
	const stack: [number, number][] = [[0, points.length - 1]];
	while (stack.length > 0) {
		const [first, last] = stack.pop()!;
		let farthest = -1;
		let farthestDistance = epsilon;
		for (let i = first + 1; i < last; i++) {
			const d = distanceToSegment(points[i], points[first], points[last]);
			if (d > farthestDistance) {
				farthest = i;
				farthestDistance = d;
			}
		}
		if (farthest >= 0) {
			keep[farthest] = 1;
			stack.push([first, farthest], [farthest, last]);
		}
	}
	return points.filter((_, i) => keep[i] === 1);
}

function distanceToSegment([px, py]: Point, [ax, ay]: Point, [bx, by]: Point): number {
	const dx = bx - ax;
	const dy = by - ay;
	const len2 = dx * dx + dy * dy;
	const t = len2 > 0 ? Math.min(1, Math.max(0, ((px - ax) * dx + (py - ay) * dy) / len2)) : 0;
	return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

/**
 * A freehand stroke (image pixels) as a smoothed path draft: simplified with tolerance `epsilon`
 * (the overlay passes about 1.5 screen pixels in image pixels, i.e. hand tremor), drawn back as a
 * Catmull–Rom curve by the engine (`smooth: true`), uniform speed. The tolerance is doubled until
 * the path fits the engine's point limit.
 */
export function draftFromStroke(stroke: Point[], epsilon: number): PathDraft {
	let tolerance = epsilon;
	let points = simplifyPolyline(stroke, tolerance);
	while (points.length > KERNEL_LIMITS.maxPathPoints) {
		tolerance = Math.max(tolerance * 2, 0.01);
		points = simplifyPolyline(stroke, tolerance);
	}
	const rounded = points.map(point);
	return { points: rounded, weights: rounded.slice(1).map(() => 1), smooth: true };
}

/**
 * The engine spec of a draft. The engine's default (no `weights`) is uniform speed — each segment's
 * share proportional to its length — so equal dwells are sent without weights, and otherwise
 * weights[s] = dwell[s] · |segment s| (straight-segment length; for a smoothed path the engine's
 * curve differs slightly from the chord, so a weighted smooth path is a close, stated approximation
 * of "dwell per pixel"). An empty draft has no spec.
 */
export function draftToSpec(draft: PathDraft): PathSpec | null {
	if (draft.points.length === 0) return null;
	const spec: PathSpec = { kind: 'path', points: draft.points.map(([x, y]) => [x, y]) };
	const uniform = draft.weights.every((w) => w === draft.weights[0]) && (draft.weights[0] ?? 1) > 0;
	if (!uniform) {
		const weights = draft.weights.map((w, s) => {
			const [ax, ay] = draft.points[s];
			const [bx, by] = draft.points[s + 1];
			return Math.round(w * Math.hypot(bx - ax, by - ay) * 1e4) / 1e4;
		});
		if (weights.some((w) => w > 0)) spec.weights = weights;
	}
	if (draft.smooth) spec.smooth = true;
	return spec;
}

/**
 * The draft a path spec was drawn from, to edit it again: dwell = weight / segment length,
 * scaled so the smallest positive dwell is 1 (weights fix dwells only up to a common factor, and a
 * technician marks lingering as dwell > 1). A zero-length segment's dwell cannot be told from its
 * weight and reads as 1.
 */
export function draftFromSpec(spec: PathSpec): PathDraft {
	const points = spec.points.map(point);
	const lengths = points.slice(1).map(([bx, by], s) => Math.hypot(bx - points[s][0], by - points[s][1]));
	let weights = lengths.map(() => 1);
	if (spec.weights) {
		const raw = spec.weights.map((w, s) => (lengths[s] > 0 ? w / lengths[s] : 1));
		const positive = raw.filter((w, s) => lengths[s] > 0 && w > 0);
		const base = positive.length ? Math.min(...positive) : 1;
		weights = raw.map((w, s) => (lengths[s] > 0 ? Math.round((w / base) * 100) / 100 : 1));
	}
	return { points, weights, smooth: spec.smooth ?? false };
}

/**
 * Straight motion from a dragged line a → b in image pixels: length |b − a| and the angle of
 * b − a counter-clockwise from +x as seen on screen. Image y points down, so the angle is
 * atan2(−Δy, Δx) (the engine's lineKernel uses direction (cos θ, −sin θ) in image coordinates).
 * Returns null for a drag shorter than 1/100 pixel.
 */
export function lineSpecFromDrag(a: Point, b: Point): LineSpec | null {
	const dx = b[0] - a[0];
	const dy = b[1] - a[1];
	const length = Math.hypot(dx, dy);
	if (!(length >= 0.01)) return null;
	const angleDeg = (Math.atan2(-dy, dx) * 180) / Math.PI;
	// + 0 turns atan2's −0 (a drag straight to the right) into 0.
	return { kind: 'line', length, angleDeg: angleDeg === -180 ? 180 : angleDeg + 0 };
}

/**
 * The box dragged from a to b in whole original pixels: the pixels the drag touches (floor of the
 * smaller corner, ceiling of the larger), clamped to the image and to `maxSide` per side (the part
 * nearest the drag's start is kept). Null when nothing of the image is covered.
 */
export function rectFromDrag(a: Point, b: Point, image: { width: number; height: number }, maxSide = Infinity): Region | null {
	const span = (from: number, to: number, limit: number): [number, number] | null => {
		let lo = Math.max(0, Math.floor(Math.min(from, to)));
		let hi = Math.min(limit, Math.ceil(Math.max(from, to)));
		if (hi === lo && from >= 0 && from < limit) hi = lo + 1;
		if (hi - lo > maxSide) {
			if (to >= from) hi = lo + maxSide;
			else lo = hi - maxSide;
		}
		return hi > lo ? [lo, hi] : null;
	};
	const xs = span(a[0], b[0], image.width);
	const ys = span(a[1], b[1], image.height);
	if (!xs || !ys) return null;
	return { x: xs[0], y: ys[0], width: xs[1] - xs[0], height: ys[1] - ys[0] };
}

/** Check a spec with the engine's schema; the message names the field and the limit. */
export function checkSpec(spec: unknown): { ok: true; spec: KernelSpec } | { ok: false; message: string } {
	const parsed = kernelSpecSchema.safeParse(spec);
	if (parsed.success) return { ok: true, spec: parsed.data };
	return { ok: false, message: parsed.error.issues.map((i) => i.message).join('; ') };
}
