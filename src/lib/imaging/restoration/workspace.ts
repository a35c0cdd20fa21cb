import type { HalfSpectrum } from '../fft/real-fft';

/**
 * Large buffers and kernel transfer functions kept between calls on planes of the same size, such
 * as the channels of one image (restore() makes one per call and drops it at the end). Reuse
 * avoids re-allocating (and the OS re-zeroing) hundreds of MB per channel, and keeps garbage from
 * piling up before the collector runs, which set the peak memory of 24 MP RGB restorations.
 * Buffers handed out are NOT cleared: callers overwrite every element.
 */
export class Workspace {
	private readonly buffers = new Map<string, Float64Array>();
	private readonly spectra = new Map<string, HalfSpectrum>();

	/**
	 * A Float64Array of `length` under `key`, reused when the length matches.
	 * @param allocate makes a new buffer (e.g. a thread pool's shared memory). @default new Float64Array
	 */
	float64(key: string, length: number, allocate: (length: number) => Float64Array = (n) => new Float64Array(n)): Float64Array {
		const found = this.buffers.get(key);
		if (found?.length === length) return found;
		const fresh = allocate(length);
		this.buffers.set(key, fresh);
		return fresh;
	}

	/** The transfer function under `key` (grid size and backend), computed once. */
	spectrum(key: string, compute: () => HalfSpectrum): HalfSpectrum {
		let found = this.spectra.get(key);
		if (!found) this.spectra.set(key, (found = compute()));
		return found;
	}
}
