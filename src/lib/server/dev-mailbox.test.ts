/**
 * The fake SMTP server and the real nodemailer transport talk over loopback SMTP (RFC 5321):
 * what the mailbox stores is what was sent, envelope recipients included.
 */
import nodemailer from 'nodemailer';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fakeSmtpServer, readMailbox } from './dev-mailbox';

let dir: string;
let server: ReturnType<typeof fakeSmtpServer>;
let port: number;

beforeAll(async () => {
	dir = await mkdtemp(join(tmpdir(), 'stillpoint-mailbox-'));
	server = fakeSmtpServer(dir);
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	port = (server.server.address() as AddressInfo).port;
});

afterAll(async () => {
	await new Promise<void>((resolve) => server.close(() => resolve()));
	await rm(dir, { recursive: true, force: true });
});

describe('development mailbox', () => {
	it('stores each message with its envelope recipients, subject and text', async () => {
		const transport = nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true });
		await transport.sendMail({
			from: 'Stillpoint <no-reply@stillpoint.example>',
			to: 'tech@stillpoint.example',
			bcc: 'supervisor@stillpoint.example',
			subject: 'Run 7 approved',
			text: 'Your proposal for item 3 was approved.'
		});
		await transport.sendMail({ from: 'no-reply@stillpoint.example', to: 'client@stillpoint.example', subject: 'Released', text: 'x' });

		const all = await readMailbox(dir);
		expect(all).toHaveLength(2);
		const approved = all.find((m) => m.subject === 'Run 7 approved')!;
		expect(approved.to.sort()).toEqual(['supervisor@stillpoint.example', 'tech@stillpoint.example']);
		expect(approved.text.trim()).toBe('Your proposal for item 3 was approved.');

		const forClient = await readMailbox(dir, 'CLIENT@stillpoint.example');
		expect(forClient.map((m) => m.subject)).toEqual(['Released']);
	});
});
