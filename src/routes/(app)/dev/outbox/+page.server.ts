import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { env } from '$env/dynamic/private';
import { pageActor } from '$lib/server/guard';
import { readFakeOutbox } from '$lib/server/mail/fake-outbox';

/** What the local mail fake received. Off unless DEV_OUTBOX=1 (never set it in production). */
export const load: PageServerLoad = async (event) => {
	if (env.DEV_OUTBOX !== '1' || !env.MAIL_FAKE_DIR) error(404, 'Not found.');
	pageActor(event, 'mail:read');
	return { mails: await readFakeOutbox(env.MAIL_FAKE_DIR) };
};
