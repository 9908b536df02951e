import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { recentEventsOf } from '$lib/server/auditLog';
import { pathId } from '$lib/server/web/params';
import { listMembers } from '$lib/server/organisation/members';

/** One member of the active organisation and what they did in it lately. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'organisation:manage');
	const id = pathId(event.params.id);
	const member = (await listMembers(actor.organisationId)).find((m) => m.id === id);
	// Another organisation's member is "not found", never "forbidden": ids tell nothing.
	if (!member) error(404, 'Not found.');
	return { member, events: await recentEventsOf(actor, member.userId) };
};
