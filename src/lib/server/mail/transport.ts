import nodemailer, { type Transporter } from 'nodemailer';
import { mailSettings } from './config';

let transporter: Transporter | null = null;

/** One pooled SMTP connection setup per process; nodemailer reconnects as needed. */
export function smtp(): Transporter {
	if (!transporter) {
		const s = mailSettings();
		transporter = nodemailer.createTransport({
			host: s.SMTP_HOST,
			port: s.SMTP_PORT,
			secure: s.SMTP_SECURE,
			auth: s.SMTP_USER ? { user: s.SMTP_USER, pass: s.SMTP_PASSWORD } : undefined,
			// Fail fast: a relay that does not answer must not hold a sign-up request.
			connectionTimeout: 5_000,
			greetingTimeout: 5_000,
			socketTimeout: 10_000
		});
	}
	return transporter;
}
