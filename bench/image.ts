/** A benchmark image: planes of sRGB-encoded values in [0, 1], row-major, kept apart from the engine's types. */
export interface SynthImage {
	width: number;
	height: number;
	planes: Float32Array[];
}

export function cropImage(img: SynthImage, x0: number, y0: number, width: number, height: number): SynthImage {
	if (x0 < 0 || y0 < 0 || x0 + width > img.width || y0 + height > img.height) {
		throw new RangeError(`crop ${width}×${height}+${x0}+${y0} leaves the ${img.width}×${img.height} image`);
	}
	const planes = img.planes.map((p) => {
		const out = new Float32Array(width * height);
		for (let y = 0; y < height; y++) out.set(p.subarray((y0 + y) * img.width + x0, (y0 + y) * img.width + x0 + width), y * width);
		return out;
	});
	return { width, height, planes };
}
