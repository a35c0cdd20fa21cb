/**
 * Browser-only: a picture's pixels as the viewer's difference mode needs them, drawn on the
 * original preview's pixel grid. Previews are same-origin 8-bit PNGs, so the canvas stays
 * readable. A picture of the grid's own size is copied pixel for pixel; one of another size is
 * resampled to the grid (the viewer says so), as the report's panels are.
 */

/** Decoded pixels stay for the last few pictures, so changing the gain does not decode again. */
const KEPT = 4;
const kept = new Map<string, Promise<Uint8ClampedArray>>();

async function decoded(src: string): Promise<HTMLImageElement> {
	const image = new Image();
	image.src = src;
	await image.decode();
	return image;
}

export async function naturalSize(src: string): Promise<{ width: number; height: number }> {
	const image = await decoded(src);
	return { width: image.naturalWidth, height: image.naturalHeight };
}

async function readPixels(src: string, width: number, height: number): Promise<Uint8ClampedArray> {
	const image = await decoded(src);
	const canvas = document.createElement('canvas');
	canvas.width = width;
	canvas.height = height;
	const context = canvas.getContext('2d', { willReadFrequently: true });
	if (!context) throw new Error('This browser gave no 2D canvas');
	context.imageSmoothingQuality = 'high';
	context.drawImage(image, 0, 0, width, height);
	return context.getImageData(0, 0, width, height).data;
}

/** RGBA pixels of `src` on a width × height grid. */
export function pixelsOnGrid(src: string, width: number, height: number): Promise<Uint8ClampedArray> {
	const key = `${width}x${height} ${src}`;
	let pixels = kept.get(key);
	if (!pixels) {
		pixels = readPixels(src, width, height);
		// A failed read is not kept, so the next attempt tries again.
		pixels.catch(() => kept.delete(key));
		kept.set(key, pixels);
		if (kept.size > KEPT) kept.delete(kept.keys().next().value!);
	}
	return pixels;
}
