/**
 * The amplified difference between two pictures on one pixel grid, for the before/after viewer.
 * It shows where two images differ and by how much; it is not detail: a bright pixel here is a
 * change between the two, never something either picture holds.
 *
 * Per colour channel, with a and b the two 8-bit values at one pixel:
 *   absolute: out = min(255, |a − b| · gain)
 *   signed:   out = min(255, max(0, 128 + (a − b) · gain)), so mid-grey (128) means equal and
 *             lighter means the first picture is brighter there.
 * Both are explicit about clipping: a difference too large for the gain saturates at 0 or 255.
 * Amplified absolute and signed difference displays are common practice, no source.
 */

export const DIFFERENCE_GAINS = [1, 2, 4, 8, 16, 32] as const;
export type DifferenceGain = (typeof DIFFERENCE_GAINS)[number];

/** The value a signed difference of zero is drawn at. */
export const SIGNED_ZERO = 128;

export interface DifferenceOptions {
	/** Multiplier applied to each channel's difference. @default 1 */
	gain?: DifferenceGain;
	/** Keep the sign around mid-grey instead of taking the magnitude. @default false */
	signed?: boolean;
	/** Where to write the RGBA result (e.g. an ImageData's buffer); a new array when absent. */
	output?: Uint8ClampedArray;
}

export interface DifferenceSummary {
	/** The RGBA picture of the difference, alpha 255. */
	data: Uint8ClampedArray;
	/** Largest |a − b| over every pixel and colour channel, before the gain (0–255). */
	maxAbs: number;
	/** Pixels where at least one colour channel differs. */
	differing: number;
	pixels: number;
}

/**
 * The difference of two RGBA pixel arrays of the same length (as a canvas's getImageData gives);
 * alpha is ignored, since both previews are opaque PNGs.
 */
export function differenceImage(a: ArrayLike<number>, b: ArrayLike<number>, options: DifferenceOptions = {}): DifferenceSummary {
	const { gain = 1, signed = false } = options;
	if (a.length !== b.length) throw new RangeError(`The two pictures differ in size (${a.length} and ${b.length} values)`);
	if (a.length % 4 !== 0) throw new RangeError(`Expected RGBA pixels, got ${a.length} values`);
	if (!DIFFERENCE_GAINS.includes(gain)) throw new RangeError(`gain must be one of ${DIFFERENCE_GAINS.join(', ')}, got ${gain}`);
	const data = options.output ?? new Uint8ClampedArray(a.length);
	if (data.length !== a.length) throw new RangeError(`output holds ${data.length} values, expected ${a.length}`);

	let maxAbs = 0;
	let differing = 0;
	for (let i = 0; i < a.length; i += 4) {
		let pixelDiffers = false;
		for (let c = 0; c < 3; c++) {
			const delta = a[i + c] - b[i + c];
			const magnitude = Math.abs(delta);
			if (magnitude > maxAbs) maxAbs = magnitude;
			if (magnitude !== 0) pixelDiffers = true;
			data[i + c] = signed ? Math.min(255, Math.max(0, SIGNED_ZERO + delta * gain)) : Math.min(255, magnitude * gain);
		}
		data[i + 3] = 255;
		if (pixelDiffers) differing++;
	}
	return { data, maxAbs, differing, pixels: a.length / 4 };
}
