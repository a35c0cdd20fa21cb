/**
 * Review, sign-off and release through the real server, a real worker and the fake SMTP server
 * (issue 6): submit → return → resubmit → approve → release → portal → verify. A released report
 * must state what ISO/IEC 17025:2017 §7.8.2.1 asks (unique id, item, method, who authorised it)
 * and what SWGIT Section 11 asks of an advanced process (every setting); its text is read with
 * poppler's pdftotext, an outside reader.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { REPORT_CAVEATS } from '../../src/lib/server/report/caveats';
import { fakeSmtpServer, readMailbox, type StoredMail } from '../../src/lib/server/dev-mailbox';
import { REPORT_ID_PATTERN } from '../../src/lib/schemas/review';
import { releaseDemoItem } from '../../src/lib/server/demo/demo-release';
import { demoUser, signIn } from './support/auth';
import { closeTestDb, idOf, testDb } from './support/db';
import { readJson, type HttpClient } from './support/http';
import { finished, LINE_9_30, pollRun, requestRun, sha256, testPhoto, uploadPhoto } from './support/runs';
import { startWorker, type WorkerProcess } from './support/worker-process';

interface ProposalBody {
	id: number;
	status: string;
	runId: number;
	decisionComment: string | null;
}
interface VerifyBody {
	genuine: boolean;
	reason: string;
	report: { reportId: string; itemName: string; caseReference: string; originalSha256: string } | null;
	ledger: { intact: boolean; releaseRecorded: boolean } | null;
}

const MAIL_DIR = process.env.DEV_MAILBOX_DIR!;
// The test server sends to SMTP_PORT from the environment it inherits (default 2526, config.ts).
const SMTP_PORT = Number(process.env.SMTP_PORT ?? 2526);

let smtp: SMTPServer;
let worker: WorkerProcess;
let admin: HttpClient, technician: HttpClient, supervisor: HttpClient, client: HttpClient;
let caseId: number;
let item: { id: number; sha256: string };
let runId: number;
let resultSha256: string;

async function succeededRun(by: HttpClient, itemId: number): Promise<{ id: number; resultSha256: string }> {
	const id = await requestRun(by, itemId, { method: 'wiener', psf: LINE_9_30, params: { nsr: 0.01 } });
	const last = (await pollRun(by, id, finished, 120_000)).at(-1)!;
	expect(last.status, last.error ?? '').toBe('succeeded');
	return { id, resultSha256: last.resultSha256! };
}

/** Mail to `to` whose subject starts with `subject`, waiting for the fake server to store it. */
async function mailTo(to: string, subject: string, itemName: string): Promise<StoredMail> {
	const deadline = Date.now() + 10_000;
	for (;;) {
		const found = (await readMailbox(MAIL_DIR, to)).find((m) => m.subject.startsWith(subject) && m.subject.includes(itemName));
		if (found) return found;
		if (Date.now() > deadline) throw new Error(`no "${subject}" mail to ${to}; mailbox holds: ${JSON.stringify((await readMailbox(MAIL_DIR)).map((m) => [m.to, m.subject]))}`);
		await new Promise((r) => setTimeout(r, 100));
	}
}

function pdfText(pdf: Buffer): string {
	const dir = mkdtempSync(join(tmpdir(), 'stillpoint-it-report-'));
	try {
		writeFileSync(join(dir, 'r.pdf'), pdf);
		return execFileSync('pdftotext', ['-layout', join(dir, 'r.pdf'), '-'], { encoding: 'utf8' });
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

const squash = (text: string) => text.replace(/\s+/g, ' ');
const bytesOf = async (response: Response) => Buffer.from(await response.arrayBuffer());

beforeAll(async () => {
	smtp = fakeSmtpServer(MAIL_DIR);
	await new Promise<void>((resolve, reject) => {
		smtp.once('error', (err) => reject(new Error(`fake SMTP server cannot listen on ${SMTP_PORT} (set SMTP_PORT to a free port): ${err.message}`)));
		smtp.listen(SMTP_PORT, '127.0.0.1', resolve);
	});
	[admin, technician, supervisor, client] = await Promise.all([signIn('admin'), signIn('technician'), signIn('supervisor'), signIn('client')]);
	// A demo case the demo client is a member of (src/lib/server/demo/scenario.ts).
	caseId = await idOf('cases', { reference: 'QCEU-2026-0142' });
	item = await uploadPhoto(technician, caseId, await testPhoto(160));
	worker = await startWorker();
	({ id: runId, resultSha256 } = await succeededRun(technician, item.id));
}, 240_000);

afterAll(async () => {
	await worker?.stop();
	await new Promise<void>((resolve) => (smtp ? smtp.close(() => resolve()) : resolve()));
	await closeTestDb();
});

describe('before release, a client cannot reach the item through any page or API', () => {
	const apiPaths = () => [
		`/api/items/${item.id}`,
		`/api/items/${item.id}/preview`,
		`/api/items/${item.id}/original`,
		...['report', 'result', 'png', 'before', 'after'].map((f) => `/api/portal/items/${item.id}/${f}`)
	];

	test('item and portal API routes answer 404', async () => {
		for (const path of apiPaths()) expect((await client.get(path)).status, path).toBe(404);
		const list = await client.getJson<{ items: { id: number }[] }>(`/api/cases/${caseId}/items`);
		expect(list.items.map((i) => i.id)).not.toContain(item.id);
	});

	test('run routes are closed to clients (403 by the route table)', async () => {
		for (const path of [`/api/runs/${runId}`, `/api/runs/${runId}/result`, `/api/runs/${runId}/preview`, `/api/items/${item.id}/runs`]) {
			expect((await client.get(path)).status, path).toBe(403);
		}
	});

	test('pages answer 404 (item, portal) or 403 (review)', async () => {
		expect((await client.get(`/cases/${caseId}/items/${item.id}`)).status).toBe(404);
		expect((await client.get(`/portal/items/${item.id}`)).status).toBe(404);
		expect((await client.get('/review')).status).toBe(403);
		expect(await (await client.get('/portal')).text()).not.toContain(`/portal/items/${item.id}"`);
	});
});

describe('submit, return, resubmit, approve, release', () => {
	let first: ProposalBody;
	let second: ProposalBody;
	let reportId: string;
	let pdf: Buffer;

	test('only technicians and admins submit, with a statement', async () => {
		expect((await technician.post(`/api/runs/${runId}/proposals`, { json: { statement: 'short' } })).status).toBe(400);
		expect((await supervisor.post(`/api/runs/${runId}/proposals`, { json: { statement: 'A supervisor may not put work forward.' } })).status).toBe(403);
		const response = await technician.post(`/api/runs/${runId}/proposals`, { json: { statement: 'Straight-motion kernel along the bar edges; Wiener with a small NSR.' } });
		first = await readJson<ProposalBody>(response);
		expect(response.status, JSON.stringify(first)).toBe(201);
		expect(first.status).toBe('awaiting_review');
		const mail = await mailTo(demoUser('supervisor').email, 'Awaiting review', 'photo.png');
		expect(mail.text).toContain(`/review/${first.id}`);
		const queue = await supervisor.getJson<{ proposals: ProposalBody[] }>('/api/proposals');
		expect(queue.proposals.map((p) => p.id)).toContain(first.id);
	});

	test('a return needs a comment, and the technician is told', async () => {
		expect((await supervisor.post(`/api/proposals/${first.id}/return`, { json: { comment: '' } })).status).toBe(400);
		const response = await supervisor.post(`/api/proposals/${first.id}/return`, { json: { comment: 'Show the kernel basis in the statement.' } });
		expect(response.status).toBe(200);
		expect((await readJson<ProposalBody>(response)).status).toBe('returned');
		const mail = await mailTo(demoUser('technician').email, 'Returned', 'photo.png');
		expect(mail.text).toContain('Show the kernel basis in the statement.');
		// A decision is final: the returned proposal cannot now be approved.
		expect((await supervisor.post(`/api/proposals/${first.id}/approve`, { json: { comment: '' } })).status).toBe(409);
	});

	test('the resubmitted proposal is approved; the technician is told; approval is frozen', async () => {
		const response = await technician.post(`/api/runs/${runId}/proposals`, { json: { statement: 'Kernel traced from the bar edges (9 px at 30°); Wiener, NSR 0.01.' } });
		second = await readJson<ProposalBody>(response);
		expect(response.status).toBe(201);
		const approved = await supervisor.post(`/api/proposals/${second.id}/approve`, { json: { comment: 'Kernel matches the edges.' } });
		expect(approved.status).toBe(200);
		expect((await readJson<ProposalBody>(approved)).status).toBe('approved');
		await mailTo(demoUser('technician').email, 'Approved', 'photo.png');
		await expect(testDb()('proposals').where({ id: second.id }).update({ decision_comment: 'edited later' })).rejects.toThrow(/frozen/);
		await expect(testDb()('proposals').where({ id: second.id }).update({ status: 'returned' })).rejects.toThrow(/frozen/);
	});

	test('a client still sees nothing before release', async () => {
		expect((await client.get(`/api/items/${item.id}`)).status).toBe(404);
		expect((await client.get(`/api/portal/items/${item.id}/report`)).status).toBe(404);
	});

	test('release creates the report, records its SHA-256 in the ledger and tells the client', async () => {
		expect((await technician.post(`/api/proposals/${second.id}/release`)).status).toBe(403);
		const response = await admin.post(`/api/proposals/${second.id}/release`);
		const body = await readJson<{ reportId: string; pdfSha256: string }>(response);
		expect(response.status, JSON.stringify(body)).toBe(201);
		reportId = body.reportId;
		expect(reportId).toMatch(REPORT_ID_PATTERN);
		const event = await testDb()('custody_events').where({ item_id: item.id, action: 'released' }).first();
		expect(event.hash_after).toBe(body.pdfSha256);
		expect(event.premis_event_type).toBe('dissemination');
		const mail = await mailTo(demoUser('client').email, 'Released to you', 'photo.png');
		expect(mail.text).toContain(`/portal/items/${item.id}`);
		expect(mail.text).toContain(reportId);
		expect((await admin.post(`/api/proposals/${second.id}/release`)).status).toBe(409);
	});

	test('the client downloads the report, the 16-bit TIFF and a PNG; each is a custody event', async () => {
		expect(await (await client.get('/portal')).text()).toContain(`/portal/items/${item.id}`);
		expect((await client.get(`/portal/items/${item.id}`)).status).toBe(200);
		expect((await client.get(`/api/items/${item.id}`)).status).toBe(200);
		for (const side of ['before', 'after']) expect((await client.get(`/api/portal/items/${item.id}/${side}`, { accept: 'image/png' })).status).toBe(200);

		const report = await client.get(`/api/portal/items/${item.id}/report`, { accept: '*/*' });
		expect(report.headers.get('content-type')).toBe('application/pdf');
		pdf = await bytesOf(report);
		const stored = await testDb()('reports').where({ report_id: reportId }).first();
		expect(sha256(pdf)).toBe(stored.pdf_sha256);

		const tiff = await bytesOf(await client.get(`/api/portal/items/${item.id}/result`, { accept: '*/*' }));
		expect(sha256(tiff)).toBe(resultSha256);
		const png = await client.get(`/api/portal/items/${item.id}/png`, { accept: '*/*' });
		expect(png.headers.get('content-type')).toBe('image/png');

		const clientId = await idOf('users', { email: demoUser('client').email });
		const actions = (await testDb()('custody_events').where({ item_id: item.id, actor_id: clientId }).orderBy('id')).map((e) => e.action);
		expect(actions).toEqual(expect.arrayContaining(['portal_viewed', 'report_downloaded', 'result_downloaded']));
		expect(actions.filter((a) => a === 'result_downloaded')).toHaveLength(2);
	});

	test('staff download the same released PDF from the review page; the download is a custody event', async () => {
		const response = await supervisor.get(`/api/proposals/${second.id}/report`, { accept: '*/*' });
		expect(response.status).toBe(200);
		expect(response.headers.get('content-disposition')).toContain(`${reportId}.pdf`);
		expect(sha256(await bytesOf(response))).toBe(sha256(pdf));
		const supervisorId = await idOf('users', { email: demoUser('supervisor').email });
		const downloads = await testDb()('custody_events').where({ item_id: item.id, actor_id: supervisorId, action: 'report_downloaded' });
		expect(downloads).toHaveLength(1);
		expect(downloads[0].hash_after).toBe(sha256(pdf));
		// The unreleased first proposal has no report; a client is pointed to the portal (404 here).
		expect((await supervisor.get(`/api/proposals/${first.id}/report`)).status).toBe(404);
		expect((await client.get(`/api/proposals/${second.id}/report`)).status).toBe(403);
	});

	test('the PDF states the id, both SHA-256s, every parameter, the approval and each caveat, with "page n of m" on every page', async () => {
		const raw = pdfText(pdf);
		const text = squash(raw);
		expect(text).toContain(reportId);
		expect(text).toContain(item.sha256);
		expect(text).toContain(resultSha256);
		const run = await technician.getJson<{ params: Record<string, unknown> }>(`/api/runs/${runId}`);
		for (const [key, value] of Object.entries(run.params)) {
			const values = value !== null && typeof value === 'object' ? Object.entries(value) : [[key, value] as const];
			for (const [k, v] of values) expect(text).toMatch(new RegExp(`"${k}": ?${JSON.stringify(v).replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`));
		}
		expect(text).toContain('Orrin Blaydes (supervisor)');
		expect(text).toContain('Kernel matches the edges.');
		for (const caveat of REPORT_CAVEATS) expect(text).toContain(squash(caveat).slice(0, 60));
		const pages = raw.split('\f').filter((p) => p.trim());
		pages.forEach((page, i) => {
			expect(page).toContain(reportId);
			expect(page).toContain(`page ${i + 1} of ${pages.length}`);
		});
	});

	test('verify: the id and the exact PDF are genuine; one flipped byte is not; an unknown id is not', async () => {
		const anonymous = new (client.constructor as typeof HttpClient)();
		const byId = await readJson<VerifyBody>(await anonymous.post('/api/verify', { json: { reportId: reportId.toLowerCase() } }));
		expect(byId.genuine, byId.reason).toBe(true);
		expect(byId.report).toMatchObject({ reportId, itemName: 'photo.png', originalSha256: item.sha256 });
		expect(byId.ledger).toEqual({ intact: true, releaseRecorded: true });

		const byFile = await readJson<VerifyBody>(await anonymous.post('/api/verify', { body: pdf as unknown as string, contentType: 'application/pdf' }));
		expect(byFile.genuine).toBe(true);

		const altered = Buffer.from(pdf);
		altered[Math.floor(altered.length / 2)] ^= 0x01;
		const tampered = await readJson<VerifyBody>(await anonymous.post('/api/verify', { body: altered as unknown as string, contentType: 'application/pdf' }));
		expect(tampered.genuine).toBe(false);
		expect(tampered.report).toBeNull();

		const unknown = await readJson<VerifyBody>(await anonymous.post('/api/verify', { json: { reportId: 'SPR-2026-0000-0000-0000-0000' } }));
		expect(unknown.genuine).toBe(false);

		const page = await anonymous.post('/verify?/byId', { form: { reportId } });
		expect(page.status).toBe(200);
		expect(await page.text()).toMatch(/data-testid="verdict"[^>]*>\s*Genuine/);
	});
});

describe('the author of a run cannot approve it', () => {
	test('the API answers 403 and the review page offers no approve button', async () => {
		const own = await succeededRun(admin, item.id);
		const response = await admin.post(`/api/runs/${own.id}/proposals`, { json: { statement: 'An admin-run restoration put forward by its author.' } });
		const proposal = await readJson<ProposalBody>(response);
		expect(response.status).toBe(201);
		const refused = await admin.post(`/api/proposals/${proposal.id}/approve`, { json: { comment: '' } });
		expect(refused.status).toBe(403);
		expect((await admin.post(`/review/${proposal.id}?/approve`, { form: { comment: '' } })).status).toBe(403);
		const html = await (await admin.get(`/review/${proposal.id}`)).text();
		expect(html).not.toContain('data-testid="approve"');
		expect(html).toContain('data-testid="not-yours"');
		expect(await (await supervisor.get(`/review/${proposal.id}`)).text()).toContain('data-testid="approve"');
		expect((await testDb()('proposals').where({ id: proposal.id }).first()).status).toBe('awaiting_review');
	}, 180_000);
});

describe('the demo release', () => {
	test('releaseDemoItem submits, approves and releases a succeeded run once, through the services', async () => {
		const other = await uploadPhoto(technician, caseId, await testPhoto(96));
		const run = await succeededRun(technician, other.id);
		const released = await releaseDemoItem(testDb(), run.id);
		expect(released?.reportId).toMatch(REPORT_ID_PATTERN);
		expect(await releaseDemoItem(testDb(), run.id)).toBeNull();
		expect((await client.get(`/api/portal/items/${other.id}/report`, { accept: '*/*' })).status).toBe(200);
	}, 180_000);
});
