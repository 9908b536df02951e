import { Op, QueryTypes } from 'sequelize';
import { db } from '../db';
import { MailMessage } from '../db/models';
import { mailSettings } from './config';
import { smtp } from './transport';

/** While one process tries a message, others leave it alone for this long. */
const CLAIM_LEASE_SECONDS = 120;

/**
 * Claims a due message for this process: the UPDATE succeeds for exactly one process, because
 * the row stops matching `next_attempt_at <= NOW()` the moment one of them moves it on.
 */
export async function claim(id: number): Promise<boolean> {
	const [, affected] = await db().query(
		`UPDATE mail_outbox SET next_attempt_at = NOW(3) + INTERVAL ${CLAIM_LEASE_SECONDS} SECOND
		 WHERE id = :id AND state = 'queued' AND next_attempt_at <= NOW(3)`,
		{ type: QueryTypes.UPDATE, replacements: { id } }
	);
	return Number(affected) === 1;
}

/** The ids of messages due for a try, oldest first. */
export async function dueMessageIds(limit = 20): Promise<number[]> {
	const rows = await MailMessage.findAll({
		attributes: ['id'],
		where: { state: 'queued', nextAttemptAt: { [Op.lte]: new Date() } },
		order: [['id', 'ASC']],
		limit
	});
	return rows.map((r) => r.id);
}

/** One try at sending a claimed message; records the outcome, never throws. */
export async function attemptDelivery(id: number): Promise<void> {
	const message = await MailMessage.findByPk(id);
	if (!message || message.state !== 'queued') return;
	const settings = mailSettings();
	try {
		await smtp().sendMail({
			from: settings.MAIL_FROM,
			to: message.toAddress,
			subject: message.subject,
			text: message.textBody,
			html: message.htmlBody ?? undefined
		});
		await message.update({
			state: 'sent',
			sentAt: new Date(),
			attempts: message.attempts + 1,
			lastError: null
		});
	} catch (err) {
		const attempts = message.attempts + 1;
		const giveUp = attempts >= settings.MAIL_MAX_ATTEMPTS;
		await message.update({
			attempts,
			state: giveUp ? 'failed' : 'queued',
			lastError: describeMailError(err),
			nextAttemptAt: giveUp
				? null
				: new Date(Date.now() + retryDelayMs(attempts, settings.MAIL_RETRY_FIRST_DELAY_MS))
		});
	}
}

/** Doubling waits after each failure, capped at an hour. */
export function retryDelayMs(attempts: number, firstDelayMs: number): number {
	return Math.min(3_600_000, firstDelayMs * 2 ** Math.max(0, attempts - 1));
}

function describeMailError(err: unknown): string {
	const message = err instanceof Error ? err.message : String(err);
	return message.slice(0, 500);
}
