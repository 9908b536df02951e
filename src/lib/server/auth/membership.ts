import { Membership, Organisation, User } from '../db/models';

export type ActiveMembership = NonNullable<App.Locals['membership']>;

/**
 * The membership a request acts in: the user's chosen organisation if they still belong to it,
 * else their oldest membership. Looked up per request, so a role change applies at once.
 */
export async function activeMembership(
	userId: number,
	preferredOrganisationId: number | null
): Promise<ActiveMembership | null> {
	const rows = await Membership.findAll({
		where: { userId },
		include: [Organisation],
		order: [['id', 'ASC']]
	});
	const chosen = rows.find((m) => m.organisationId === preferredOrganisationId) ?? rows[0];
	return chosen ? describe(chosen) : null;
}

/** The membership in exactly this organisation (API tokens are bound to one). */
export async function membershipIn(
	userId: number,
	organisationId: number
): Promise<ActiveMembership | null> {
	const row = await Membership.findOne({
		where: { userId, organisationId },
		include: [Organisation]
	});
	return row ? describe(row) : null;
}

/** Every organisation the user belongs to, oldest membership first (the switcher's list). */
export async function membershipsOf(userId: number): Promise<ActiveMembership[]> {
	const rows = await Membership.findAll({
		where: { userId },
		include: [Organisation],
		order: [['id', 'ASC']]
	});
	return rows.map(describe);
}

function describe(row: Membership): ActiveMembership {
	const organisation = (row as Membership & { Organisation?: Organisation }).Organisation;
	return {
		organisationId: row.organisationId,
		organisationName: organisation?.name ?? '',
		role: row.role
	};
}

/**
 * Make `organisationId` the user's active organisation; the membership there, or null (and
 * nothing changed) when the user is not a member. The page and the API both switch through here.
 */
export async function switchOrganisation(
	userId: number,
	organisationId: number
): Promise<ActiveMembership | null> {
	const membership = await membershipIn(userId, organisationId);
	if (!membership) return null;
	await User.update({ activeOrganisationId: organisationId }, { where: { id: userId } });
	return membership;
}
