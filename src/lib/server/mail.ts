/**
 * Outgoing e-mail through nodemailer. Services depend on the small `Mailer` interface, so tests
 * can also read what was sent from the fake SMTP server rather than from a mock.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import { config } from './config';

export interface MailMessage {
	to: string[];
	subject: string;
	text: string;
}

export interface Mailer {
	send(message: MailMessage): Promise<void>;
}

let transport: Transporter | undefined;

function smtp(): Transporter {
	const c = config();
	transport ??= nodemailer.createTransport({
		host: c.SMTP_HOST,
		port: c.SMTP_PORT,
		secure: c.SMTP_SECURE,
		auth: c.SMTP_USER ? { user: c.SMTP_USER, pass: c.SMTP_PASSWORD } : undefined,
		// The local fake speaks plain SMTP; real relays negotiate STARTTLS when they offer it.
		ignoreTLS: c.SMTP_HOST === '127.0.0.1' && !c.SMTP_SECURE
	});
	return transport;
}

export const smtpMailer: Mailer = {
	async send(message) {
		if (message.to.length === 0) return;
		await smtp().sendMail({ from: config().MAIL_FROM, to: message.to, subject: message.subject, text: message.text });
	}
};
