import ndarray from 'ndarray';
import sharp from 'sharp';
import type { RasterImage } from '../../imaging';

/** Small images built in memory for the I/O tests; no fixture files needed. */
export function rasterFrom(width: number, height: number, planes: number[][]): RasterImage {
	return {
		width,
		height,
		planes: planes.map((values) => ndarray(Float32Array.from(values), [height, width])),
		transfer: 'srgb',
		sourceBitDepth: 16
	};
}

/** Encode interleaved integer samples; the typed array's class sets the depth (sharp input rule). */
export function rawImage(samples: Uint8Array | Uint16Array, width: number, height: number, channels: 1 | 2 | 3 | 4) {
	return sharp(samples, { raw: { width, height, channels } });
}

/** A deterministic ramp of 16-bit samples that exercises both bytes of every value. */
export function ramp16(count: number): Uint16Array {
	return Uint16Array.from({ length: count }, (_, i) => (i * 7919 + 13) % 65536);
}

/**
 * A minimal uncompressed little-endian single-strip grey TIFF written by hand (TIFF 6.0,
 * Adobe 1992, §2 and §8, SampleFormat tag 339 from §19), so the decoder is also checked on
 * files that libvips did not write, including sample types sharp cannot produce.
 */
export function handmadeGreyTiff(width: number, height: number, bits: 16 | 32, sampleFormat: 1 | 3, samples: ArrayLike<number>): Uint8Array {
	const tags: [number, number, number][] = [
		[256, 3, width],
		[257, 3, height],
		[258, 3, bits],
		[259, 3, 1],
		[262, 3, 1],
		[273, 4, 0],
		[277, 3, 1],
		[278, 3, height],
		[279, 4, (width * height * bits) / 8],
		[339, 3, sampleFormat]
	];
	const ifdOffset = 8;
	const ifdSize = 2 + tags.length * 12 + 4;
	const dataOffset = ifdOffset + ifdSize;
	const out = new DataView(new ArrayBuffer(dataOffset + (width * height * bits) / 8));
	out.setUint16(0, 0x4949, true);
	out.setUint16(2, 42, true);
	out.setUint32(4, ifdOffset, true);
	out.setUint16(ifdOffset, tags.length, true);
	tags.forEach(([tag, type, value], i) => {
		const at = ifdOffset + 2 + i * 12;
		out.setUint16(at, tag, true);
		out.setUint16(at + 2, type, true);
		out.setUint32(at + 4, 1, true);
		const v = tag === 273 ? dataOffset : value;
		if (type === 3) out.setUint16(at + 8, v, true);
		else out.setUint32(at + 8, v, true);
	});
	for (let i = 0; i < width * height; i++) {
		if (bits === 16) out.setUint16(dataOffset + i * 2, samples[i], true);
		else out.setFloat32(dataOffset + i * 4, samples[i], true);
	}
	return new Uint8Array(out.buffer);
}
