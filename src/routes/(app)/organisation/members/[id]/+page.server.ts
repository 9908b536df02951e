import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { AuditEvent } from '$lib/server/db';
import { idParamSchema } from '$lib/server/auth/tokenSchemas';
import { listMembers } from '$lib/server/organisation/members';

/** One member of the active organisation and what they did in it lately. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'organisation:manage');
	const id = idParamSchema.safeParse(event.params.id);
	const member = id.success
		? (await listMembers(actor.organisationId)).find((m) => m.id === id.data)
		: undefined;
	// Another organisation's member is "not found", never "forbidden": ids tell nothing.
	if (!member) error(404, 'Not found.');
	const events = await AuditEvent.findAll({
		where: { organisationId: actor.organisationId, userId: member.userId },
		order: [['id', 'DESC']],
		limit: 50
	});
	return {
		member,
		events: events.map((e) => ({ id: e.id, at: e.createdAt, action: e.action }))
	};
};
