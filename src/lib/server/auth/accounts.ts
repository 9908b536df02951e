import { randomBytes } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { db } from '../db';
import { Membership, Organisation, User } from '../db/models';
import type { Role } from '../db/models/Membership';
import { recordAudit } from '../audit';
import { hashPassword } from './password';

export class EmailTakenError extends Error {
	constructor() {
		super('An account with this e-mail address already exists.');
	}
}

/** Sign-up: a new organisation, its first user, made admin — all three or none. */
export async function createAccountWithOrganisation(input: {
	email: string;
	displayName: string;
	organisationName: string;
	password: string;
}): Promise<User> {
	const passwordHash = await hashPassword(input.password);
	return db().transaction(async (transaction) => {
		if (await User.findOne({ where: { email: input.email }, transaction })) {
			throw new EmailTakenError();
		}
		const organisation = await Organisation.create(
			{ name: input.organisationName, slug: await freeSlug(input.organisationName, transaction) },
			{ transaction }
		);
		const user = await User.create(
			{
				email: input.email,
				displayName: input.displayName,
				passwordHash,
				activeOrganisationId: organisation.id
			},
			{ transaction }
		);
		await addMembership(user.id, organisation.id, 'admin', transaction);
		await recordAudit(
			{ action: 'organisation.created', organisationId: organisation.id, userId: user.id },
			transaction
		);
		return user;
	});
}

export async function addMembership(
	userId: number,
	organisationId: number,
	role: Role,
	transaction: Transaction
): Promise<Membership> {
	return Membership.create({ userId, organisationId, role }, { transaction });
}

async function freeSlug(name: string, transaction: Transaction): Promise<string> {
	const base =
		name
			.normalize('NFKD')
			.toLowerCase()
			.replace(/[^a-z0-9]+/g, '-')
			.replace(/^-|-$/g, '')
			.slice(0, 60) || 'organisation';
	const taken = await Organisation.findOne({ where: { slug: base }, transaction });
	return taken ? `${base}-${randomBytes(4).toString('hex')}` : base;
}
