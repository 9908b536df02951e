import { Op } from 'sequelize';
import { db } from '../db';
import { PasswordReset, Session, User } from '../db/models';
import { recordAudit } from '../audit';
import { queueMail } from '../mail';
import { passwordResetMail } from '../mail/templates';
import { hashPassword } from './password';
import { hashSecret, newSecret } from './secrets';
import { revokeAllApiTokens } from './apiTokens';
import { clearAccountFailures } from './throttle';

export const RESET_LIFETIME_MS = 60 * 60 * 1000;

/**
 * Starts `requestPasswordReset` without waiting for it: the page answers before any account is
 * looked up, so its timing is the same for a known and an unknown address (a known one would
 * otherwise take the transaction and the SMTP hand-over longer). Failures are logged; the mail
 * itself is retried by the outbox.
 */
export function requestPasswordResetInBackground(email: string): void {
	requestPasswordReset(email).catch((err: unknown) => {
		console.error('password reset request:', err instanceof Error ? err.message : err);
	});
}

/**
 * Sends a reset link if the address has an account; says nothing either way (the page shows
 * one message). A new link kills every earlier one.
 */
export async function requestPasswordReset(email: string): Promise<void> {
	const user = await User.findOne({ where: { email } });
	if (!user) return;
	const { secret, hash } = newSecret();
	await db().transaction(async (transaction) => {
		await PasswordReset.update(
			{ usedAt: new Date() },
			{ where: { userId: user.id, usedAt: null }, transaction }
		);
		await PasswordReset.create(
			{ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + RESET_LIFETIME_MS) },
			{ transaction }
		);
		await recordAudit({ action: 'auth.password_reset_requested', userId: user.id }, transaction);
	});
	await queueMail({
		to: user.email,
		...passwordResetMail({ displayName: user.displayName, secret })
	});
}

/** The reset a link names, if it can still be used. */
export async function findUsableReset(secret: string): Promise<PasswordReset | null> {
	return PasswordReset.findOne({
		where: { tokenHash: hashSecret(secret), usedAt: null, expiresAt: { [Op.gt]: new Date() } }
	});
}

/**
 * Sets the new password and uses the link up, in one transaction; the conditional UPDATE makes
 * the link single-use even when it is submitted twice at once. Every session and API token of
 * the account ends: whoever knew the old password is out, including a script they set up.
 */
export async function completePasswordReset(secret: string, password: string): Promise<boolean> {
	const reset = await findUsableReset(secret);
	if (!reset) return false;
	const passwordHash = await hashPassword(password);
	return db().transaction(async (transaction) => {
		const [used] = await PasswordReset.update(
			{ usedAt: new Date() },
			{ where: { id: reset.id, usedAt: null }, transaction }
		);
		if (used !== 1) return false;
		await User.update({ passwordHash }, { where: { id: reset.userId }, transaction });
		await Session.destroy({ where: { userId: reset.userId }, transaction });
		await revokeAllApiTokens(reset.userId, transaction);
		const user = await User.findByPk(reset.userId, { transaction });
		if (user) await clearAccountFailures(user.email, transaction);
		await recordAudit({ action: 'auth.password_reset', userId: reset.userId }, transaction);
		return true;
	});
}
