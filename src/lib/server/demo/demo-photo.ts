/**
 * The demo's blurred photograph, made here so no real image is needed: an invented car-park bay
 * sign at dusk with a street lamp (whose streak shows the shake), drawn as SVG and rendered by
 * sharp, then blurred in linear light by a known straight-motion kernel and given mild sensor
 * noise. The blur is known, so the demo's restoration can be judged against the scene.
 */
import sharp from 'sharp';
import { buildKernel, createPlane, linearToSrgb, srgbToLinear, type KernelSpec, type Plane } from '../../imaging/index';
import { seededGaussian } from '../../imaging/random';
import { encodePng } from '../imaging/encode';

export const DEMO_BLUR: KernelSpec = { kind: 'line', length: 15, angleDeg: 20 };

const WIDTH = 960;
const HEIGHT = 640;

function sceneSvg(width: number, height: number): string {
	return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">
	<defs>
		<linearGradient id="sky" x1="0" y1="0" x2="0" y2="1">
			<stop offset="0" stop-color="#2b3a55"/><stop offset="1" stop-color="#6b6f7a"/>
		</linearGradient>
	</defs>
	<rect width="100%" height="100%" fill="url(#sky)"/>
	<rect y="${height * 0.62}" width="100%" height="${height * 0.38}" fill="#3b3d40"/>
	<g stroke="#e8e4d0" stroke-width="6">
		${[0, 1, 2, 3, 4, 5].map((i) => `<line x1="${90 + i * 150}" y1="${height * 0.66}" x2="${40 + i * 170}" y2="${height}"/>`).join('')}
	</g>
	<rect x="${width * 0.5 - 8}" y="${height * 0.16}" width="16" height="${height * 0.48}" fill="#23262b"/>
	<circle cx="${width * 0.5}" cy="${height * 0.15}" r="5" fill="#fffbe8"/>
	<g transform="translate(${width * 0.24} ${height * 0.22})">
		<rect width="330" height="210" rx="10" fill="#1f5fa8" stroke="#f2f2f2" stroke-width="6"/>
		<text x="165" y="78" font-family="DejaVu Sans, sans-serif" font-size="64" font-weight="bold" fill="#ffffff" text-anchor="middle">BAY 14</text>
		<text x="165" y="122" font-family="DejaVu Sans, sans-serif" font-size="26" fill="#ffffff" text-anchor="middle">FENWICK ROW CAR PARK</text>
		<text x="165" y="158" font-family="DejaVu Sans, sans-serif" font-size="20" fill="#ffffff" text-anchor="middle">PERMIT HOLDERS ONLY</text>
		<text x="165" y="188" font-family="DejaVu Sans Mono, monospace" font-size="20" fill="#ffe27a" text-anchor="middle">08:00 – 18:00  QC-7741</text>
	</g>
	<g transform="translate(${width * 0.68} ${height * 0.3})" fill="#f4f1e6">
		${[0, 1, 2, 3, 4].map((i) => `<rect x="${i * 14}" y="0" width="${7 - i}" height="90"/><rect x="${i * 14}" y="110" width="90" height="${7 - i}"/>`).join('')}
	</g>
</svg>`;
}

/** Convolve with the kernel, keeping only pixels whose whole footprint lies inside the frame. */
function blurValid(plane: Float32Array, width: number, height: number, kernel: Plane): { data: Float32Array; width: number; height: number } {
	const [kh, kw] = kernel.shape;
	const outW = width - kw + 1;
	const outH = height - kh + 1;
	const out = new Float32Array(outW * outH);
	const taps: [number, number, number][] = [];
	for (let i = 0; i < kh; i++) for (let j = 0; j < kw; j++) if (kernel.get(i, j) > 0) taps.push([i, j, kernel.get(i, j)]);
	for (let y = 0; y < outH; y++) {
		for (let x = 0; x < outW; x++) {
			let sum = 0;
			// Convolution flips the kernel: output (y, x) gathers input (y + kh-1-i, x + kw-1-j).
			for (const [i, j, w] of taps) sum += w * plane[(y + kh - 1 - i) * width + (x + kw - 1 - j)];
			out[y * outW + x] = sum;
		}
	}
	return { data: out, width: outW, height: outH };
}

/** The blurred demo photo as a 16-bit RGB PNG, and the kernel that blurred it. */
export async function demoBlurredPhoto(): Promise<{ png: Buffer; kernel: KernelSpec }> {
	const kernel = buildKernel(DEMO_BLUR);
	const [kh, kw] = kernel.shape;
	const fullW = WIDTH + kw - 1;
	const fullH = HEIGHT + kh - 1;
	const { data } = await sharp(Buffer.from(sceneSvg(fullW, fullH))).removeAlpha().raw().toBuffer({ resolveWithObject: true });
	const gaussian = seededGaussian(20261202);
	const planes: Plane[] = [];
	for (let c = 0; c < 3; c++) {
		const linear = new Float32Array(fullW * fullH);
		for (let p = 0; p < linear.length; p++) linear[p] = srgbToLinear(data[p * 3 + c] / 255);
		const blurred = blurValid(linear, fullW, fullH, kernel);
		const encoded = new Float32Array(blurred.data.length);
		for (let p = 0; p < encoded.length; p++) {
			// Gaussian noise, σ = 0.4 % of full scale, added in linear light like sensor noise.
			const noise = gaussian() * 0.004;
			encoded[p] = linearToSrgb(Math.min(1, Math.max(0, blurred.data[p] + noise)));
		}
		planes.push(createPlane(HEIGHT, WIDTH, encoded));
	}
	const { bytes } = await encodePng({ width: WIDTH, height: HEIGHT, planes, transfer: 'srgb', sourceBitDepth: 16 }, 16);
	return { png: bytes, kernel: DEMO_BLUR };
}
