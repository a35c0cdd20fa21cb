/**
 * Least depth (natural-log units of power, 0.15 ≈ 0.65 dB) for a dip to count, so that flat stretches
 * of a profile (the noise floor, a direction without blur) do not pass on noise alone. A tuning
 * constant chosen on the synthetic cases of the tests, not taken from a source.
 */
export const DIP_MARGIN = 0.15;

/**
 * Share of predicted zeros that the data show as real dips. With z_0 = 0 and lobe middles
 * m_k = (z_k + z_{k+1}) / 2, zero z_k counts when p(z_k) < (p(m_{k−1}) + p(m_k)) / 2 − DIP_MARGIN:
 * darker than the bright lobes on both sides. The profile must be free of the scene's fall-off
 * (ring mean or smooth trend removed), so that only a dark line or ring at z_k can pass. The first
 * `maxTested` zeros whose outer lobe lies inside the profile are tested (linear interpolation
 * between samples).
 * Common practice, no source: zero crossings of the blur's transfer function are the defining
 * feature of straight-motion and defocus blur (Cannon 1976, doi:10.1109/TASSP.1976.1162770).
 * @param profile log power with the fall-off removed, sample i at bin first + i
 * @param zeros predicted zero positions in bins, ascending
 * @returns passed / max(tested, 2) in [0, 1]: a single testable zero earns at most one half, since
 *   one dip alone is too easily imitated by the scene
 */
export function dipShare(profile: Float64Array, first: number, zeros: number[], maxTested = 3): number {
	const { passed, tested } = dipCount(profile, first, zeros, maxTested);
	return passed / Math.max(tested, 2);
}

/**
 * The counts behind {@link dipShare}: how many of the first `maxTested` zeros whose outer lobe lies
 * inside the profile were tested, and how many of them are real dips. Rule 'mean' is dipShare's
 * (darker than the mean of the two lobe middles by `margin`); rule 'both' asks for a local
 * minimum, darker than each lobe middle by `margin`, which a convex fall-off (a power law in
 * the radius, whose mean of two samples always exceeds the sample between) cannot pass.
 */
export function dipCount(profile: Float64Array, first: number, zeros: number[], maxTested = 3, rule: 'mean' | 'both' = 'mean', margin = DIP_MARGIN): { passed: number; tested: number } {
	const last = first + profile.length - 1;
	const at = (bin: number) => {
		const p = Math.max(0, bin - first);
		const i = Math.min(Math.floor(p), profile.length - 2);
		return profile[i] + (p - i) * (profile[i + 1] - profile[i]);
	};
	let tested = 0;
	let passed = 0;
	for (let k = 0; k + 1 < zeros.length && tested < maxTested; k++) {
		const inner = ((k > 0 ? zeros[k - 1] : 0) + zeros[k]) / 2;
		const outer = (zeros[k] + zeros[k + 1]) / 2;
		if (inner < first || outer > last) continue;
		tested++;
		const bright = rule === 'both' ? Math.min(at(inner), at(outer)) : (at(inner) + at(outer)) / 2;
		if (at(zeros[k]) < bright - margin) passed++;
	}
	return { passed, tested };
}
