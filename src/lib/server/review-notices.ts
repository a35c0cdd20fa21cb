/**
 * The e-mails of review and release. They carry links, never images or digests of evidence: the
 * reader signs in to see anything. A notice that fails to send does not undo the decision, which
 * the custody ledger already holds; the failure is logged for the operator.
 */
import { config } from './config';
import type { Mailer } from './mail';

export interface NoticeSubject {
	proposalId: number;
	itemId: number;
	itemName: string;
	caseReference: string;
}

const link = (path: string) => new URL(path, config().ORIGIN).toString();

async function sendQuietly(mailer: Mailer, to: string[], subject: string, text: string): Promise<void> {
	try {
		await mailer.send({ to, subject, text });
	} catch (err) {
		console.error(`[mail] "${subject}" to ${to.join(', ')} not sent: ${(err as Error).message}`);
	}
}

export function reviewNotices(mailer: Mailer) {
	return {
		awaitingReview: (to: string[], s: NoticeSubject, author: string) =>
			sendQuietly(mailer, to, `Awaiting review: ${s.caseReference} · ${s.itemName}`,
				`${author} has put forward a restoration of ${s.itemName} (case ${s.caseReference}) for review.\n\nReview it: ${link(`/review/${s.proposalId}`)}\n`),

		approved: (to: string[], s: NoticeSubject, reviewer: string, comment: string) =>
			sendQuietly(mailer, to, `Approved: ${s.caseReference} · ${s.itemName}`,
				`${reviewer} approved your proposed restoration of ${s.itemName} (case ${s.caseReference}).${comment ? `\n\nComment: ${comment}` : ''}\n\nSee it: ${link(`/review/${s.proposalId}`)}\n`),

		returned: (to: string[], s: NoticeSubject, reviewer: string, comment: string) =>
			sendQuietly(mailer, to, `Returned: ${s.caseReference} · ${s.itemName}`,
				`${reviewer} returned your proposed restoration of ${s.itemName} (case ${s.caseReference}).\n\nWhat must change: ${comment}\n\nSee it: ${link(`/review/${s.proposalId}`)}\n`),

		released: (to: string[], s: NoticeSubject, reportId: string) =>
			sendQuietly(mailer, to, `Released to you: ${s.caseReference} · ${s.itemName}`,
				`A restored image of ${s.itemName} (case ${s.caseReference}) has been released to you with report ${reportId}.\n\nSign in to see it and download the report: ${link(`/portal/items/${s.itemId}`)}\n`)
	};
}
