/**
 * The report PDF states what a released report must (ISO/IEC 17025:2017 §7.8.2.1; SWGIT
 * Section 11): checked by extracting its text with poppler's pdftotext, an outside reader.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { REPORT_CAVEATS } from './caveats';
import type { ReportData } from './report-data';
import { renderReportPdf } from './report-pdf';

const png = (w: number, h: number, grey: number) =>
	sharp({ create: { width: w, height: h, channels: 3, background: { r: grey, g: grey, b: grey } } }).png().toBuffer();

async function sample(custodyEvents: number): Promise<ReportData> {
	return {
		reportId: 'SPR-2026-7Q4K-91XD',
		issuedAt: '2026-12-02T10:15:00.000Z',
		engineVersion: 'stillpoint-engine/1.0.0',
		case: { reference: 'QCEU-2026-0142', title: 'Shaken car-park still', kind: 'forensic' },
		item: { id: 3, originalName: 'bay-sign.tif', width: 640, height: 480, bitDepth: 16, channels: 3 },
		digests: {
			original: { sha256: 'a'.repeat(64), md5: 'b'.repeat(32) },
			result: { sha256: 'c'.repeat(64), md5: 'd'.repeat(32) },
			kernel: { sha256: 'e'.repeat(64) }
		},
		run: {
			id: 12,
			method: 'rltv',
			parameters: { iterations: 40, tv: 0.002, boundary: 'extended', linearLight: true },
			kernelSpec: { kind: 'line', length: 15, angleDeg: 30 },
			requestedBy: 'Tamsin Vell',
			finishedAt: '2026-12-02T09:00:00.000Z'
		},
		statement: 'Straight-motion kernel traced along the lamp streak; RL-TV to limit ringing.',
		approval: { supervisor: 'Orrin Blaydes', approvedAt: '2026-12-02T10:00:00.000Z', comment: 'Kernel matches the streak.' },
		releasedBy: 'Orrin Blaydes',
		recoverability: { lostFraction: 0.137, note: 'Worst along 30°.' },
		custody: Array.from({ length: custodyEvents }, (_, i) => ({
			id: i + 1,
			occurredAt: `2026-12-02T08:${String(i % 60).padStart(2, '0')}:00.000Z`,
			actor: 'Tamsin Vell',
			role: 'technician',
			action: i === 0 ? 'original_received' : 'fixity_checked'
		})),
		images: {
			original: await png(320, 240, 90),
			result: await png(320, 240, 140),
			originalDetail: await png(64, 64, 90),
			resultDetail: await png(64, 64, 140),
			detailRegion: { x: 100, y: 80, width: 64, height: 64 },
			kernel: await png(15, 15, 255),
			kernelSize: [15, 15]
		}
	};
}

function pdfText(pdf: Buffer): string {
	const dir = mkdtempSync(join(tmpdir(), 'stillpoint-report-'));
	try {
		writeFileSync(join(dir, 'r.pdf'), pdf);
		return execFileSync('pdftotext', ['-layout', join(dir, 'r.pdf'), '-'], { encoding: 'utf8' });
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

const squash = (text: string) => text.replace(/\s+/g, ' ');

describe('report PDF', () => {
	it('states the id, digests, every parameter, the approval and each caveat', async () => {
		const data = await sample(5);
		const pdf = await renderReportPdf(data);
		expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
		const text = squash(pdfText(pdf));
		expect(text).toContain(data.reportId);
		expect(text).toContain(data.digests.original.sha256);
		expect(text).toContain(data.digests.result.sha256);
		expect(text).toContain(data.digests.original.md5);
		for (const [key, value] of Object.entries(data.run.parameters)) expect(text).toMatch(new RegExp(`"${key}": ?${JSON.stringify(value)}`));
		expect(text).toContain('"angleDeg": 30');
		expect(text).toContain('Orrin Blaydes on 2026-12-02T10:00:00.000Z');
		expect(text).toContain('Kernel matches the streak.');
		expect(text).toContain('13.7 %');
		for (const caveat of REPORT_CAVEATS) expect(text).toContain(squash(caveat).slice(0, 60));
	});

	it('puts the report id and "page n of m" on every page', async () => {
		const pdf = await renderReportPdf(await sample(120)); // a long custody history spills onto more pages
		const pages = pdfText(pdf).split('\f').filter((p) => p.trim());
		expect(pages.length).toBeGreaterThan(2);
		pages.forEach((page, i) => {
			expect(page).toContain('Report SPR-2026-7Q4K-91XD');
			expect(page).toContain(`page ${i + 1} of ${pages.length}`);
		});
	});
});
