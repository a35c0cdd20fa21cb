/**
 * One pyramid step: an interleaved 8-bit image halved by the mean of each 2 × 2 block (a box
 * filter, the classic image-pyramid reduction; Burt & Adelson, "The Laplacian pyramid as a compact
 * image code", IEEE Trans. Commun. 31(4), 1983, doi:10.1109/TCOM.1983.1095851, use a wider kernel —
 * the box is the cheapest member of that family and enough for a display aid).
 *
 * Sizes round up (⌈w/2⌉ × ⌈h/2⌉): an odd last column or row is averaged with itself, so pixel i
 * of level k always covers original pixels [i·2^k, (i+1)·2^k) and the level's scale is exactly
 * 2^-k, which the client's tile placement relies on. Means round half up.
 */
export interface RawImage {
	data: Uint8Array;
	width: number;
	height: number;
	channels: number;
}

export function halve(image: RawImage): RawImage {
	const { data, width, height, channels } = image;
	const outWidth = Math.ceil(width / 2);
	const outHeight = Math.ceil(height / 2);
	const out = new Uint8Array(outWidth * outHeight * channels);
	const stride = width * channels;
	for (let y = 0; y < outHeight; y++) {
		const row0 = 2 * y * stride;
		const row1 = Math.min(2 * y + 1, height - 1) * stride;
		const outRow = y * outWidth * channels;
		for (let x = 0; x < outWidth; x++) {
			const col0 = 2 * x * channels;
			const col1 = Math.min(2 * x + 1, width - 1) * channels;
			const o = outRow + x * channels;
			for (let c = 0; c < channels; c++) {
				const sum = data[row0 + col0 + c] + data[row0 + col1 + c] + data[row1 + col0 + c] + data[row1 + col1 + c];
				out[o + c] = (sum + 2) >> 2;
			}
		}
	}
	return { data: out, width: outWidth, height: outHeight, channels };
}
