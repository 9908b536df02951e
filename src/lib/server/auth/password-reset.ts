import { Op } from 'sequelize';
import { db } from '../db';
import { PasswordReset, Session, SignInThrottle, User } from '../db/models';
import { recordAudit } from '../audit';
import { queueMail } from '../mail';
import { passwordResetMail } from '../mail/templates';
import { hashPassword } from './password';
import { hashSecret, newSecret } from './secrets';

export const RESET_LIFETIME_MS = 60 * 60 * 1000;

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
 * the link single-use even when it is submitted twice at once. Every session of the account
 * ends: whoever knew the old password is out.
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
		const user = await User.findByPk(reset.userId, { transaction });
		if (user) {
			await SignInThrottle.destroy({
				where: { scope: 'account', subject: user.email },
				transaction
			});
		}
		await recordAudit({ action: 'auth.password_reset', userId: reset.userId }, transaction);
		return true;
	});
}
