import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { devOutboxEnabled, devOutboxFor } from '$lib/server/mail/devOutbox';

/** The signed-in user's own mail, as the local mail fake received it (development and demo only). */
export const load: PageServerLoad = async (event) => {
	if (!devOutboxEnabled()) error(404, 'Not found.');
	const actor = pageActor(event, 'account:manage');
	const mails = await devOutboxFor(actor.userId);
	if (!mails) error(404, 'Not found.');
	return { mails, address: event.locals.user?.email ?? '' };
};
