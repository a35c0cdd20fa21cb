import { degrade, type BenchCase } from './degrade';
import { diskKernel, gaussianKernel, lineKernel, shakeKernel, type SynthKernel } from './kernels';
import { Prng } from './prng';
import { SCENES } from './scenes';

/** Side of every benchmark crop, and of the scene rendered around it (room for a 33-px kernel). */
export const CASE_SIZE = 256;
const RENDER_SIZE = CASE_SIZE + 64;

/**
 * Every scene under each blur family with seeded random strengths, noise σ drawn from
 * 0.3–1 % of full scale (issue 3's range). Seeds are fixed so the set is the same on every run.
 */
export async function buildCases(seed = 2012): Promise<BenchCase[]> {
	const rng = new Prng(seed);
	const cases: BenchCase[] = [];
	for (const scene of SCENES) {
		const sharpImg = await scene.render(RENDER_SIZE);
		const kernels: SynthKernel[] = [
			lineKernel(Math.round(rng.between(9, 21)), Math.round(rng.between(0, 180))),
			diskKernel(Math.round(rng.between(3, 7) * 2) / 2),
			gaussianKernel(Math.round(rng.between(1.5, 3.5) * 4) / 4),
			shakeKernel(2 * Math.round(rng.between(8, 15)) + 1, Math.floor(rng.next() * 1e6))
		];
		for (const k of kernels) {
			const sigma = Math.round(rng.between(0.003, 0.01) * 10000) / 10000;
			const family = k.label.split(' ')[0];
			cases.push(degrade(`${scene.name}/${family}`, scene.name, sharpImg, k, sigma, CASE_SIZE, Math.floor(rng.next() * 1e9)));
		}
	}
	return cases;
}
