import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { buildCases } from './cases';
import type { BenchCase } from './degrade';
import { quality, runEngine, type Quality } from './engine';
import { writeF32, writeF64, readF32, writePng16 } from './files';
import { runPython } from './python';

interface SkimageBest {
	psnr: number;
	params: Record<string, string | number>;
	output: string;
	atGridEdge: boolean;
}
interface SkimageReport {
	versions: Record<string, string>;
	results: { id: string; wiener: SkimageBest; richardson_lucy: SkimageBest }[];
}

export interface QualityRow {
	id: string;
	kernel: string;
	noiseSigma: number;
	blurred: Quality;
	auto: Quality & { ms: number; method: string };
	/** Same metrics leaving out a border as wide as the kernel, where boundary handling dominates. */
	autoInterior: Quality;
	skimage?: {
		wiener: Quality & { params: SkimageBest['params']; atGridEdge: boolean };
		rl: Quality & { params: SkimageBest['params']; atGridEdge: boolean };
		bestInterior: Quality;
	};
}

export interface QualitySection {
	rows: QualityRow[];
	skimageVersions?: Record<string, string>;
	skimageNote?: string;
}

/** The quality comparison: blurred input, our `auto` with the true kernel, best-tuned scikit-image. */
export async function runQuality(outDir: string, withPython: boolean, log: (s: string) => void): Promise<QualitySection> {
	const work = join(outDir, 'cases');
	mkdirSync(work, { recursive: true });
	const cases = await buildCases();
	log(`quality: ${cases.length} cases built`);
	const rows: QualityRow[] = [];
	const outputs = new Map<string, ReturnType<typeof runEngine>>();
	for (const c of cases) {
		const run = runEngine(c.blurred, c.kernel, { method: 'auto' });
		outputs.set(c.id, run);
		const border = c.kernel.size;
		rows.push({
			id: c.id,
			kernel: c.kernel.label,
			noiseSigma: c.noiseSigma,
			blurred: quality(c.blurred, c.truth),
			auto: { ...quality(run.output, c.truth), ms: run.ms, method: run.record.resolvedMethod },
			autoInterior: quality(run.output, c.truth, border)
		});
		await saveCase(work, c, run.output);
		log(`quality: ${c.id} auto ${rows.at(-1)!.auto.psnr.toFixed(2)} dB in ${run.ms.toFixed(0)} ms`);
	}
	if (!withPython) return { rows };

	const manifest = {
		cases: cases.map((c) => {
			const prefix = join(work, fileStem(c));
			writeF32(`${prefix}.blurred.f32`, c.blurred);
			writeF32(`${prefix}.truth.f32`, c.truth);
			writeF64(`${prefix}.kernel.f64`, c.kernel.data);
			return {
				id: c.id,
				width: c.blurred.width,
				height: c.blurred.height,
				channels: c.blurred.planes.length,
				kernelSize: c.kernel.size,
				blurred: `${prefix}.blurred.f32`,
				truth: `${prefix}.truth.f32`,
				kernel: `${prefix}.kernel.f64`,
				outPrefix: prefix
			};
		})
	};
	const manifestPath = join(work, 'manifest.json');
	writeFileSync(manifestPath, JSON.stringify(manifest, null, 1));
	log('quality: tuning scikit-image on the truth (bench/reference/skimage_best.py) …');
	const report = runPython<SkimageReport>('bench/reference/skimage_best.py', [manifestPath]);
	for (const row of rows) {
		const c = cases.find((x) => x.id === row.id)!;
		const r = report.results.find((x) => x.id === row.id);
		if (!r) throw new Error(`skimage_best.py returned no result for ${row.id}`);
		const load = (b: SkimageBest) => readF32(readFileSync(b.output), c.truth.width, c.truth.height, c.truth.planes.length);
		const wiener = load(r.wiener);
		const rl = load(r.richardson_lucy);
		const wq = quality(wiener, c.truth);
		const rq = quality(rl, c.truth);
		const best = wq.psnr >= rq.psnr ? wiener : rl;
		row.skimage = {
			wiener: { ...wq, params: r.wiener.params, atGridEdge: r.wiener.atGridEdge },
			rl: { ...rq, params: r.richardson_lucy.params, atGridEdge: r.richardson_lucy.atGridEdge },
			bestInterior: quality(best, c.truth, c.kernel.size)
		};
	}
	return { rows, skimageVersions: report.versions };
}

function fileStem(c: BenchCase): string {
	return c.id.replace(/[^a-z0-9-]+/gi, '_');
}

async function saveCase(dir: string, c: BenchCase, restored: ReturnType<typeof runEngine>['output']): Promise<void> {
	const stem = join(dir, fileStem(c));
	await writePng16(`${stem}.blurred.png`, c.blurred);
	await writePng16(`${stem}.truth.png`, c.truth);
	await writePng16(`${stem}.auto.png`, restored);
	// The true kernel as a spec file, so any case can be replayed with `npm run restore`.
	writeFileSync(`${stem}.kernel.json`, JSON.stringify({ kind: 'image', width: c.kernel.size, height: c.kernel.size, data: Array.from(c.kernel.data) }));
}
