import { Prng } from './prng';

/**
 * Blur kernels for SYNTHESIS only. They are written here, apart from the engine's own kernel
 * builders, so the benchmark does not grade the engine against itself: the engine receives
 * exactly these arrays as an `image` kernel spec.
 */
export interface SynthKernel {
	size: number;
	/** Row-major size×size weights summing to 1. */
	data: Float64Array;
	label: string;
}

const SUPERSAMPLE = 8;

/** Rasterise a coverage function by supersampling each pixel SUPERSAMPLE² times. */
function rasterise(size: number, inside: (x: number, y: number) => number, label: string): SynthKernel {
	const c = (size - 1) / 2;
	const data = new Float64Array(size * size);
	for (let y = 0; y < size; y++) {
		for (let x = 0; x < size; x++) {
			let acc = 0;
			for (let sy = 0; sy < SUPERSAMPLE; sy++) {
				for (let sx = 0; sx < SUPERSAMPLE; sx++) {
					acc += inside(x - c - 0.5 + (sx + 0.5) / SUPERSAMPLE, y - c - 0.5 + (sy + 0.5) / SUPERSAMPLE);
				}
			}
			data[y * size + x] = acc;
		}
	}
	return normalise({ size, data, label });
}

/** Straight motion of `length` px at `angleDeg` counter-clockwise from +x on screen (y down). */
export function lineKernel(length: number, angleDeg: number): SynthKernel {
	const size = 2 * Math.ceil(length / 2 + 1) + 1;
	const t = (angleDeg * Math.PI) / 180;
	const ux = Math.cos(t);
	const uy = -Math.sin(t);
	// A segment one pixel thick: the box model of uniform linear motion (Gonzalez & Woods).
	return rasterise(
		size,
		(x, y) => (Math.abs(x * ux + y * uy) <= length / 2 && Math.abs(-x * uy + y * ux) <= 0.5 ? 1 : 0),
		`line L=${length} θ=${angleDeg}°`
	);
}

/** Uniform disk (pillbox) of radius r: geometric defocus (Cannon, IEEE TASSP 1976). */
export function diskKernel(radius: number): SynthKernel {
	const size = 2 * Math.ceil(radius) + 1;
	return rasterise(size, (x, y) => (x * x + y * y <= radius * radius ? 1 : 0), `disk R=${radius}`);
}

/** Sampled Gaussian truncated at ±3σ. */
export function gaussianKernel(sigma: number): SynthKernel {
	const half = Math.ceil(3 * sigma);
	const size = 2 * half + 1;
	const data = new Float64Array(size * size);
	for (let y = 0; y < size; y++) {
		for (let x = 0; x < size; x++) {
			data[y * size + x] = Math.exp(-((x - half) ** 2 + (y - half) ** 2) / (2 * sigma * sigma));
		}
	}
	return normalise({ size, data, label: `gaussian σ=${sigma}` });
}

/**
 * Random camera-shake kernel after Boracchi & Foi, "Modeling the performance of image
 * restoration from motion blur", IEEE TIP 21(8), 2012: a random-walk trajectory with inertia,
 * a centripetal pull, Gaussian jitter and rare abrupt shakes, sampled over the exposure and
 * splatted bilinearly into the kernel grid. Parameters follow their published generator as
 * recalled from memory (numT = 2000 steps, anxiety, centripetal ≤ 0.7, big-shake probability
 * ≤ 0.2, gaussian term ≤ 10, total length 60 px). Unlike their fixed 64-px canvas, the trajectory
 * is then scaled to reach the border of `size`, so every kernel blurs by about its full support.
 */
export function shakeKernel(size: number, seed: number, maxLength = 60): SynthKernel {
	const rng = new Prng(seed);
	const numT = 2000;
	const anxiety = 0.1 * rng.next();
	const centripetal = 0.7 * rng.next();
	const gaussianTerm = 10 * rng.next();
	const bigShake = 0.2 * rng.next();
	const step = maxLength / (numT - 1);
	const phi = Math.PI * rng.next();
	let vx = Math.cos(phi) * anxiety;
	let vy = Math.sin(phi) * anxiety;
	const xs = new Float64Array(numT);
	const ys = new Float64Array(numT);
	for (let t = 0; t < numT - 1; t++) {
		let nx = 0;
		let ny = 0;
		if (rng.next() < bigShake * anxiety) {
			// Abrupt shake: reverse roughly, with a random turn of up to ±0.5 rad.
			const a = Math.PI + (rng.next() - 0.5);
			nx = 2 * (vx * Math.cos(a) - vy * Math.sin(a));
			ny = 2 * (vx * Math.sin(a) + vy * Math.cos(a));
		}
		vx += nx + anxiety * (gaussianTerm * rng.normal() - centripetal * xs[t]) * step;
		vy += ny + anxiety * (gaussianTerm * rng.normal() - centripetal * ys[t]) * step;
		const norm = Math.hypot(vx, vy) || 1;
		vx = (vx / norm) * step;
		vy = (vy / norm) * step;
		xs[t + 1] = xs[t] + vx;
		ys[t + 1] = ys[t] + vy;
	}
	// Exposure: the whole trajectory, each sample weighted equally (uniform dwell). Centring on
	// the samples' mean puts the kernel's centroid on the centre pixel (bilinear splatting keeps
	// the centroid), so the blurred image stays aligned with the sharp one.
	const mx = xs.reduce((a, b) => a + b, 0) / numT;
	const my = ys.reduce((a, b) => a + b, 0) / numT;
	let reach = 1e-9;
	for (let t = 0; t < numT; t++) reach = Math.max(reach, Math.abs(xs[t] - mx), Math.abs(ys[t] - my));
	const c = (size - 1) / 2;
	const scale = (c - 1) / reach;
	const data = new Float64Array(size * size);
	for (let t = 0; t < numT; t++) {
		const px = c + (xs[t] - mx) * scale;
		const py = c + (ys[t] - my) * scale;
		const x0 = Math.floor(px);
		const y0 = Math.floor(py);
		const fx = px - x0;
		const fy = py - y0;
		data[y0 * size + x0] += (1 - fx) * (1 - fy);
		data[y0 * size + x0 + 1] += fx * (1 - fy);
		data[(y0 + 1) * size + x0] += (1 - fx) * fy;
		data[(y0 + 1) * size + x0 + 1] += fx * fy;
	}
	return normalise({ size, data, label: `shake #${seed}` });
}
function normalise(k: SynthKernel): SynthKernel {
	const sum = k.data.reduce((a, b) => a + b, 0);
	if (!(sum > 0)) throw new RangeError(`kernel ${k.label} has no mass`);
	for (let i = 0; i < k.data.length; i++) k.data[i] /= sum;
	return k;
}
