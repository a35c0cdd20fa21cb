import sharp from 'sharp';
import type { RasterImage } from '../../imaging';

/** Samples the encoder had to clamp into [0, 1]: restoration can overshoot; the record says how often. */
export interface QuantiseReport {
	belowZero: number;
	aboveOne: number;
}

export interface Encoded {
	bytes: Buffer;
	quantisation: QuantiseReport;
}

/**
 * 16-bit TIFF master, deflate-compressed (lossless), grey or RGB as the image has planes.
 * sharp's TIFF default is 8-bit JPEG, which would throw away the precision the restoration
 * kept, so depth and compression are set explicitly. libvips writes no DateTime tag, so
 * equal pixels give equal bytes (checked in encode.test.ts).
 * Archival masters are lossless TIFF of 8 or 16 bit (FADGI Technical Guidelines, 3rd ed. 2023).
 */
export async function encodeTiff16(image: RasterImage): Promise<Encoded> {
	const { samples, quantisation } = quantise(image, 16);
	const bytes = await sharp(samples, {
		raw: { width: image.width, height: image.height, channels: channelCount(image) }
	})
		.toColourspace(image.planes.length === 1 ? 'grey16' : 'rgb16')
		.tiff({ compression: 'deflate', predictor: 'horizontal' })
		.toBuffer();
	return { bytes, quantisation };
}

/** PNG derivative at 8 or 16 bits per sample, for previews and reports. */
export async function encodePng(image: RasterImage, bitDepth: 8 | 16): Promise<Encoded> {
	const { samples, quantisation } = quantise(image, bitDepth);
	const grey = image.planes.length === 1;
	const colourspace = bitDepth === 16 ? (grey ? 'grey16' : 'rgb16') : grey ? 'b-w' : 'srgb';
	const bytes = await sharp(samples, {
		raw: { width: image.width, height: image.height, channels: channelCount(image) }
	})
		.toColourspace(colourspace)
		.png({ compressionLevel: 9, adaptiveFiltering: false })
		.toBuffer();
	return { bytes, quantisation };
}

/**
 * Interleave planes into integer samples: round(v · (2^bits − 1)) after clamping to [0, 1].
 * NaN or infinite values mean the restoration failed; writing them as black would hide that.
 * The typed array's class tells sharp the sample depth (Uint16Array → 'ushort').
 */
export function quantise(
	image: RasterImage,
	bitDepth: 8 | 16
): { samples: Uint8Array | Uint16Array; quantisation: QuantiseReport } {
	const channels = channelCount(image);
	const count = image.width * image.height;
	const max = bitDepth === 16 ? 65535 : 255;
	const samples = bitDepth === 16 ? new Uint16Array(count * channels) : new Uint8Array(count * channels);
	const quantisation: QuantiseReport = { belowZero: 0, aboveOne: 0 };
	image.planes.forEach((plane, c) => {
		if (plane.shape[0] !== image.height || plane.shape[1] !== image.width) {
			throw new RangeError(`plane ${c} is ${plane.shape.join('×')}, image is ${image.height}×${image.width}`);
		}
		for (let y = 0, i = 0; y < image.height; y++) {
			for (let x = 0; x < image.width; x++, i++) {
				let v = plane.get(y, x);
				if (!Number.isFinite(v)) throw new RangeError(`plane ${c} has a non-finite value at (${x}, ${y})`);
				if (v < 0) {
					quantisation.belowZero++;
					v = 0;
				} else if (v > 1) {
					quantisation.aboveOne++;
					v = 1;
				}
				samples[i * channels + c] = Math.round(v * max);
			}
		}
	});
	return { samples, quantisation };
}

function channelCount(image: RasterImage): 1 | 3 {
	const n = image.planes.length;
	if (n !== 1 && n !== 3) throw new RangeError(`expected 1 or 3 planes, got ${n}`);
	return n;
}
