import { db } from '../db';
import { Session, User } from '../db/models';
import { Op } from 'sequelize';
import { recordAudit } from '../audit';
import { hashPassword, verifyPassword } from './password';
import { storedSessionId } from './adapter';
import { revokeAllApiTokens } from './apiTokens';

/**
 * Changes a password after checking the current one, signs out every other device and revokes
 * every API token: whoever may have learnt the old password loses the sessions and tokens it
 * opened (the user makes new tokens on the tokens page).
 */
export async function changePassword(input: {
	userId: number;
	currentSessionId: string | null;
	currentPassword: string;
	newPassword: string;
}): Promise<boolean> {
	const user = await User.findByPk(input.userId);
	if (!user?.passwordHash || !(await verifyPassword(user.passwordHash, input.currentPassword))) {
		return false;
	}
	const passwordHash = await hashPassword(input.newPassword);
	await db().transaction(async (transaction) => {
		await user.update({ passwordHash }, { transaction });
		await Session.destroy({
			where: {
				userId: user.id,
				id: { [Op.ne]: input.currentSessionId ? storedSessionId(input.currentSessionId) : '' }
			},
			transaction
		});
		await revokeAllApiTokens(user.id, transaction);
		await recordAudit({ action: 'auth.password_changed', userId: user.id }, transaction);
	});
	return true;
}
