import { db } from '../db';
import { Session, User } from '../db/models';
import { Op } from 'sequelize';
import { recordAudit } from '../audit';
import { hashPassword, verifyPassword } from './password';
import { storedSessionId } from './adapter';

/**
 * Changes a password after checking the current one, and signs out every other device: whoever
 * may have learnt the old password loses the sessions it opened.
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
		await recordAudit({ action: 'auth.password_changed', userId: user.id }, transaction);
	});
	return true;
}
