/**
 * The development and test mailbox: a fake SMTP server (smtp-server) that accepts every message
 * on loopback and stores it, parsed, as one JSON file per message; and the reader behind the
 * mailbox page. Never used in production (it is only on when DEV_MAILBOX_DIR is set).
 */
import { mkdir, readdir, readFile, rename, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface StoredMail {
	id: string;
	receivedAt: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
}

const addresses = (field: AddressObject | AddressObject[] | undefined): string[] =>
	(Array.isArray(field) ? field : field ? [field] : []).flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean);

export function fakeSmtpServer(dir: string): SMTPServer {
	return new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS'],
		logger: false,
		async onData(stream, session, callback) {
			try {
				const parsed = await simpleParser(stream);
				const mail: StoredMail = {
					id: randomUUID(),
					receivedAt: new Date().toISOString(),
					from: parsed.from?.text ?? '',
					// The envelope is who the message was really sent to (Bcc included).
					to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
					subject: parsed.subject ?? '',
					text: parsed.text ?? ''
				};
				if (mail.to.length === 0) mail.to = addresses(parsed.to);
				await mkdir(dir, { recursive: true });
				const tmp = join(dir, `.${mail.id}.tmp`);
				await writeFile(tmp, JSON.stringify(mail, null, 2));
				await rename(tmp, join(dir, `${mail.receivedAt.replace(/[:.]/g, '-')}-${mail.id}.json`));
				callback();
			} catch (err) {
				callback(err as Error);
			}
		}
	});
}

/** Stored messages, newest first, optionally only those sent to one address. */
export async function readMailbox(dir: string, to?: string): Promise<StoredMail[]> {
	const names = await readdir(dir).catch(() => [] as string[]);
	const mails = await Promise.all(
		names.filter((n) => n.endsWith('.json')).map(async (n) => JSON.parse(await readFile(join(dir, n), 'utf8')) as StoredMail)
	);
	const wanted = to?.toLowerCase();
	return mails.filter((m) => !wanted || m.to.includes(wanted)).sort((a, b) => b.receivedAt.localeCompare(a.receivedAt));
}
