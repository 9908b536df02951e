import { Op } from 'sequelize';
import { db } from '../db';
import { Invitation, Membership, Organisation, User } from '../db/models';
import type { Role } from '../db/models/Membership';
import { recordAudit } from '../audit';
import { queueMail } from '../mail';
import { invitationMail } from '../mail/templates';
import type { Actor } from '../policy';
import { addMembership } from './accounts';
import { hashPassword } from './password';
import { hashSecret, newSecret } from './secrets';

export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;

export class AlreadyMemberError extends Error {
	constructor() {
		super('This person already belongs to the organisation.');
	}
}

/** An admin invites an address with a role; earlier open invitations to it are withdrawn. */
export async function inviteToOrganisation(
	actor: Actor,
	input: { email: string; role: Role },
	inviterName: string
): Promise<Invitation> {
	const existing = await User.findOne({ where: { email: input.email } });
	if (existing) {
		const member = await Membership.findOne({
			where: { userId: existing.id, organisationId: actor.organisationId }
		});
		if (member) throw new AlreadyMemberError();
	}
	const { secret, hash } = newSecret();
	const invitation = await db().transaction(async (transaction) => {
		await Invitation.update(
			{ revokedAt: new Date() },
			{ where: openInvitations(actor.organisationId, input.email), transaction }
		);
		const created = await Invitation.create(
			{
				organisationId: actor.organisationId,
				email: input.email,
				role: input.role,
				tokenHash: hash,
				invitedByUserId: actor.userId,
				expiresAt: new Date(Date.now() + INVITATION_LIFETIME_MS)
			},
			{ transaction }
		);
		await recordAudit(
			{
				action: 'invitation.created',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'invitation',
				subjectId: created.id,
				detail: { email: input.email, role: input.role }
			},
			transaction
		);
		return created;
	});
	const organisation = await Organisation.findByPk(actor.organisationId);
	await queueMail({
		to: input.email,
		organisationId: actor.organisationId,
		...invitationMail({
			organisationName: organisation?.name ?? 'an organisation',
			inviterName,
			role: input.role,
			secret
		})
	});
	return invitation;
}

function openInvitations(organisationId: number, email: string) {
	return { organisationId, email, acceptedAt: null, revokedAt: null };
}

/** The invitation a link names, if it can still be accepted, with its organisation's name. */
export async function findOpenInvitation(secret: string) {
	const invitation = await Invitation.findOne({
		where: {
			tokenHash: hashSecret(secret),
			acceptedAt: null,
			revokedAt: null,
			expiresAt: { [Op.gt]: new Date() }
		}
	});
	if (!invitation) return null;
	const organisation = await Organisation.findByPk(invitation.organisationId);
	const account = await User.findOne({ where: { email: invitation.email } });
	return { invitation, organisationName: organisation?.name ?? '', hasAccount: !!account };
}

/**
 * Accepts an invitation: for a new person with a name and password, or for the signed-in user
 * whose address it was sent to. The conditional UPDATE makes the link single-use.
 */
export async function acceptInvitation(
	secret: string,
	who: { newAccount: { displayName: string; password: string } } | { userId: number }
): Promise<User | null> {
	const open = await findOpenInvitation(secret);
	if (!open) return null;
	const { invitation } = open;
	const passwordHash = 'newAccount' in who ? await hashPassword(who.newAccount.password) : null;
	// Thrown inside the transaction so that nothing of a refused acceptance is kept.
	const refuse = () => {
		throw new InvitationUnusableError();
	};
	return db()
		.transaction(async (transaction) => {
			const [accepted] = await Invitation.update(
				{ acceptedAt: new Date() },
				{ where: { id: invitation.id, acceptedAt: null, revokedAt: null }, transaction }
			);
			if (accepted !== 1) refuse();
			let user: User | null;
			if ('newAccount' in who) {
				if (await User.findOne({ where: { email: invitation.email }, transaction })) refuse();
				user = await User.create(
					{
						email: invitation.email,
						displayName: who.newAccount.displayName,
						passwordHash,
						activeOrganisationId: invitation.organisationId
					},
					{ transaction }
				);
			} else {
				user = await User.findByPk(who.userId, { transaction });
				if (!user || user.email !== invitation.email) return refuse();
				await user.update({ activeOrganisationId: invitation.organisationId }, { transaction });
			}
			await addMembership(user.id, invitation.organisationId, invitation.role, transaction);
			await recordAudit(
				{
					action: 'invitation.accepted',
					organisationId: invitation.organisationId,
					userId: user.id,
					subjectType: 'invitation',
					subjectId: invitation.id,
					detail: { role: invitation.role }
				},
				transaction
			);
			return user;
		})
		.catch((err: unknown) => {
			if (err instanceof InvitationUnusableError) return null;
			throw err;
		});
}

class InvitationUnusableError extends Error {}

/** Withdraws an open invitation of the actor's organisation; null if there is none such. */
export async function revokeInvitation(actor: Actor, invitationId: number) {
	return db().transaction(async (transaction) => {
		const invitation = await Invitation.findOne({
			where: { id: invitationId, organisationId: actor.organisationId, acceptedAt: null },
			transaction
		});
		if (!invitation) return null;
		await invitation.update({ revokedAt: invitation.revokedAt ?? new Date() }, { transaction });
		await recordAudit(
			{
				action: 'invitation.revoked',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'invitation',
				subjectId: invitation.id
			},
			transaction
		);
		return invitation;
	});
}
