import { describe, expect, it } from 'vitest';
import { buildKernel } from '../imaging/kernels/build';
import { KERNEL_LIMITS } from '../imaging/kernels/spec';
import {
	addPoint,
	checkSpec,
	deletePoint,
	draftFromSpec,
	draftFromStroke,
	draftToSpec,
	emptyDraft,
	insertPoint,
	lineSpecFromDrag,
	movePoint,
	rectFromDrag,
	setWeight,
	simplifyPolyline,
	type PathDraft,
	type Point
} from './kernel-drawing';

const draw = (...points: Point[]): PathDraft => points.reduce(addPoint, emptyDraft());
const values = (spec: Parameters<typeof buildKernel>[0]) => Array.from(buildKernel(spec).data);

describe('drawn path → kernel spec → kernel', () => {
	it('an unweighted drawn path is the engine kernel of the same path written by hand, value for value', () => {
		const spec = draftToSpec(draw([10, 10], [20, 12], [22, 30]));
		expect(spec).toEqual({ kind: 'path', points: [[10, 10], [20, 12], [22, 30]] });
		expect(values(spec!)).toEqual(values({ kind: 'path', points: [[10, 10], [20, 12], [22, 30]] }));
	});

	it('a dwell of 3 on the second segment becomes weight 3·|segment| and the engine builds the same kernel', () => {
		const spec = draftToSpec(setWeight(draw([10, 10], [20, 12], [22, 30]), 1, 3));
		// |s0| = √(10² + 2²) = 10.19804, |s1| = √(2² + 18²) = 18.11077; × dwell, rounded to 1e-4 (arithmetic by hand).
		const byHand = { kind: 'path' as const, points: [[10, 10], [20, 12], [22, 30]] as Point[], weights: [10.198, 54.3323] };
		expect(spec).toEqual(byHand);
		expect(values(spec!)).toEqual(values(byHand));
		expect(checkSpec(spec)).toEqual({ ok: true, spec: byHand });
	});

	it('a smoothed freehand stroke keeps smooth: true through to the engine', () => {
		const stroke: Point[] = Array.from({ length: 60 }, (_, i) => [i / 2, 6 * Math.sin(i / 10)]);
		const spec = draftToSpec(draftFromStroke(stroke, 0.25))!;
		expect(spec.smooth).toBe(true);
		expect(spec.weights).toBeUndefined();
		expect(values(spec)).toEqual(values({ kind: 'path', points: spec.points.map(([x, y]) => [x, y]), smooth: true }));
	});

	it('equal dwells everywhere are uniform speed: no weights are sent', () => {
		const draft = draw([0, 0], [5, 0], [5, 9]);
		const doubled = setWeight(setWeight(draft, 0, 2), 1, 2);
		expect(draftToSpec(doubled)).toEqual(draftToSpec(draft));
	});

	it('a path of coincident points has no length to weight and stays a valid single tap', () => {
		const spec = draftToSpec(setWeight(draw([4, 4], [4, 4], [4, 4]), 0, 5))!;
		expect(spec.weights).toBeUndefined();
		expect(checkSpec(spec).ok).toBe(true);
	});

	it('an empty draft has no spec', () => {
		expect(draftToSpec(emptyDraft())).toBeNull();
	});

	it('draftFromSpec gives back the dwells a draft was sent with', () => {
		const draft = setWeight(draw([0, 0], [8, 0], [8, 6], [2, 6]), 1, 2.5);
		expect(draftFromSpec(draftToSpec(draft)!)).toEqual(draft);
	});
});

describe('editing keeps one weight per segment', () => {
	it('add, insert, move, delete and set weight', () => {
		let d = draw([0, 0], [10, 0], [10, 10]);
		expect(d.weights).toEqual([1, 1]);
		d = setWeight(d, 1, 4);
		d = insertPoint(d, 1, [10, 5]);
		expect(d.points).toEqual([[0, 0], [10, 0], [10, 5], [10, 10]]);
		expect(d.weights).toEqual([1, 4, 4]);
		d = movePoint(d, 0, [1.234567, -2]);
		expect(d.points[0]).toEqual([1.23, -2]);
		d = deletePoint(d, 1);
		expect(d.points).toEqual([[1.23, -2], [10, 5], [10, 10]]);
		expect(d.weights).toEqual([2.5, 4]);
		d = deletePoint(d, 2);
		expect(d.weights).toEqual([2.5]);
		d = deletePoint(d, 0);
		expect(d).toEqual({ points: [[10, 5]], weights: [], smooth: false });
	});

	it('a seeded random edit sequence never breaks the invariant', () => {
		// Park–Miller minimal standard generator (Park & Miller, CACM 31(10), 1988, doi:10.1145/63039.63042).
		let seed = 12345;
		const next = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
		let d = emptyDraft();
		for (let step = 0; step < 500; step++) {
			const n = d.points.length;
			const p: Point = [next() * 50, next() * 50];
			const op = Math.floor(next() * 5);
			if (op === 0 || n < 2) d = addPoint(d, p);
			else if (op === 1) d = deletePoint(d, Math.floor(next() * n));
			else if (op === 2) d = insertPoint(d, Math.floor(next() * (n - 1)), p);
			else if (op === 3) d = movePoint(d, Math.floor(next() * n), p);
			else d = setWeight(d, Math.floor(next() * (n - 1)), next() * 5);
			expect(d.weights.length).toBe(Math.max(0, d.points.length - 1));
			const spec = draftToSpec(d);
			if (spec) expect(checkSpec(spec).ok).toBe(true);
		}
	});

	it('weights are clamped to [0, 20] and a non-number resets to 1', () => {
		const d = draw([0, 0], [1, 0], [2, 0]);
		expect(setWeight(d, 0, -3).weights).toEqual([0, 1]);
		expect(setWeight(d, 0, 99).weights).toEqual([20, 1]);
		expect(setWeight(d, 1, Number.NaN).weights).toEqual([1, 1]);
	});
});

describe('simplifyPolyline (Ramer–Douglas–Peucker)', () => {
	// Worked by hand from the algorithm's definition (Douglas & Peucker, Cartographica 10(2), 1973,
	// doi:10.3138/FM57-6770-U75U-7727): chord A–E is y = 0, D is 3 away → kept; chord A–D is y = x,
	// B is |1 − 0.4|/√2 = 0.424 and C is 2/√2 = 1.414 away → C kept; chord A–C is y = 0, B is 0.4 away.
	const polyline: Point[] = [[0, 0], [1, 0.4], [2, 0], [3, 3], [4, 0]];

	it('drops B at ε = 0.5 and keeps it at ε = 0.3', () => {
		expect(simplifyPolyline(polyline, 0.5)).toEqual([[0, 0], [2, 0], [3, 3], [4, 0]]);
		expect(simplifyPolyline(polyline, 0.3)).toEqual(polyline);
		expect(simplifyPolyline(polyline, 5)).toEqual([[0, 0], [4, 0]]);
	});

	it('every dropped point lies within ε of the simplified line, and a closed loop survives', () => {
		const loop: Point[] = Array.from({ length: 200 }, (_, i) => [20 * Math.cos((2 * Math.PI * i) / 199), 20 * Math.sin((2 * Math.PI * i) / 199)]);
		const kept = simplifyPolyline(loop, 0.5);
		expect(kept.length).toBeGreaterThan(8);
		expect(kept.length).toBeLessThan(40);
		for (const p of loop) {
			const d = Math.min(
				...kept.slice(1).map((b, s) => {
					const a = kept[s];
					const [dx, dy] = [b[0] - a[0], b[1] - a[1]];
					const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy)));
					return Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy);
				})
			);
			expect(d).toBeLessThanOrEqual(0.5 + 1e-12);
		}
	});

	it('refuses a negative tolerance', () => {
		expect(() => simplifyPolyline(polyline, -1)).toThrow(RangeError);
	});

	it('a stroke longer than the engine allows is simplified until it fits', () => {
		const zigzag: Point[] = Array.from({ length: KERNEL_LIMITS.maxPathPoints + 100 }, (_, i) => [i, i % 2]);
		expect(simplifyPolyline(zigzag, 0.25)).toHaveLength(zigzag.length);
		const fitted = draftFromStroke(zigzag, 0.25).points;
		expect(fitted.length).toBeLessThanOrEqual(KERNEL_LIMITS.maxPathPoints);
		expect(fitted[0]).toEqual(zigzag[0]);
		expect(fitted.at(-1)).toEqual(zigzag.at(-1));
	});
});

describe('lineSpecFromDrag', () => {
	it('a drag from (0, 0) to (10, −10) is 14.142… px at 45° (up-right on screen, image y down)', () => {
		const spec = lineSpecFromDrag([0, 0], [10, -10])!;
		// √200 = 14.1421356… (arithmetic); the engine's angle is CCW on screen (spec.ts).
		expect(spec.length).toBeCloseTo(14.1421356, 6);
		expect(spec.angleDeg).toBeCloseTo(45, 10);
	});

	it('the dragged direction is where the engine draws the line', () => {
		const spec = lineSpecFromDrag([3, 3], [9, -3])!;
		const k = buildKernel(spec);
		const c = (k.shape[0] - 1) / 2;
		expect(k.get(c - 2, c + 2)).toBeGreaterThan(0.05);
		expect(k.get(c + 2, c + 2)).toBe(0);
	});

	it('right is 0°, down is −90°, left is 180°, and a click is no line', () => {
		expect(lineSpecFromDrag([0, 0], [5, 0])).toEqual({ kind: 'line', length: 5, angleDeg: 0 });
		expect(lineSpecFromDrag([0, 0], [0, 5])!.angleDeg).toBeCloseTo(-90, 10);
		expect(lineSpecFromDrag([5, 0], [0, 0])!.angleDeg).toBe(180);
		expect(lineSpecFromDrag([2, 2], [2, 2])).toBeNull();
	});
});

describe('rectFromDrag', () => {
	const image = { width: 100, height: 80 };

	it('covers the touched pixels in whole pixels whichever way the drag went', () => {
		expect(rectFromDrag([10.4, 20.6], [30.2, 40.1], image)).toEqual({ x: 10, y: 20, width: 21, height: 21 });
		expect(rectFromDrag([30.2, 40.1], [10.4, 20.6], image)).toEqual({ x: 10, y: 20, width: 21, height: 21 });
	});

	it('clamps to the image and to the largest side, keeping the start corner', () => {
		expect(rectFromDrag([-5, -5], [200, 200], image)).toEqual({ x: 0, y: 0, width: 100, height: 80 });
		expect(rectFromDrag([90, 70], [0, 0], image, 25)).toEqual({ x: 65, y: 45, width: 25, height: 25 });
		expect(rectFromDrag([120, 10], [150, 20], image)).toBeNull();
	});
});
