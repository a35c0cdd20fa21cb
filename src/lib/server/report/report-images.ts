/**
 * The pictures a report shows: original and result at the same scale, an enlarged crop of the
 * same region from each, and the kernel magnified so its pixels stay visible. Nearest-neighbour
 * enlargement adds no pixel values of its own, so the crops show what the images hold.
 */
import sharp from 'sharp';
import { buildKernel, type KernelSpec } from '../../imaging';

/** Long edge of the side-by-side pictures; enough for print at the report's column width. */
const PANEL_EDGE = 900;
/** Side of the detail region, in panel pixels, and its enlargement factor. */
const DETAIL_SIDE = 96;
const DETAIL_ZOOM = 3;
/** The kernel is drawn at least this many pixels across. */
const KERNEL_EDGE = 160;

export interface Region {
	x: number;
	y: number;
	width: number;
	height: number;
}

/** Both previews resized to one size, so one pixel covers the same scene area in each. */
export async function samePanels(originalPreview: Buffer, resultPreview: Buffer): Promise<{ original: Buffer; result: Buffer; width: number; height: number }> {
	const meta = await sharp(originalPreview).metadata();
	const scale = Math.min(1, PANEL_EDGE / Math.max(meta.width!, meta.height!));
	const width = Math.max(1, Math.round(meta.width! * scale));
	const height = Math.max(1, Math.round(meta.height! * scale));
	const fit = (png: Buffer) => sharp(png).resize(width, height, { fit: 'fill' }).png().toBuffer();
	return { original: await fit(originalPreview), result: await fit(resultPreview), width, height };
}

/**
 * The square window where the result has the most edge energy (sum of absolute first
 * differences): where restoration changed the most readable detail, found by a summed-area table.
 */
export async function busiestRegion(png: Buffer): Promise<Region> {
	const { data, info } = await sharp(png).greyscale().raw().toBuffer({ resolveWithObject: true });
	const { width: w, height: h, channels } = info;
	const side = Math.max(1, Math.min(DETAIL_SIDE, w, h));
	const at = (x: number, y: number) => data[(y * w + x) * channels];
	const sat = new Float64Array((w + 1) * (h + 1));
	for (let y = 0; y < h; y++) {
		let row = 0;
		for (let x = 0; x < w; x++) {
			row += (x + 1 < w ? Math.abs(at(x + 1, y) - at(x, y)) : 0) + (y + 1 < h ? Math.abs(at(x, y + 1) - at(x, y)) : 0);
			sat[(y + 1) * (w + 1) + x + 1] = sat[y * (w + 1) + x + 1] + row;
		}
	}
	const sum = (x: number, y: number) =>
		sat[(y + side) * (w + 1) + x + side] - sat[y * (w + 1) + x + side] - sat[(y + side) * (w + 1) + x] + sat[y * (w + 1) + x];
	const stride = Math.max(1, Math.floor(side / 4));
	let best = { x: Math.floor((w - side) / 2), y: Math.floor((h - side) / 2), energy: -1 };
	for (let y = 0; y + side <= h; y += stride) {
		for (let x = 0; x + side <= w; x += stride) {
			const energy = sum(x, y);
			if (energy > best.energy) best = { x, y, energy };
		}
	}
	return { x: best.x, y: best.y, width: side, height: side };
}

export function enlargedCrop(png: Buffer, region: Region): Promise<Buffer> {
	return sharp(png)
		.extract({ left: region.x, top: region.y, width: region.width, height: region.height })
		.resize(region.width * DETAIL_ZOOM, region.height * DETAIL_ZOOM, { kernel: 'nearest' })
		.png()
		.toBuffer();
}

/** The kernel as a grey image, brightest tap white, magnified nearest-neighbour. */
export async function kernelImage(spec: KernelSpec): Promise<{ png: Buffer; size: [number, number] }> {
	const kernel = buildKernel(spec);
	const [height, width] = kernel.shape;
	let max = 0;
	for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) max = Math.max(max, kernel.get(y, x));
	const grey = Buffer.alloc(width * height);
	for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) grey[y * width + x] = max > 0 ? Math.round((255 * kernel.get(y, x)) / max) : 0;
	const zoom = Math.max(1, Math.ceil(KERNEL_EDGE / Math.max(width, height)));
	const png = await sharp(grey, { raw: { width, height, channels: 1 } }).resize(width * zoom, height * zoom, { kernel: 'nearest' }).png().toBuffer();
	return { png, size: [height, width] };
}
