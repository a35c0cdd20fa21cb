/**
 * The spectrum panel's square size, kept apart from spectrum-view.ts so the page can size the panel
 * without loading the engine's FFT code on the main thread (only the panel's Web Worker loads it).
 */

/** Side of the analysed square when the image is large enough. */
export const DEFAULT_SPECTRUM_SIZE = 256;
/** Smallest square: the spectral estimators' MIN_TILE_SIZE (spectrum-view.test.ts checks they agree). */
export const MIN_SPECTRUM_SIZE = 64;

/**
 * The analysed square's side: the largest power of two that fits both sides and `requested`,
 * or null when even MIN_SPECTRUM_SIZE does not fit.
 * @throws RangeError when `requested` is not a power of two ≥ MIN_SPECTRUM_SIZE.
 */
export function spectrumSize(width: number, height: number, requested = DEFAULT_SPECTRUM_SIZE): number | null {
	if (!Number.isInteger(requested) || requested < MIN_SPECTRUM_SIZE || (requested & (requested - 1)) !== 0) {
		throw new RangeError(`spectrum size must be a power of two ≥ ${MIN_SPECTRUM_SIZE}, got ${requested}`);
	}
	let n = requested;
	while (n > Math.min(width, height)) n /= 2;
	return n >= MIN_SPECTRUM_SIZE ? n : null;
}
