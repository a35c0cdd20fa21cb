/**
 * Issue 6 across three signed-in roles in Chromium: a technician submits a succeeded run, a
 * supervisor returns it with a comment, the technician resubmits, the supervisor approves and
 * releases, and the client sees the item and downloads the report. Each step's e-mail is read
 * from the fake SMTP server through the development mailbox API.
 */
import { expect, test, type APIRequestContext, type Browser, type Page } from '@playwright/test';
import sharp from 'sharp';
import { DEMO, signIn, waitForHydration } from './helpers';
import type { Role } from '../../src/lib/roles';

/** A small invented test card, unique per run so the upload is never a duplicate. */
async function testCard(): Promise<Buffer> {
	const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="200" height="140"><rect width="200" height="140" fill="#d8d2c4"/>
		<text x="100" y="80" font-family="sans-serif" font-size="28" font-weight="bold" fill="#1f3a5f" text-anchor="middle">BAY 7</text>
		<text x="100" y="120" font-family="monospace" font-size="10" fill="#1f3a5f" text-anchor="middle">${Date.now()}</text></svg>`;
	return sharp(Buffer.from(svg)).blur(1.5).png().toBuffer();
}

async function as(browser: Browser, role: Role): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signIn(page, role);
	return page;
}

/** The newest mail to `to` whose subject starts with `subject` and names the item. */
async function mail(request: APIRequestContext, to: string, subject: string, itemName: string) {
	type Mail = { to: string[]; subject: string; text: string };
	let found: Mail | undefined;
	await expect
		.poll(async () => {
			const body = (await (await request.get(`/api/dev/mailbox?to=${encodeURIComponent(to)}`)).json()) as { messages: Mail[] };
			found = body.messages.find((m) => m.subject.startsWith(subject) && m.subject.includes(itemName));
			return Boolean(found);
		}, { timeout: 15_000 })
		.toBe(true);
	return found!;
}

test('submit → return → resubmit → approve → release → the client downloads the report', async ({ browser }) => {
	test.setTimeout(240_000);
	const technician = await as(browser, 'technician');
	const api = technician.request;

	// The original and its run come through the API: the workbench's own browser test covers that path.
	const cases = (await (await api.get('/api/cases')).json()) as { cases: { id: number; reference: string }[] };
	const caseId = cases.cases.find((c) => c.reference === 'QCEU-2026-0142')!.id;
	const name = `bay-card-${Date.now()}.png`;
	// A browser's FormData upload sends its Origin; the server's CSRF check requires it.
	const origin = new URL(technician.url()).origin;
	const uploaded = await api.post(`/api/cases/${caseId}/items`, { headers: { origin }, multipart: { file: { name, mimeType: 'image/png', buffer: await testCard() } } });
	expect(uploaded.status()).toBe(201);
	const itemId = ((await uploaded.json()) as { id: number }).id;
	const queued = await api.post(`/api/items/${itemId}/runs`, { data: { method: 'wiener', psf: { kind: 'gaussian', sigma: 1.5 }, params: { nsr: 0.01 } } });
	expect(queued.status()).toBe(202);
	const runId = ((await queued.json()) as { id: number }).id;
	await expect.poll(async () => ((await (await api.get(`/api/runs/${runId}`)).json()) as { status: string }).status, { timeout: 120_000 }).toBe('succeeded');

	// Technician submits.
	await technician.goto(`/runs/${runId}/submit`);
	await waitForHydration(technician);
	await technician.getByLabel('Statement').fill('Gaussian defocus, σ 1.5 px, estimated from the letter edges; Wiener with NSR 0.01.');
	await technician.getByRole('button', { name: 'Submit for review' }).click();
	await expect(technician).toHaveURL(/\/review\/\d+$/);
	await expect(technician.getByTestId('review-state').first()).toHaveText('Awaiting review');
	await expect(technician.getByTestId('approve')).toHaveCount(0);

	const supervisor = await as(browser, 'supervisor');
	expect((await mail(supervisor.request, DEMO.supervisor.email, 'Awaiting review', name)).to).toContain(DEMO.supervisor.email);

	// Supervisor returns it with a comment.
	await supervisor.goto('/review');
	await supervisor.getByTestId('queue-table').getByRole('link', { name }).click();
	await waitForHydration(supervisor);
	await supervisor.getByLabel('What must change (required)').fill('State how σ was estimated.');
	await supervisor.getByTestId('return').click();
	await expect(supervisor.getByTestId('decision')).toContainText('State how σ was estimated.');
	expect((await mail(technician.request, DEMO.technician.email, 'Returned', name)).text).toContain('State how σ was estimated.');

	// Technician resubmits.
	await technician.goto(`/runs/${runId}/submit`);
	await waitForHydration(technician);
	await expect(technician.getByTestId('returned-comment')).toContainText('State how σ was estimated.');
	await technician.getByLabel('Statement').fill('σ 1.5 px from the 10–90 % width of the letter edges; Wiener with NSR 0.01.');
	await technician.getByRole('button', { name: 'Submit for review' }).click();
	await expect(technician).toHaveURL(/\/review\/\d+$/);
	const proposalUrl = technician.url();

	// Supervisor approves, then releases.
	await supervisor.goto(proposalUrl);
	await waitForHydration(supervisor);
	await supervisor.getByLabel('Approval comment (optional)').fill('Edge width agrees with σ.');
	await supervisor.getByTestId('approve').click();
	await expect(supervisor.getByTestId('decision')).toContainText('Approved');
	await mail(technician.request, DEMO.technician.email, 'Approved', name);
	await supervisor.getByTestId('release').click();
	await expect(supervisor.getByTestId('report')).toContainText('SPR-');

	// The client is told, sees the item and downloads the report.
	const client = await as(browser, 'client');
	const released = await mail(client.request, DEMO.client.email, 'Released to you', name);
	expect(released.text).toContain(`/portal/items/${itemId}`);
	await client.goto('/portal');
	await client.getByTestId('portal-table').getByRole('link', { name }).click();
	await expect(client.getByTestId('report-id')).toHaveText(/^SPR-\d{4}(-[0-9A-Z]{4}){4}$/);
	const [download] = await Promise.all([client.waitForEvent('download'), client.getByTestId('download-report').click()]);
	expect(download.suggestedFilename()).toMatch(/^SPR-.*\.pdf$/);
});
