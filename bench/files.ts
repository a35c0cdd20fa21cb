import { writeFileSync } from 'node:fs';
import sharp from 'sharp';
import type { SynthImage } from './image';

/** Planes back to back as little-endian float32 (the layout numpy.fromfile('<f4') reads). */
export function writeF32(path: string, img: SynthImage): void {
	const all = new Float32Array(img.planes.length * img.width * img.height);
	img.planes.forEach((p, c) => all.set(p, c * img.width * img.height));
	writeFileSync(path, new Uint8Array(all.buffer));
}

export function writeF64(path: string, values: Float64Array): void {
	writeFileSync(path, new Uint8Array(values.buffer, values.byteOffset, values.byteLength));
}

export function readF32(bytes: Buffer, width: number, height: number, channels: number): SynthImage {
	const all = new Float32Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
	if (all.length !== width * height * channels) throw new RangeError(`expected ${width * height * channels} floats, got ${all.length}`);
	return { width, height, planes: Array.from({ length: channels }, (_, c) => all.subarray(c * width * height, (c + 1) * width * height)) };
}

/** 16-bit PNG for looking at the cases and for feeding them to `npm run restore`. */
export async function writePng16(path: string, img: SynthImage): Promise<void> {
	const ch = img.planes.length;
	const samples = new Uint16Array(img.width * img.height * ch);
	for (let i = 0; i < img.width * img.height; i++) {
		for (let c = 0; c < ch; c++) samples[i * ch + c] = Math.round(Math.min(1, Math.max(0, img.planes[c][i])) * 65535);
	}
	await sharp(samples, { raw: { width: img.width, height: img.height, channels: ch as 1 | 3 } })
		.toColourspace(ch === 1 ? 'grey16' : 'rgb16')
		.png()
		.toFile(path);
}
