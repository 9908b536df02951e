import type { Transaction } from 'sequelize';
import { db } from '../db';
import { Membership, User } from '../db/models';
import type { Role } from '../db/models/Membership';
import { recordAudit } from '../audit';
import type { Actor } from '../policy';

export interface MemberRow {
	id: number;
	userId: number;
	displayName: string;
	email: string;
	role: Role;
	joinedAt: Date;
}

export class LastAdminError extends Error {
	constructor() {
		super('An organisation needs at least one admin: make someone else admin first.');
	}
}

export async function listMembers(organisationId: number): Promise<MemberRow[]> {
	const rows = await Membership.findAll({
		where: { organisationId },
		include: [User],
		order: [['id', 'ASC']]
	});
	return rows.map((row) => {
		const user = (row as Membership & { User?: User }).User;
		return {
			id: row.id,
			userId: row.userId,
			displayName: user?.displayName ?? '',
			email: user?.email ?? '',
			role: row.role,
			joinedAt: row.createdAt
		};
	});
}

/** The membership, locked for the change, if it is of the actor's organisation. */
async function lockMembership(actor: Actor, membershipId: number, transaction: Transaction) {
	return Membership.findOne({
		where: { id: membershipId, organisationId: actor.organisationId },
		transaction,
		lock: transaction.LOCK.UPDATE
	});
}

/** Whether taking this admin away would leave the organisation with none (rows locked). */
async function isLastAdmin(membership: Membership, transaction: Transaction): Promise<boolean> {
	if (membership.role !== 'admin') return false;
	const admins = await Membership.findAll({
		where: { organisationId: membership.organisationId, role: 'admin' },
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	return admins.length <= 1;
}

/** Changes a member's role; null when the membership is not of the actor's organisation. */
export function changeRole(actor: Actor, membershipId: number, role: Role) {
	return db().transaction(async (transaction) => {
		const membership = await lockMembership(actor, membershipId, transaction);
		if (!membership) return null;
		if (role !== 'admin' && (await isLastAdmin(membership, transaction)))
			throw new LastAdminError();
		const from = membership.role;
		await membership.update({ role }, { transaction });
		await recordAudit(
			{
				action: 'membership.role_changed',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'membership',
				subjectId: membership.id,
				detail: { from, to: role, memberUserId: membership.userId }
			},
			transaction
		);
		return membership;
	});
}

/** Removes a member from the organisation (not their account); null when not ours. */
export function removeMember(actor: Actor, membershipId: number) {
	return db().transaction(async (transaction) => {
		const membership = await lockMembership(actor, membershipId, transaction);
		if (!membership) return null;
		if (await isLastAdmin(membership, transaction)) throw new LastAdminError();
		await membership.destroy({ transaction });
		await User.update(
			{ activeOrganisationId: null },
			{
				where: { id: membership.userId, activeOrganisationId: membership.organisationId },
				transaction
			}
		);
		await recordAudit(
			{
				action: 'membership.removed',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'membership',
				subjectId: membership.id,
				detail: { memberUserId: membership.userId, role: membership.role }
			},
			transaction
		);
		return membership;
	});
}
