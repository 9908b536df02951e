import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { endSessions } from '$lib/server/web/signIn';
import { recordAudit } from '$lib/server/audit';

// Signing out is a POST (a link could be followed by a prefetch or a stranger's page).
export const load: PageServerLoad = async () => redirect(303, '/');

async function signOut(event: Parameters<Actions[string]>[0], everywhere: boolean) {
	if (event.locals.user) {
		await recordAudit({
			action: everywhere ? 'auth.sign_out_everywhere' : 'auth.sign_out',
			userId: event.locals.user.id,
			organisationId: event.locals.membership?.organisationId
		});
	}
	await endSessions(event, everywhere);
	redirect(303, '/sign-in');
}

export const actions = {
	device: (event) => signOut(event, false),
	everywhere: (event) => signOut(event, true)
} satisfies Actions;
