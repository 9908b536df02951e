import { Op } from 'sequelize';
import { Invitation, MailMessage } from '../db/models';

/** Open invitations of an organisation, newest first. */
export async function listOpenInvitations(organisationId: number) {
	const rows = await Invitation.findAll({
		where: {
			organisationId,
			acceptedAt: null,
			revokedAt: null,
			expiresAt: { [Op.gt]: new Date() }
		},
		order: [['id', 'DESC']]
	});
	return rows.map((r) => ({ id: r.id, email: r.email, role: r.role, expiresAt: r.expiresAt }));
}

/**
 * Mail of the organisation that has not gone out: given up on, or waiting for another try
 * after an error. Shown to admins so a lost invitation is noticed.
 */
export async function listUndeliveredMail(organisationId: number) {
	const rows = await MailMessage.findAll({
		where: {
			organisationId,
			[Op.or]: [{ state: 'failed' }, { state: 'queued', attempts: { [Op.gt]: 0 } }]
		},
		order: [['id', 'DESC']],
		limit: 50
	});
	return rows.map((r) => ({
		id: r.id,
		to: r.toAddress,
		subject: r.subject,
		state: r.state,
		attempts: r.attempts,
		lastError: r.lastError,
		nextAttemptAt: r.nextAttemptAt
	}));
}
