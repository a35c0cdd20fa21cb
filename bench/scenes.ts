import sharp from 'sharp';
import type { SynthImage } from './image';
import { Prng } from './prng';

/**
 * Invented benchmark scenes: signs, a typed document, a resolution chart, a parcel label and a
 * procedural natural texture. Nothing is downloaded; names and numbers are made up. Tones stay
 * within [0.06, 0.94] so added noise is not clipped (clipping would break the linear model the
 * benchmark tests; Whyte, Sivic & Zisserman, IJCV 2014).
 */
export interface Scene {
	name: string;
	kind: 'sign' | 'document' | 'chart' | 'label' | 'texture';
	render(size: number): Promise<SynthImage>;
}

async function fromSvg(svg: string, grey: boolean): Promise<SynthImage> {
	const { data, info } = await sharp(Buffer.from(svg)).removeAlpha().raw().toBuffer({ resolveWithObject: true });
	const n = info.width * info.height;
	const planes = Array.from({ length: grey ? 1 : 3 }, () => new Float32Array(n));
	for (let i = 0; i < n; i++) {
		for (let c = 0; c < planes.length; c++) planes[c][i] = data[i * info.channels + c] / 255;
	}
	return { width: info.width, height: info.height, planes };
}

const svgOpen = (s: number, bg: string) =>
	`<svg xmlns="http://www.w3.org/2000/svg" width="${s}" height="${s}" viewBox="0 0 320 320"><rect width="320" height="320" fill="${bg}"/>`;

export const SCENES: Scene[] = [
	{
		name: 'street-sign',
		kind: 'sign',
		render: (s) =>
			fromSvg(
				`${svgOpen(s, '#7a8b6f')}
				<rect x="24" y="70" width="272" height="150" rx="12" fill="#1d4f8f" stroke="#e8e8e0" stroke-width="6"/>
				<text x="160" y="128" font-family="DejaVu Sans" font-weight="bold" font-size="34" fill="#ecebe4" text-anchor="middle">QUILLMOOR</text>
				<text x="160" y="168" font-family="DejaVu Sans" font-size="22" fill="#ecebe4" text-anchor="middle">Tarrow Lane 47</text>
				<path d="M70 195 h150 v-10 l30 18 l-30 18 v-10 h-150 z" fill="#f0c419"/>
				<rect x="150" y="220" width="20" height="100" fill="#5c5c5c"/>
				<text x="160" y="60" font-family="DejaVu Sans Mono" font-size="14" fill="#202020" text-anchor="middle">ZONE B-12 · NO ENTRY 22–06</text>
				</svg>`,
				false
			)
	},
	{
		name: 'typed-memo',
		kind: 'document',
		render: (s) => {
			const lines = [
				'MEMO 0413 — Archive intake',
				'Box 27 of the Harlow-Venn papers arrived',
				'with water damage on folders 3 to 9.',
				'Ledger totals: 1,482.50 / 2,907.15',
				'Scan at 600 ppi, 16-bit, no sharpening.',
				'Ref. KV-7731-Q  checked by: T.M.',
				'Return date 19 Oct, shelf 4C, row 11.',
				'Fragile: handle with nitrile gloves.'
			];
			const text = lines
				.map((l, i) => `<text x="22" y="${60 + i * 30}" font-family="${i === 0 ? 'DejaVu Sans' : 'DejaVu Serif'}" font-size="${i === 0 ? 17 : 14}" fill="#1a1a1a">${l}</text>`)
				.join('');
			return fromSvg(`${svgOpen(s, '#e9e6dc')}<line x1="22" y1="70" x2="298" y2="70" stroke="#333" stroke-width="1.5"/>${text}</svg>`, true);
		}
	},
	{
		name: 'resolution-chart',
		kind: 'chart',
		render: (s) => {
			let bars = '';
			// Groups of three bars at widths 6 … 1.5 px (in the 320-unit frame), both orientations.
			[6, 4.5, 3, 2.25, 1.5].forEach((w, g) => {
				const x = 20 + g * 58;
				for (let b = 0; b < 3; b++) {
					bars += `<rect x="${x + b * 2 * w}" y="20" width="${w}" height="${12 * w}" fill="#151515"/>`;
					bars += `<rect x="${x}" y="${110 + b * 2 * w}" width="${Math.min(12 * w, 50)}" height="${w}" fill="#151515"/>`;
				}
				bars += `<text x="${x}" y="${200}" font-family="DejaVu Sans" font-size="12" fill="#151515">${(1 / w).toFixed(2)}</text>`;
			});
			let star = '';
			const n = 36;
			for (let i = 0; i < n; i += 2) {
				const a0 = (i / n) * 2 * Math.PI;
				const a1 = ((i + 1) / n) * 2 * Math.PI;
				star += `<path d="M240 255 L${240 + 60 * Math.cos(a0)} ${255 + 60 * Math.sin(a0)} L${240 + 60 * Math.cos(a1)} ${255 + 60 * Math.sin(a1)} Z" fill="#151515"/>`;
			}
			const steps = Array.from({ length: 8 }, (_, i) => {
				const v = Math.round(20 + (i * 215) / 7);
				return `<rect x="${20 + i * 18}" y="230" width="18" height="60" fill="rgb(${v},${v},${v})"/>`;
			}).join('');
			return fromSvg(`${svgOpen(s, '#ebebeb')}${bars}${star}${steps}</svg>`, true);
		}
	},
	{
		name: 'parcel-label',
		kind: 'label',
		render: (s) => {
			const rng = new Prng(77);
			let x = 30;
			let code = '';
			while (x < 280) {
				const w = 1 + Math.floor(rng.next() * 4);
				code += `<rect x="${x}" y="180" width="${w}" height="70" fill="#141414"/>`;
				x += w + 1 + Math.floor(rng.next() * 4);
			}
			let grid = '';
			for (let i = 0; i < 21; i++) for (let j = 0; j < 21; j++) if (rng.next() < 0.5) grid += `<rect x="${210 + i * 4}" y="${40 + j * 4}" width="4" height="4" fill="#141414"/>`;
			return fromSvg(
				`${svgOpen(s, '#b08a5a')}<rect x="18" y="28" width="284" height="260" fill="#efefe8"/>
				<text x="30" y="60" font-family="DejaVu Sans" font-weight="bold" font-size="20" fill="#141414">PRIORITY 2</text>
				<text x="30" y="90" font-family="DejaVu Sans Mono" font-size="13" fill="#141414">TO: E. Marrowby</text>
				<text x="30" y="110" font-family="DejaVu Sans Mono" font-size="13" fill="#141414">14 Cindervale Row</text>
				<text x="30" y="130" font-family="DejaVu Sans Mono" font-size="13" fill="#141414">Unit 9, Postbox 3318</text>
				<text x="30" y="160" font-family="DejaVu Sans Mono" font-size="15" fill="#b0201c">REF 40-7713-K</text>
				${grid}${code}<text x="30" y="275" font-family="DejaVu Sans Mono" font-size="12" fill="#141414">0 4077 1313 9K</text></svg>`,
				false
			);
		}
	},
	{ name: 'lichen-stone', kind: 'texture', render: async (s) => lichenTexture(s, s, 9) }
];

/**
 * Procedural "lichen on stone": fractal value noise (sum of octaves, gain 0.5; Perlin, SIGGRAPH
 * 1985 for the idea, value-noise variant from memory) with a threshold mask for lichen patches
 * and dark cracks. Fine detail at every scale, like a natural photograph's 1/f spectrum.
 */
export function lichenTexture(width: number, height: number, seed: number): SynthImage {
	const base = fbm(width, height, new Prng(seed), 64, 6);
	const patches = fbm(width, height, new Prng(seed + 1), 48, 4);
	const cracks = fbm(width, height, new Prng(seed + 2), 96, 3);
	const planes = [0, 1, 2].map(() => new Float32Array(width * height));
	for (let i = 0; i < width * height; i++) {
		const stone = 0.25 + 0.5 * base[i];
		const lichen = smoothstep(0.52, 0.6, patches[i]);
		const crack = 1 - 0.7 * smoothstep(0.47, 0.5, 0.5 - Math.abs(cracks[i] - 0.5));
		const r = (stone * (1 - lichen) + (0.62 + 0.25 * base[i]) * lichen) * crack;
		const g = (stone * 0.97 * (1 - lichen) + (0.7 + 0.2 * base[i]) * lichen) * crack;
		const b = (stone * 0.92 * (1 - lichen) + (0.25 + 0.1 * base[i]) * lichen) * crack;
		planes[0][i] = clampTone(r);
		planes[1][i] = clampTone(g);
		planes[2][i] = clampTone(b);
	}
	return { width, height, planes };
}

const clampTone = (v: number) => Math.min(0.94, Math.max(0.06, v));
const smoothstep = (a: number, b: number, x: number) => {
	const t = Math.min(1, Math.max(0, (x - a) / (b - a)));
	return t * t * (3 - 2 * t);
};

/** Fractal value noise in [0, 1]: `octaves` lattices from `cell` px down, smoothstep-interpolated. */
function fbm(width: number, height: number, rng: Prng, cell: number, octaves: number): Float32Array {
	const out = new Float32Array(width * height);
	let amp = 0.5;
	let total = 0;
	for (let o = 0; o < octaves; o++, cell /= 2, amp /= 2) {
		const size = Math.max(cell, 1);
		const gw = Math.ceil(width / size) + 2;
		const gh = Math.ceil(height / size) + 2;
		const lattice = Float32Array.from({ length: gw * gh }, () => rng.next());
		for (let y = 0; y < height; y++) {
			const fy = y / size;
			const y0 = Math.floor(fy);
			const ty = smoothstep(0, 1, fy - y0);
			for (let x = 0; x < width; x++) {
				const fx = x / size;
				const x0 = Math.floor(fx);
				const tx = smoothstep(0, 1, fx - x0);
				const a = lattice[y0 * gw + x0] + (lattice[y0 * gw + x0 + 1] - lattice[y0 * gw + x0]) * tx;
				const b = lattice[(y0 + 1) * gw + x0] + (lattice[(y0 + 1) * gw + x0 + 1] - lattice[(y0 + 1) * gw + x0]) * tx;
				out[y * width + x] += amp * (a + (b - a) * ty);
			}
		}
		total += amp;
	}
	for (let i = 0; i < out.length; i++) out[i] /= total;
	return out;
}
