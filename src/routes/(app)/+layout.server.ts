import { redirect } from '@sveltejs/kit';
import type { LayoutServerLoad } from './$types';
import { membershipsOf } from '$lib/server/auth/membership';
import { can } from '$lib/server/policy';
import { signInUrl } from '$lib/server/web/guard';
import { devOutboxEnabled } from '$lib/server/mail/devOutbox';

/**
 * The frame of every signed-in page. It only sends signed-out visitors to sign in and says
 * which links to show; each page's own load still asks the policy (STYLE.md, "Seams").
 */
export const load: LayoutServerLoad = async ({ locals, url }) => {
	if (!locals.user) redirect(303, signInUrl(url));
	const role = locals.membership?.role;
	const memberships = await membershipsOf(locals.user.id);
	return {
		user: { displayName: locals.user.displayName, email: locals.user.email },
		membership: locals.membership,
		organisations: memberships.map((m) => ({
			id: m.organisationId,
			name: m.organisationName,
			role: m.role
		})),
		links: {
			dashboard: !!role && can(role, 'dashboard:read'),
			assets: !!role && can(role, 'asset:read'),
			portfolio: !!role && can(role, 'report:read'),
			research: !!role && can(role, 'research:read'),
			researchConsent: !!role && can(role, 'research:consent'),
			members: !!role && can(role, 'organisation:manage'),
			audit: !!role && can(role, 'audit:read'),
			tokens: !!role && can(role, 'token:manage'),
			outbox: !!role && can(role, 'account:manage') && devOutboxEnabled()
		}
	};
};
