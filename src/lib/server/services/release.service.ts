/**
 * Release: an approved proposal leaves the lab as a report to the case's client members. The
 * report states what ISO/IEC 17025:2017 §7.8.2.1 asks of a released report and what SWGIT
 * Section 11 asks of documentation of an advanced process (see report-pdf.ts). Its PDF is stored
 * write-once under its own SHA-256, and that digest goes into the custody ledger in the same
 * transaction as the report row, so the verify page can tell a genuine copy from an altered one.
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import type { KernelSpec } from '../../imaging';
import type { SessionUser } from '../../roles';
import { canonicalJson, type Json } from '../canonical-json';
import type { Clock } from '../clock';
import { ConflictError, ForbiddenError, NotFoundError } from '../errors';
import type { Mailer } from '../mail';
import { caseRepository } from '../repositories/case.repository';
import { itemRepository } from '../repositories/item.repository';
import { proposalRepository, type ProposalRow } from '../repositories/proposal.repository';
import { reportRepository, type ReportRow } from '../repositories/report.repository';
import { runRepository, type RunRow } from '../repositories/run.repository';
import { newReportId } from '../report/report-id';
import { busiestRegion, enlargedCrop, kernelImage, samePanels } from '../report/report-images';
import type { ReportData } from '../report/report-data';
import { renderReportPdf } from '../report/report-pdf';
import { reviewNotices } from '../review-notices';
import type { ObjectStorage } from '../storage';
import { custodyService } from './custody.service';
import { visibleItem } from './item-access';
import { deliverReport, type PortalFile } from './portal.service';
import { canReview } from './review.service';

export interface ReleaseDeps {
	clock: Clock;
	storage: ObjectStorage;
	mailer: Mailer;
}

const digest = (algorithm: 'sha256' | 'md5', bytes: Buffer | string) => createHash(algorithm).update(bytes).digest('hex');

/** SHA-256 of the kernel spec's canonical JSON: the same spec always has the same digest. */
export const kernelSha256 = (spec: unknown) => digest('sha256', canonicalJson(spec as Json));

function recoverabilityOf(run: RunRow): ReportData['recoverability'] {
	const r = (run.record?.recoverability ?? null) as { lostFraction?: number; note?: string } | null;
	if (typeof r?.lostFraction !== 'number') throw new ConflictError('The run record has no recoverability statement; replay the run before release');
	return { lostFraction: r.lostFraction, note: r.note ?? '' };
}

export function releaseService(knex: Knex, deps: ReleaseDeps) {
	const proposals = proposalRepository(knex);
	const reports = reportRepository(knex);
	const custody = custodyService(knex, deps.clock);

	async function gather(proposal: ProposalRow, releasedBy: SessionUser, reportId: string, issuedAt: Date): Promise<ReportData> {
		const item = (await itemRepository(knex).findById(proposal.itemId))!;
		const run = (await runRepository(knex).findById(proposal.runId))!;
		const theCase = (await caseRepository(knex).findById(proposal.caseId))!;
		if (!item.previewKey || !run.previewKey || !run.resultKey || !run.resultSha256) throw new ConflictError('The item or its result has no stored preview');

		const panels = await samePanels(await deps.storage.readBuffer(item.previewKey), await deps.storage.readBuffer(run.previewKey));
		const region = await busiestRegion(panels.result);
		const kernel = await kernelImage(run.psf as unknown as KernelSpec);
		const resultBytes = await deps.storage.readBuffer(run.resultKey);
		if (digest('sha256', resultBytes) !== run.resultSha256) throw new ConflictError('The stored result does not match its recorded SHA-256; release refused');
		const events = await custody.forItem(item.id);

		return {
			reportId,
			issuedAt: issuedAt.toISOString(),
			engineVersion: run.engineVersion,
			case: { reference: theCase.reference, title: theCase.title, kind: theCase.kind },
			item: { id: item.id, originalName: item.originalName, width: item.width, height: item.height, bitDepth: item.bitDepth, channels: item.channels },
			digests: {
				original: { sha256: item.sha256, md5: item.md5 },
				result: { sha256: run.resultSha256, md5: digest('md5', resultBytes) },
				kernel: { sha256: kernelSha256(run.psf) }
			},
			run: {
				id: run.id,
				method: run.method,
				parameters: run.params,
				kernelSpec: run.psf,
				requestedBy: run.requestedByName,
				finishedAt: run.finishedAt!.toISOString()
			},
			statement: proposal.statement,
			approval: { supervisor: proposal.decidedByName!, approvedAt: proposal.decidedAt!.toISOString(), comment: proposal.decisionComment ?? '' },
			releasedBy: releasedBy.name,
			recoverability: recoverabilityOf(run),
			custody: events.map((e) => ({ id: e.id, occurredAt: e.occurredAt.toISOString(), actor: e.actorName ?? 'system', role: e.actorRole, action: e.action })),
			images: {
				original: panels.original,
				result: panels.result,
				originalDetail: await enlargedCrop(panels.original, region),
				resultDetail: await enlargedCrop(panels.result, region),
				detailRegion: region,
				kernel: kernel.png,
				kernelSize: kernel.size
			}
		};
	}

	return {
		/**
		 * The released report PDF for the lab's own staff (the client's copy comes through the
		 * portal). Each download is a custody event, as for a client.
		 */
		async reportFile(user: SessionUser, proposalId: number): Promise<PortalFile> {
			const proposal = user.role === 'client' ? undefined : await proposals.findById(proposalId);
			if (!proposal) throw new NotFoundError('Proposal');
			await visibleItem(knex, user, proposal.itemId);
			const report = await reports.findByProposal(proposal.id);
			if (!report) throw new NotFoundError('Report');
			return deliverReport(deps.storage, custody, user, report, proposal.runId);
		},

		async release(user: SessionUser, proposalId: number): Promise<ReportRow> {
			if (!canReview(user)) throw new ForbiddenError('Only supervisors and administrators release results');
			const proposal = await proposals.findById(proposalId);
			if (!proposal) throw new NotFoundError('Proposal');
			if (proposal.status !== 'approved') throw new ConflictError('Only an approved proposal can be released');
			const issuedAt = new Date(Math.floor(deps.clock.now().getTime()));
			const reportId = newReportId(issuedAt);
			const pdf = await renderReportPdf(await gather(proposal, user, reportId, issuedAt));
			const pdfSha256 = digest('sha256', pdf);
			const storageKey = `reports/${pdfSha256}.pdf`;
			// Stored before the transaction: a lost race leaves an unreferenced PDF, never a row without its file.
			await deps.storage.putBuffer(storageKey, pdf, 'application/pdf');
			await knex.transaction(async (trx) => {
				if (!(await proposals.transition(proposal.id, 'approved', 'released', trx))) throw new ConflictError('The proposal has already been released');
				await reports.insert({ reportId, proposalId: proposal.id, itemId: proposal.itemId, caseId: proposal.caseId, pdfSha256, storageKey, releasedBy: user.id, releasedAt: issuedAt }, trx);
				await custody.record(
					{ action: 'released', actor: { id: user.id, role: user.role }, caseId: proposal.caseId, itemId: proposal.itemId, runId: proposal.runId, detail: { reportId, proposalId: proposal.id, pdfBytes: pdf.length }, hashAfter: pdfSha256 },
					trx
				);
			});
			const clients = (await caseRepository(knex).members(proposal.caseId)).filter((m) => m.role === 'client').map((m) => m.email);
			await reviewNotices(deps.mailer).released(clients, { proposalId: proposal.id, itemId: proposal.itemId, itemName: proposal.itemName, caseReference: proposal.caseReference }, reportId);
			return (await reports.findByReportId(reportId))!;
		}
	};
}
