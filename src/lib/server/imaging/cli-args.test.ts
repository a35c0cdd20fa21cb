import { describe, expect, it } from 'vitest';
import { parseCliArgs, UsageError } from './cli-args';

const base = ['--input', 'in.png', '--output', 'out.tif', '--psf', 'k.json'];

// Command-line contract from issue 3, item 8; no outside source.
describe('parseCliArgs', () => {
	it('fills defaults: auto method, linear light on', () => {
		expect(parseCliArgs(base)).toEqual({
			input: 'in.png',
			output: 'out.tif',
			psf: 'k.json',
			method: 'auto',
			linearLight: true
		});
	});

	it('reads every option with its type', () => {
		const args = parseCliArgs([...base, '--method', 'rltv', '--iterations', '40', '--tv', '0.002', '--no-linear', '--boundary', 'extended']);
		expect(args).toMatchObject({ method: 'rltv', iterations: 40, tv: 0.002, linearLight: false, boundary: 'extended' });
		expect(parseCliArgs([...base, '--method', 'wiener', '--nsr', '1e-3'])).toMatchObject({ nsr: 0.001 });
	});

	it('returns null for --help', () => {
		expect(parseCliArgs(['--help'])).toBeNull();
	});

	it.each([
		[['--output', 'o.tif', '--psf', 'k.json'], /--input is required/],
		[['--input', 'i.png', '--output', 'o.png', '--psf', 'k.json'], /\.tif/],
		[[...base, '--method', 'blind'], /--method must be/],
		[[...base, '--method', 'rl', '--iterations', '2.5'], /whole number/],
		[[...base, '--method', 'rl', '--iterations', '0'], /between 1 and/],
		[[...base, '--method', 'wiener', '--nsr=-1'], /positive number/],
		[[...base, '--method', 'wiener', '--nsr', 'abc'], /positive number/],
		[[...base, '--tv', '0.01'], /only to --method rltv/],
		[[...base, '--iterations', '10'], /only to --method rl or rltv/],
		[[...base, '--method', 'rl', '--nsr', '0.1'], /only to --method wiener/],
		[[...base, '--boundary', 'mirror'], /--boundary must be/],
		[[...base, '--colour', 'x'], /Unknown option/],
		[[...base, 'stray'], /positional/]
	])('refuses %j', (argv, message) => {
		expect(() => parseCliArgs(argv)).toThrow(UsageError);
		expect(() => parseCliArgs(argv)).toThrow(message);
	});
});
