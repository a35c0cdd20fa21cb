import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runRestoreCli } from './restore-cli';

let dir: string;

/** Run the command in-process, capturing what it writes to stderr. */
async function run(...args: string[]) {
	let stderr = '';
	const status = await runRestoreCli(args, { write: (s: string) => (stderr += s) });
	return { status, stderr, lines: stderr.trim().split('\n') };
}
const at = (name: string) => join(dir, name);

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'stillpoint-cli-inproc-'));
	const grey = Uint8Array.from({ length: 24 * 20 }, (_, i) => 40 + ((i * 13) % 170));
	await sharp(grey, { raw: { width: 24, height: 20, channels: 1 } }).toColourspace('b-w').png().toFile(at('grey.png'));
	const psf = new Uint16Array(9 * 9);
	for (let x = 2; x <= 6; x++) psf[4 * 9 + x] = 60000;
	await sharp(psf, { raw: { width: 9, height: 9, channels: 1 } }).toColourspace('grey16').png().toFile(at('psf.png'));
	writeFileSync(at('disk.json'), JSON.stringify({ kind: 'disk', radius: 1.5 }));
	writeFileSync(at('bad-kernel.json'), JSON.stringify({ kind: 'disk', radius: -2 }));
	writeFileSync(at('notes.txt'), 'plain text\n');
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

// Command contract of issue 3, item 8; no numeric source.
describe('runRestoreCli', () => {
	it('takes a PSF image of any size, keeps one channel for grey input and records the PSF source', async () => {
		const r = await run('--input', at('grey.png'), '--output', at('grey.tif'), '--psf', at('psf.png'), '--method', 'wiener', '--nsr', '0.01');
		expect(r.status, r.stderr).toBe(0);
		expect(await sharp(readFileSync(at('grey.tif'))).metadata()).toMatchObject({ channels: 1, depth: 'ushort' });
		const record = JSON.parse(readFileSync(at('grey.json'), 'utf8'));
		expect(record.files.psf).toMatchObject({ kind: 'image', file: 'psf.png', channelReduction: 'none' });
		// Five equal samples in a row: cropped to its support and normalised by the sum (kernelFromImage).
		expect(record.kernel).toMatchObject({ kind: 'image', width: 5, height: 1, origin: 'upload' });
		expect(record).toMatchObject({ resolvedMethod: 'wiener', colour: { linearLight: true, channels: 1 } });
	});

	it('records --no-linear', async () => {
		const r = await run('--input', at('grey.png'), '--output', at('nl.tif'), '--psf', at('disk.json'), '--method', 'wiener', '--no-linear');
		expect(r.status, r.stderr).toBe(0);
		expect(JSON.parse(readFileSync(at('nl.json'), 'utf8')).colour.linearLight).toBe(false);
	});

	it.each([
		['a missing input', ['--input', 'absent.png', '--psf', 'disk.json'], 1, /cannot read input file .*absent\.png: no such file/],
		['a PSF that is neither image nor JSON', ['--input', 'grey.png', '--psf', 'notes.txt'], 1, /PSF file notes\.txt: unsupported image format/],
		['an invalid kernel spec', ['--input', 'grey.png', '--psf', 'bad-kernel.json'], 1, /PSF file bad-kernel\.json is not a kernel spec: disk radius must be positive/],
		['a bad option', ['--input', 'grey.png', '--psf', 'disk.json', '--method', 'magic'], 2, /--method must be/],
		['an output over the input', ['--input', 'out.tif', '--psf', 'disk.json'], 2, /overwrite the file given as --input/]
	])('refuses %s with one error line and writes nothing', async (_, args, status, message) => {
		const before = readdirSync(dir).sort();
		const withPaths = args.map((a, i) => (['--input', '--psf'].includes(args[i - 1]) ? at(a) : a));
		const r = await run(...withPaths, '--output', at('out.tif'));
		expect(r.status).toBe(status);
		expect(r.lines.filter((l) => l.startsWith('restore: error:'))).toHaveLength(1);
		// Besides the error, stderr may only hold progress lines of the same command.
		for (const line of r.lines) expect(line).toMatch(/^restore: /);
		expect(r.stderr).toMatch(message);
		expect(readdirSync(dir).sort()).toEqual(before);
	});

	it('prints usage for --help and succeeds', async () => {
		const r = await run('--help');
		expect(r.status).toBe(0);
		expect(r.stderr).toMatch(/^usage: npm run restore/);
	});
});
