/**
 * The before/after report as a PDF (pdfkit), with Stillpoint's own fonts embedded. Its content
 * follows what a released test report must state (ISO/IEC 17025:2017 §7.8.2.1: a unique id, the
 * item, the method, dates, who authorised it, and that results relate only to the item examined)
 * and what documentation of an advanced process must allow (SWGIT Section 11: tool, version, every
 * step and its settings). Every page carries the report id and "page n of m".
 */
import PDFDocument from 'pdfkit';
import { createRequire } from 'node:module';
import { REPORT_CAVEATS } from './caveats';
import type { ReportData } from './report-data';

const require = createRequire(import.meta.url);
// The complete WOFF builds: fontkit fails on glyphs of the web subsets the screens use.
const FONTS = {
	text: require.resolve('@ibm/plex-sans/fonts/complete/woff/IBMPlexSans-Regular.woff'),
	bold: require.resolve('@ibm/plex-sans/fonts/complete/woff/IBMPlexSans-SemiBold.woff'),
	mono: require.resolve('@ibm/plex-mono/fonts/complete/woff/IBMPlexMono-Regular.woff')
};

const MARGIN = 50;
const INK = '#0f172a';
const MUTED = '#475569';
const ACCENT = '#1b655d';

type Doc = InstanceType<typeof PDFDocument>;

function heading(doc: Doc, text: string): void {
	doc.moveDown(0.8).font('bold').fontSize(12).fillColor(ACCENT).text(text).moveDown(0.3).fillColor(INK);
}

function field(doc: Doc, label: string, value: string, mono = false): void {
	doc.font('bold').fontSize(9).fillColor(MUTED).text(`${label}  `, { continued: true });
	doc.font(mono ? 'mono' : 'text').fillColor(INK).text(value);
}

function json(value: unknown): string {
	return JSON.stringify(value, null, 1).replace(/\n\s*/g, ' ');
}

function beforeAfter(doc: Doc, data: ReportData): void {
	const width = (doc.page.width - 2 * MARGIN - 16) / 2;
	const height = 220;
	const top = doc.y;
	doc.font('bold').fontSize(9).fillColor(MUTED);
	doc.text('Original (as received)', MARGIN, top);
	doc.text('Restored (run ' + data.run.id + ')', MARGIN + width + 16, top);
	const imagesTop = top + 14;
	// The same box and `fit` for both: the two images are drawn at the same scale.
	doc.image(data.images.original, MARGIN, imagesTop, { fit: [width, height], align: 'center' });
	doc.image(data.images.result, MARGIN + width + 16, imagesTop, { fit: [width, height], align: 'center' });
	doc.y = imagesTop + height + 10;
	const r = data.images.detailRegion;
	doc.x = MARGIN;
	doc.font('bold').fontSize(9).fillColor(MUTED).text(`Enlarged detail: x ${r.x}, y ${r.y}, ${r.width} × ${r.height} px`, MARGIN);
	const detailTop = doc.y + 4;
	const detail = Math.min(width, 180);
	doc.image(data.images.originalDetail, MARGIN, detailTop, { fit: [detail, detail] });
	doc.image(data.images.resultDetail, MARGIN + width + 16, detailTop, { fit: [detail, detail] });
	doc.y = detailTop + detail + 8;
	doc.x = MARGIN;
}

function pageFooters(doc: Doc, reportId: string): void {
	const range = doc.bufferedPageRange();
	for (let i = 0; i < range.count; i++) {
		doc.switchToPage(range.start + i);
		const bottom = doc.page.margins.bottom;
		doc.page.margins.bottom = 0; // writing inside the margin must not open a new page
		doc.font('mono').fontSize(8).fillColor(MUTED);
		doc.text(`Report ${reportId}`, MARGIN, doc.page.height - 30, { lineBreak: false });
		const label = `page ${i + 1} of ${range.count}`;
		doc.text(label, doc.page.width - MARGIN - doc.widthOfString(label), doc.page.height - 30, { lineBreak: false });
		doc.page.margins.bottom = bottom;
	}
}

export function renderReportPdf(data: ReportData): Promise<Buffer> {
	const doc = new PDFDocument({
		size: 'A4',
		margin: MARGIN,
		bufferPages: true,
		info: {
			Title: `Stillpoint restoration report ${data.reportId}`,
			Subject: `${data.case.reference} item ${data.item.id}`,
			Creator: data.engineVersion,
			CreationDate: new Date(data.issuedAt)
		}
	});
	doc.registerFont('text', FONTS.text);
	doc.registerFont('bold', FONTS.bold);
	doc.registerFont('mono', FONTS.mono);
	const chunks: Buffer[] = [];
	doc.on('data', (chunk: Buffer) => chunks.push(chunk));
	const done = new Promise<Buffer>((resolve, reject) => {
		doc.on('end', () => resolve(Buffer.concat(chunks)));
		doc.on('error', reject);
	});

	doc.font('bold').fontSize(18).fillColor(INK).text('Restoration report');
	doc.font('text').fontSize(10).fillColor(MUTED).text('Stillpoint — deblurring with a documented, replayable method');
	doc.moveDown(0.6);
	field(doc, 'Report id', data.reportId, true);
	field(doc, 'Issued', data.issuedAt, true);
	field(doc, 'Case', `${data.case.reference} — ${data.case.title} (${data.case.kind})`);
	field(doc, 'Item', `#${data.item.id} ${data.item.originalName}, ${data.item.width} × ${data.item.height} px, ${data.item.bitDepth}-bit, ${data.item.channels === 1 ? 'greyscale' : 'RGB'}`);
	field(doc, 'Scope', 'The results in this report relate only to the item examined.');

	heading(doc, 'Before and after');
	beforeAfter(doc, data);

	heading(doc, 'Method');
	field(doc, 'Engine', data.engineVersion, true);
	field(doc, 'Method', data.run.method);
	field(doc, 'Parameters', json(data.run.parameters), true);
	field(doc, 'Kernel (PSF)', json(data.run.kernelSpec), true);
	field(doc, 'Kernel size', `${data.images.kernelSize[1]} × ${data.images.kernelSize[0]} px`);
	const kernelTop = doc.y + 4;
	doc.image(data.images.kernel, MARGIN, kernelTop, { fit: [96, 96] });
	doc.y = kernelTop + 100;
	doc.x = MARGIN;
	field(doc, 'Run', `#${data.run.id}, requested by ${data.run.requestedBy}, finished ${data.run.finishedAt}`);
	field(doc, "Technician's statement", data.statement);

	heading(doc, 'Digests (SHA-256, FIPS 180-4; MD5 for legacy exchange only)');
	field(doc, 'Original SHA-256', data.digests.original.sha256, true);
	field(doc, 'Original MD5', data.digests.original.md5, true);
	field(doc, 'Result SHA-256', data.digests.result.sha256, true);
	field(doc, 'Result MD5', data.digests.result.md5, true);
	field(doc, 'Kernel SHA-256', data.digests.kernel.sha256, true);

	heading(doc, 'Recoverability');
	doc.font('text').fontSize(9).fillColor(INK).text(
		`The blur erased ${(100 * data.recoverability.lostFraction).toFixed(1)} % of the spatial frequencies of this image (transfer function below the noise level). ` +
			`Those frequencies are not recovered, only regularised. ${data.recoverability.note}`
	);

	heading(doc, 'Review and release');
	field(doc, 'Approved by', `${data.approval.supervisor} on ${data.approval.approvedAt}`);
	field(doc, 'Reviewer comment', data.approval.comment || '—');
	field(doc, 'Released by', data.releasedBy);

	heading(doc, 'Custody history of the item (UTC)');
	for (const event of data.custody) {
		doc.font('mono').fontSize(8).fillColor(INK).text(`#${event.id}  ${event.occurredAt}  ${event.action}  ${event.actor} (${event.role})`);
	}

	heading(doc, 'Caveats');
	for (const caveat of REPORT_CAVEATS) doc.font('text').fontSize(9).fillColor(INK).text(`•  ${caveat}`).moveDown(0.2);

	pageFooters(doc, data.reportId);
	doc.end();
	return done;
}
