/**
 * The client portal: items released to the caller, read-only. Every page view and every download
 * is a custody event (PREMIS "dissemination" for downloads), so the ledger shows who received what.
 */
import type { Knex } from 'knex';
import sharp from 'sharp';
import type { SessionUser } from '../../roles';
import type { Clock } from '../clock';
import { NotFoundError } from '../errors';
import { caseRepository } from '../repositories/case.repository';
import { itemRepository, type ItemRow } from '../repositories/item.repository';
import { proposalRepository } from '../repositories/proposal.repository';
import { reportRepository, type ReportRow } from '../repositories/report.repository';
import { runRepository, type RunRow } from '../repositories/run.repository';
import type { ObjectStorage } from '../storage';
import { custodyService } from './custody.service';

export interface PortalFile {
	bytes: Buffer;
	filename: string;
	contentType: string;
	sha256?: string;
}

export type PortalDownload = 'report' | 'master' | 'png';

/**
 * A released report's PDF as a download, recorded as a custody event for whoever takes it: a
 * client through the portal, or the lab's staff from the review page.
 */
export async function deliverReport(
	storage: ObjectStorage,
	custody: ReturnType<typeof custodyService>,
	user: SessionUser,
	report: ReportRow,
	runId: number
): Promise<PortalFile> {
	const bytes = await storage.readBuffer(report.storageKey);
	await custody.record({
		action: 'report_downloaded',
		actor: { id: user.id, role: user.role },
		caseId: report.caseId,
		itemId: report.itemId,
		runId,
		detail: { reportId: report.reportId },
		hashAfter: report.pdfSha256
	});
	return { bytes, filename: `${report.reportId}.pdf`, contentType: 'application/pdf', sha256: report.pdfSha256 };
}

export function portalService(knex: Knex, deps: { clock: Clock; storage: ObjectStorage }) {
	const reports = reportRepository(knex);
	const custody = custodyService(knex, deps.clock);
	const actorOf = (user: SessionUser) => ({ id: user.id, role: user.role });

	/** The item's latest report and the run it released, when the caller is a client member of its case. */
	async function released(user: SessionUser, itemId: number): Promise<{ item: ItemRow; report: ReportRow; run: RunRow }> {
		const report = await reports.latestForItem(itemId);
		if (!report || user.role !== 'client' || !(await caseRepository(knex).isMember(report.caseId, user.id))) throw new NotFoundError('Item');
		const proposal = (await proposalRepository(knex).findById(report.proposalId))!;
		return { item: (await itemRepository(knex).findById(itemId))!, report, run: (await runRepository(knex).findById(proposal.runId))! };
	}

	return {
		list: (user: SessionUser) => (user.role === 'client' ? reports.releasedToMember(user.id) : Promise.resolve([])),

		/** What the item page shows; the view itself is recorded. */
		async view(user: SessionUser, itemId: number) {
			const found = await released(user, itemId);
			await custody.record({ action: 'portal_viewed', actor: actorOf(user), caseId: found.item.caseId, itemId, runId: found.run.id, detail: { reportId: found.report.reportId }, hashAfter: found.run.resultSha256 });
			return found;
		},

		/** Before and after pictures for the viewer; covered by the page view's custody event. */
		async picture(user: SessionUser, itemId: number, which: 'before' | 'after'): Promise<Buffer> {
			const { item, run } = await released(user, itemId);
			const key = which === 'before' ? item.previewKey : run.previewKey;
			if (!key) throw new NotFoundError('Preview');
			return deps.storage.readBuffer(key);
		},

		async download(user: SessionUser, itemId: number, file: PortalDownload): Promise<PortalFile> {
			const { item, report, run } = await released(user, itemId);
			const about = { actor: actorOf(user), caseId: item.caseId, itemId, runId: run.id };
			if (file === 'report') return deliverReport(deps.storage, custody, user, report, run.id);
			const master = await deps.storage.readBuffer(run.resultKey!);
			await custody.record({ action: 'result_downloaded', ...about, detail: { file, reportId: report.reportId }, hashBefore: run.resultSha256, hashAfter: file === 'master' ? run.resultSha256 : null });
			if (file === 'master') return { bytes: master, filename: `${report.reportId}-result.tif`, contentType: 'image/tiff', sha256: run.resultSha256! };
			// A PNG for viewers that cannot open TIFF: a derivative, so it carries no ledger digest.
			return { bytes: await sharp(master).png().toBuffer(), filename: `${report.reportId}-result.png`, contentType: 'image/png' };
		}
	};
}
