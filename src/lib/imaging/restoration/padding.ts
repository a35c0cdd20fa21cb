/**
 * Symmetric (half-sample) reflection of index i into [0, n): … c b a | a b c … | … c b a, repeated
 * for pads wider than the image, so the extension is continuous at the frame edge.
 */
export function reflectIndex(i: number, n: number): number {
	const period = 2 * n;
	const m = ((i % period) + period) % period;
	return m < n ? m : period - 1 - m;
}

/**
 * Place an h×w image at (top, left) inside a rows×cols array and fill the rest by symmetric
 * reflection of the image (common practice, no source; "symmetric" mode of numpy.pad).
 * @throws RangeError when the image does not fit.
 */
export function mirrorPad(
	src: ArrayLike<number>,
	h: number,
	w: number,
	rows: number,
	cols: number,
	top: number,
	left: number,
	/** Receives the padded array (every element is written). @default a new array */
	out: Float64Array = new Float64Array(rows * cols)
): Float64Array {
	if (top < 0 || left < 0 || top + h > rows || left + w > cols) {
		throw new RangeError(`image ${w}×${h} at (${left}, ${top}) does not fit in ${cols}×${rows}`);
	}
	if (out.length !== rows * cols) throw new RangeError(`output holds ${out.length} values, expected ${rows * cols}`);
	const colIndex = new Int32Array(cols);
	for (let j = 0; j < cols; j++) colIndex[j] = reflectIndex(j - left, w);
	for (let i = 0; i < rows; i++) {
		const base = reflectIndex(i - top, h) * w;
		const o = i * cols;
		for (let j = 0; j < cols; j++) out[o + j] = src[base + colIndex[j]];
	}
	return out;
}
