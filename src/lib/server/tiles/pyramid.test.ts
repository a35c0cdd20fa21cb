/**
 * Pyramid geometry and the 2 × 2 reduction. Expected values are worked by hand from the box-filter
 * definition (Burt & Adelson 1983, doi:10.1109/TCOM.1983.1095851, describe the pyramid; the box
 * kernel and round-half-up are our choice) and from ⌈n/2⌉ level sizes.
 */
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { describe, expect, test } from 'vitest';
import { halve } from './halve';
import { buildPyramid, pyramidLevels } from './pyramid';

describe('pyramid levels', () => {
	test('sizes round up at each halving and stop at the first level that fits one tile', () => {
		const levels = pyramidLevels(1000, 601, 256);
		expect(levels.map((l) => [l.level, l.scale, l.width, l.height, l.columns, l.rows])).toEqual([
			[0, 1, 1000, 601, 4, 3],
			[1, 0.5, 500, 301, 2, 2],
			[2, 0.25, 250, 151, 1, 1]
		]);
	});

	test('an image within one tile has a single level', () => {
		expect(pyramidLevels(16, 16, 256)).toHaveLength(1);
	});
});

describe('halve', () => {
	test('each output sample is the rounded mean of its 2 × 2 block; an odd edge is averaged with itself', () => {
		// 3 × 2 grey: [[0, 1, 10], [2, 5, 20]] → [(0+1+2+5)/4 = 2, (10+10+20+20)/4 = 15].
		const out = halve({ data: Uint8Array.from([0, 1, 10, 2, 5, 20]), width: 3, height: 2, channels: 1 });
		expect(out).toMatchObject({ width: 2, height: 1, channels: 1 });
		expect(Array.from(out.data)).toEqual([2, 15]);
	});

	test('channels are averaged separately and .5 rounds up', () => {
		// One 2 × 2 RGB block: R 1,2,3,4 → 2.5 → 3; G all 255; B 0,0,0,1 → 0.25 → 0.
		const data = Uint8Array.from([1, 255, 0, 2, 255, 0, 3, 255, 0, 4, 255, 1]);
		expect(Array.from(halve({ data, width: 2, height: 2, channels: 3 }).data)).toEqual([3, 255, 0]);
	});
});

test('a built pyramid holds the original pixels at level 0 and cropped edge tiles', async () => {
	const dir = await mkdtemp(join(tmpdir(), 'pyramid-'));
	try {
		const width = 300;
		const height = 270;
		const raw = Buffer.alloc(width * height * 3);
		for (let i = 0; i < raw.length; i++) raw[i] = (i * 31) % 256;
		const source = join(dir, 'source.png');
		await sharp(raw, { raw: { width, height, channels: 3 } }).png().toFile(source);
		const manifest = await buildPyramid(source, dir, 1e6, 256);
		expect(manifest.levels.map((l) => [l.columns, l.rows])).toEqual([[2, 2], [1, 1]]);
		expect((await readdir(join(dir, '0'))).sort()).toEqual(['0_0.png', '0_1.png', '1_0.png', '1_1.png']);
		const corner = await sharp(join(dir, '0', '1_1.png')).raw().toBuffer({ resolveWithObject: true });
		expect([corner.info.width, corner.info.height]).toEqual([44, 14]);
		for (let y = 0; y < 14; y++) {
			const at = ((256 + y) * width + 256) * 3;
			expect(corner.data.subarray(y * 44 * 3, (y + 1) * 44 * 3).equals(raw.subarray(at, at + 44 * 3))).toBe(true);
		}
	} finally {
		await rm(dir, { recursive: true, force: true });
	}
});
