import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = resolve(import.meta.dirname, '..');
let dir: string;

/** Run the real entry point as a user would (a fresh Node process through tsx). */
function cli(...args: string[]) {
	const r = spawnSync(process.execPath, ['--import', 'tsx', join(root, 'scripts/restore.ts'), ...args], { cwd: root, encoding: 'utf8' });
	return { status: r.status, stderr: r.stderr };
}

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'stillpoint-cli-'));
	const w = 40;
	const h = 32;
	const rgb = Uint8Array.from({ length: w * h * 3 }, (_, i) => {
		const p = Math.floor(i / 3);
		const x = p % w;
		const y = Math.floor(p / w);
		return 30 + ((x >> 2) % 2 === (y >> 3) % 2 ? 180 : 0) + (i % 3) * 10;
	});
	await sharp(rgb, { raw: { width: w, height: h, channels: 3 } }).png().toFile(join(dir, 'scene.png'));
	writeFileSync(join(dir, 'line.json'), JSON.stringify({ kind: 'line', length: 5, angleDeg: 20 }));
	writeFileSync(join(dir, 'notes.png'), 'these are notes, not an image\n');
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

// Reproducibility requirement of issue 3, item 7 (same input + parameters + engine → same bytes);
// record contents after SWGIT Section 11 (every step and setting documented). No numeric source.
describe('npm run restore', () => {
	it('writes byte-identical 16-bit TIFFs on two runs, with a record that names both digests', async () => {
		const a = cli('--input', join(dir, 'scene.png'), '--output', join(dir, 'a.tif'), '--psf', join(dir, 'line.json'), '--method', 'rl', '--iterations', '5');
		const b = cli('--input', join(dir, 'scene.png'), '--output', join(dir, 'b.tif'), '--psf', join(dir, 'line.json'), '--method', 'rl', '--iterations', '5');
		expect(a.status, a.stderr).toBe(0);
		expect(b.status, b.stderr).toBe(0);
		// Progress counts RL iterations over all three channels.
		expect(a.stderr).toMatch(/restoring 15\/15/);
		const tifA = readFileSync(join(dir, 'a.tif'));
		expect(tifA.equals(readFileSync(join(dir, 'b.tif')))).toBe(true);
		expect(await sharp(tifA).metadata()).toMatchObject({ format: 'tiff', depth: 'ushort', channels: 3, width: 40, height: 32 });

		const record = JSON.parse(readFileSync(join(dir, 'a.json'), 'utf8'));
		const { files } = record;
		expect(files.output.sha256).toBe(createHash('sha256').update(tifA).digest('hex'));
		expect(files.input.sha256).toBe(createHash('sha256').update(readFileSync(join(dir, 'scene.png'))).digest('hex'));
		expect(files.input.file).toBe('scene.png');
		expect(files.psf).toMatchObject({ kind: 'json', file: 'line.json' });
		expect(record).toMatchObject({ resolvedMethod: 'rl', iterationsRun: 5, kernel: { kind: 'line', length: 5, angleDeg: 20 } });
		const recordB = JSON.parse(readFileSync(join(dir, 'b.json'), 'utf8'));
		recordB.files.output.file = 'a.tif';
		expect(recordB).toEqual(record);
	});

	// Further failure modes run in-process in src/lib/server/imaging/restore-cli.test.ts.
	it('refuses an input that is not an image with one error line, status 1 and no file', () => {
		const before = readdirSync(dir).sort();
		const r = cli('--input', join(dir, 'notes.png'), '--psf', join(dir, 'line.json'), '--output', join(dir, 'bad.tif'));
		expect(r.status).toBe(1);
		expect(r.stderr.trim().split('\n')).toEqual([expect.stringMatching(/^restore: error: unsupported image format/)]);
		expect(readdirSync(dir).sort()).toEqual(before);
	});
});
