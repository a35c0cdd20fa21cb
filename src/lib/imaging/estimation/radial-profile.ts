/**
 * Mean of a centred N×N frequency map over rings one bin wide: profile[r] for r = 0 … rMax,
 * each sample split linearly between the two nearest rings so that the profile is not
 * quantised to whole bins. Rings holding no sample are NaN.
 * @throws RangeError when the map is not N×N or rMax is outside [0, N/2].
 */
export function radialMean(values: Float64Array, n: number, rMax: number): Float64Array {
	if (values.length !== n * n) throw new RangeError(`map holds ${values.length} values, expected ${n}×${n}`);
	if (!Number.isInteger(rMax) || rMax < 0 || rMax > n / 2) throw new RangeError(`rMax must be an integer in [0, ${n / 2}], got ${rMax}`);
	const sum = new Float64Array(rMax + 2);
	const weight = new Float64Array(rMax + 2);
	const c = n / 2;
	for (let y = 0; y < n; y++) {
		for (let x = 0; x < n; x++) {
			const r = Math.hypot(x - c, y - c);
			if (r > rMax) continue;
			const r0 = Math.floor(r);
			const f = r - r0;
			const v = values[y * n + x];
			sum[r0] += (1 - f) * v;
			weight[r0] += 1 - f;
			sum[r0 + 1] += f * v;
			weight[r0 + 1] += f;
		}
	}
	return Float64Array.from({ length: rMax + 1 }, (_, r) => (weight[r] > 0 ? sum[r] / weight[r] : NaN));
}

/**
 * Means of a centred N×N frequency map over rings one bin wide within `sectors` equal angular
 * sectors of the half plane: profiles[s][r] for r = 0 … rMax, sector s holding the directions
 * θ ∈ [s·180°/S, (s + 1)·180°/S) and their opposites (a real image's power spectrum is point
 * symmetric, P(−ω) = P(ω)). Samples are split between rings as in {@link radialMean}; empty rings are NaN.
 * @throws RangeError when the map is not N×N, rMax is outside [0, N/2] or sectors is not a positive integer.
 */
export function sectorMeans(values: Float64Array, n: number, rMax: number, sectors: number): Float64Array[] {
	if (values.length !== n * n) throw new RangeError(`map holds ${values.length} values, expected ${n}×${n}`);
	if (!Number.isInteger(rMax) || rMax < 0 || rMax > n / 2) throw new RangeError(`rMax must be an integer in [0, ${n / 2}], got ${rMax}`);
	if (!Number.isInteger(sectors) || sectors < 1) throw new RangeError(`sectors must be a positive integer, got ${sectors}`);
	const sum = Array.from({ length: sectors }, () => new Float64Array(rMax + 2));
	const weight = Array.from({ length: sectors }, () => new Float64Array(rMax + 2));
	const c = n / 2;
	for (let y = 0; y < n; y++) {
		for (let x = 0; x < n; x++) {
			const r = Math.hypot(x - c, y - c);
			if (r > rMax) continue;
			let angle = Math.atan2(y - c, x - c);
			if (angle < 0) angle += Math.PI;
			const s = Math.min(sectors - 1, Math.floor((angle / Math.PI) * sectors));
			const r0 = Math.floor(r);
			const f = r - r0;
			const v = values[y * n + x];
			sum[s][r0] += (1 - f) * v;
			weight[s][r0] += 1 - f;
			sum[s][r0 + 1] += f * v;
			weight[s][r0 + 1] += f;
		}
	}
	return sum.map((ss, s) => Float64Array.from({ length: rMax + 1 }, (_, r) => (weight[s][r] > 0 ? ss[r] / weight[s][r] : NaN)));
}
