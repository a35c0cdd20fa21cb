/**
 * Verifying a report for anyone who holds one: by its id or by its bytes. A copy is genuine when
 * its SHA-256 is the one the ledger recorded at release; the answer also says which item the
 * report covers and whether the whole custody chain still verifies (custodyService.verify).
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import type { Clock } from '../clock';
import { itemRepository } from '../repositories/item.repository';
import { caseRepository } from '../repositories/case.repository';
import { reportRepository, type ReportRow } from '../repositories/report.repository';
import type { ObjectStorage } from '../storage';
import { custodyService } from './custody.service';

export interface VerifyOutcome {
	genuine: boolean;
	reason: string;
	report: null | {
		reportId: string;
		releasedAt: Date;
		pdfSha256: string;
		caseReference: string;
		itemName: string;
		originalSha256: string;
	};
	/** Whether the ledger records this release with this digest, and whether the whole chain verifies. */
	ledger: null | { releaseRecorded: boolean; intact: boolean };
}

export function verifyService(knex: Knex, deps: { clock: Clock; storage: ObjectStorage }) {
	const reports = reportRepository(knex);
	const custody = custodyService(knex, deps.clock);

	async function describe(report: ReportRow, uploadedMatches: boolean | null): Promise<VerifyOutcome> {
		const item = (await itemRepository(knex).findById(report.itemId))!;
		const theCase = (await caseRepository(knex).findById(report.caseId))!;
		const events = await custody.forItem(report.itemId);
		const releaseRecorded = events.some((e) => e.action === 'released' && e.hashAfter === report.pdfSha256 && e.detail.reportId === report.reportId);
		const stored = createHash('sha256').update(await deps.storage.readBuffer(report.storageKey)).digest('hex');
		const intact = (await custody.verify()).intact;
		const genuine = releaseRecorded && intact && stored === report.pdfSha256 && uploadedMatches !== false;
		const reason = !releaseRecorded || stored !== report.pdfSha256
			? 'The stored report does not match what the ledger recorded at release.'
			: !intact
				? 'The custody ledger does not verify: ask the laboratory before relying on this report.'
				: 'The report was issued by this laboratory and its digest matches the custody ledger.';
		return {
			genuine,
			reason,
			report: { reportId: report.reportId, releasedAt: report.releasedAt, pdfSha256: report.pdfSha256, caseReference: theCase.reference, itemName: item.originalName, originalSha256: item.sha256 },
			ledger: { releaseRecorded, intact }
		};
	}

	return {
		async byReportId(reportId: string): Promise<VerifyOutcome> {
			const report = await reports.findByReportId(reportId);
			if (!report) return { genuine: false, reason: 'No report with this id was issued by this laboratory.', report: null, ledger: null };
			return describe(report, null);
		},

		/** Any change to the file, even one byte, changes its SHA-256, so no report will match it. */
		async byPdf(bytes: Buffer): Promise<VerifyOutcome> {
			const sha256 = createHash('sha256').update(bytes).digest('hex');
			const report = await reports.findByPdfSha256(sha256);
			if (!report) return { genuine: false, reason: `This file (SHA-256 ${sha256}) is not a report issued by this laboratory, or it has been altered.`, report: null, ledger: null };
			return describe(report, true);
		}
	};
}
