import { MailMessage } from '../db/models';
import { attemptDelivery } from './outbox';

export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
	html?: string;
	organisationId?: number | null;
}

const CLAIMED_FOR_SECONDS = 120;

/**
 * Keeps the mail in mail_outbox first, then tries to send it at once. If the relay is down the
 * mail stays queued and the retry loop (retry.ts) tries again later; nothing is lost.
 * The row is created already claimed, so no other process's loop sends it a second time.
 */
export async function queueMail(mail: OutgoingMail): Promise<number> {
	const row = await MailMessage.create({
		toAddress: mail.to,
		subject: mail.subject,
		textBody: mail.text,
		htmlBody: mail.html ?? null,
		organisationId: mail.organisationId ?? null,
		nextAttemptAt: new Date(Date.now() + CLAIMED_FOR_SECONDS * 1000)
	});
	await attemptDelivery(row.id);
	return row.id;
}
