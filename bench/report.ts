import type { QualitySection } from './quality';
import type { SpeedSection } from './speed';

const f = (v: number, d = 2) => v.toFixed(d);
const pad = (s: string, n: number) => (s.length >= n ? s : s + ' '.repeat(n - s.length));
const lpad = (s: string, n: number) => (s.length >= n ? s : ' '.repeat(n - s.length) + s);

function table(header: string[], rows: string[][]): string {
	const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
	const line = (cells: string[]) => cells.map((c, i) => (i < 2 ? pad(c, widths[i]) : lpad(c, widths[i]))).join('  ');
	return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;

/** Quality table: PSNR dB / SSIM per column, then the margins. */
export function qualityReport(q: QualitySection): { text: string; verdicts: string[] } {
	const header = ['case', 'kernel', 'σ %', 'blurred', 'auto', 'auto method', 'sk wiener', 'sk RL', 'margin dB'];
	const rows = q.rows.map((r) => {
		const best = r.skimage ? Math.max(r.skimage.wiener.psnr, r.skimage.rl.psnr) : undefined;
		return [
			r.id,
			r.kernel,
			f(r.noiseSigma * 100),
			`${f(r.blurred.psnr)} / ${f(r.blurred.ssim, 3)}`,
			`${f(r.auto.psnr)} / ${f(r.auto.ssim, 3)}`,
			r.auto.method,
			r.skimage ? `${f(r.skimage.wiener.psnr)} / ${f(r.skimage.wiener.ssim, 3)}` : 'n/a',
			r.skimage ? `${f(r.skimage.rl.psnr)} / ${f(r.skimage.rl.ssim, 3)}` : 'n/a',
			best !== undefined ? f(r.auto.psnr - best) : 'n/a'
		];
	});
	const lines = [
		'Quality (PSNR dB / SSIM against the sharp scene, sRGB values, full frame; scikit-image tuned per image on the truth)',
		table(header, rows)
	];
	const verdicts: string[] = [];
	const withSk = q.rows.filter((r) => r.skimage);
	if (withSk.length === q.rows.length && q.rows.length > 0) {
		const margins = withSk.map((r) => r.auto.psnr - Math.max(r.skimage!.wiener.psnr, r.skimage!.rl.psnr));
		const interior = withSk.map((r) => r.autoInterior.psnr - r.skimage!.bestInterior.psnr);
		const avg = mean(margins);
		lines.push(
			`average margin auto − best scikit-image: ${f(avg)} dB (min ${f(Math.min(...margins))}, max ${f(Math.max(...margins))}); ` +
				`leaving out a kernel-wide border: ${f(mean(interior))} dB`,
			`scikit-image ${q.skimageVersions?.skimage}, scipy ${q.skimageVersions?.scipy}, numpy ${q.skimageVersions?.numpy}; ` +
				'grid and domains in bench/reference/skimage_best.py'
		);
		const edges = withSk.flatMap((r) => [
			...(r.skimage!.wiener.atGridEdge ? [`${r.id} wiener balance=${r.skimage!.wiener.params.balance}`] : []),
			...(r.skimage!.rl.atGridEdge ? [`${r.id} RL num_iter=${r.skimage!.rl.params.num_iter}`] : [])
		]);
		if (edges.length > 0) lines.push(`note: best scikit-image setting on the edge of its grid (optimum may lie outside): ${edges.join('; ')}`);
		verdicts.push(`quality margin ≥ +1 dB over best-tuned scikit-image: ${avg >= 1 ? 'MET' : 'NOT MET'} (average ${f(avg)} dB over ${margins.length} images)`);
	} else {
		lines.push(`scikit-image columns skipped: ${q.skimageNote ?? 'reference not run'}`);
		verdicts.push(`quality margin ≥ +1 dB over best-tuned scikit-image: NOT MEASURED (${q.skimageNote ?? 'reference not run'})`);
	}
	const worse = q.rows.filter((r) => r.auto.psnr < r.blurred.psnr);
	verdicts.push(
		`auto never below the blurred input: ${worse.length === 0 ? 'MET' : 'NOT MET'} (` +
			(worse.length === 0
				? `smallest gain ${f(Math.min(...q.rows.map((r) => r.auto.psnr - r.blurred.psnr)))} dB`
				: `${worse.map((r) => `${r.id} ${f(r.auto.psnr - r.blurred.psnr)} dB`).join(', ')}`) +
			')'
	);
	return { text: lines.join('\n'), verdicts };
}

export function speedReport(s: SpeedSection): { text: string; verdicts: string[] } {
	const lines = ['Speed (this machine; same run for all columns)'];
	const verdicts: string[] = [];
	if (s.rl) {
		const r = s.rl;
		const mp = (r.width * r.height) / 1e6;
		lines.push(
			`Richardson–Lucy ${r.iterations} it., ${r.width}×${r.height} (${f(mp, 1)} MP) one channel, 33×33 shake kernel:`,
			`  ours            ${lpad(f(r.oursSeconds, 1), 7)} s   ${f(r.oursMsPerIterMp, 1)} ms/iteration/MP`,
			r.leanSeconds !== undefined ? `  lean scipy.fft  ${lpad(f(r.leanSeconds, 1), 7)} s   ${f(r.leanMsPerIterMp!, 1)} ms/iteration/MP (bench/reference/lean_rl.py, workers=2)` : '  lean scipy.fft  not run',
			r.skimageSeconds !== undefined ? `  scikit-image    ${lpad(f(r.skimageSeconds, 1), 7)} s   ${f(r.skimageMsPerIterMp!, 1)} ms/iteration/MP` : '  scikit-image    not run'
		);
		const full = r.width * r.height >= 12e6;
		if (r.leanSeconds !== undefined) {
			const ratio = r.oursSeconds / r.leanSeconds;
			verdicts.push(
				`RL ≤ 2× lean scipy.fft${full ? ' at 12 MP' : ` (at ${f(mp, 1)} MP only: quick run)`}: ${ratio <= 2 ? 'MET' : 'NOT MET'} (ours ${f(r.oursSeconds, 1)} s vs ${f(r.leanSeconds, 1)} s, ratio ${f(ratio)})`
			);
		} else {
			verdicts.push(`RL ≤ 2× lean scipy.fft: NOT MEASURED (Python reference unavailable; ours ${f(r.oursSeconds, 1)} s)`);
		}
	}
	if (s.context) lines.push(`machine: ${s.context}`);
	if (s.wiener12mpSeconds !== undefined) {
		lines.push(`Wiener, 4000×3000 16-bit RGB, restore() alone: ${f(s.wiener12mpSeconds, 2)} s (target < 5 s)`);
		verdicts.push(`Wiener 12 MP RGB < 5 s: ${s.wiener12mpSeconds < 5 ? 'MET' : 'NOT MET'} (${f(s.wiener12mpSeconds, 2)} s)`);
	}
	if (s.previewMs) {
		lines.push(`Wiener preview, 512×512 8-bit RGB, ${s.previewMs.backend} on one thread (the Web Worker's choice): median ${f(s.previewMs.median, 0)} ms of ${s.previewMs.runs.length} runs (${s.previewMs.runs.map((v) => f(v, 0)).join(', ')}) (target < 300 ms)`);
		verdicts.push(`512×512 preview < 300 ms: ${s.previewMs.median < 300 ? 'MET' : 'NOT MET'} (median ${f(s.previewMs.median, 0)} ms)`);
	}
	if (s.memory24mp) {
		const m = s.memory24mp;
		lines.push(`Wiener, 6000×4000 16-bit RGB in a fresh process: peak RSS ${f(m.maxRssMiB, 0)} MiB (input planes in place: ${f(m.baselineMiB, 0)} MiB), ${f(m.seconds, 1)} s (target < 2048 MiB)`);
		verdicts.push(`peak memory 24 MP RGB < 2 GB: ${m.maxRssMiB < 2048 ? 'MET' : 'NOT MET'} (${f(m.maxRssMiB, 0)} MiB)`);
	}
	if (s.note) {
		lines.push(s.note);
		verdicts.push(`12 MP RL, 12 MP Wiener, 24 MP memory: NOT MEASURED (${s.note})`);
	}
	return { text: lines.join('\n'), verdicts };
}
