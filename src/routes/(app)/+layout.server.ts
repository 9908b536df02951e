import { redirect } from '@sveltejs/kit';
import type { LayoutServerLoad } from './$types';
import { env } from '$env/dynamic/private';
import { Membership, Organisation } from '$lib/server/db';
import { can } from '$lib/server/policy';
import { signInUrl } from '$lib/server/guard';

/**
 * The frame of every signed-in page. It only sends signed-out visitors to sign in and says
 * which links to show; each page's own load still asks the policy (STYLE.md, "Seams").
 */
export const load: LayoutServerLoad = async ({ locals, url }) => {
	if (!locals.user) redirect(303, signInUrl(url));
	const role = locals.membership?.role;
	const memberships = await Membership.findAll({
		where: { userId: locals.user.id },
		include: [Organisation],
		order: [['id', 'ASC']]
	});
	return {
		user: { displayName: locals.user.displayName, email: locals.user.email },
		membership: locals.membership,
		organisations: memberships.map((m) => ({
			id: m.organisationId,
			name: (m as Membership & { Organisation?: Organisation }).Organisation?.name ?? '',
			role: m.role
		})),
		links: {
			dashboard: !!role && can(role, 'dashboard:read'),
			assets: !!role && can(role, 'asset:read'),
			research: !!role && can(role, 'research:read'),
			members: !!role && can(role, 'organisation:manage'),
			audit: !!role && can(role, 'audit:read'),
			tokens: !!role && can(role, 'token:manage'),
			outbox: !!role && can(role, 'mail:read') && env.DEV_OUTBOX === '1'
		}
	};
};
