import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { AuditEvent, User } from '$lib/server/db';

/** The latest audit events of the active organisation, with who did them. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'audit:read');
	const events = await AuditEvent.findAll({
		where: { organisationId: actor.organisationId },
		order: [['id', 'DESC']],
		limit: 200
	});
	const userIds = [...new Set(events.map((e) => e.userId).filter((id): id is number => !!id))];
	const users = await User.findAll({ where: { id: userIds }, attributes: ['id', 'displayName'] });
	const names = new Map(users.map((u) => [u.id, u.displayName]));
	return {
		events: events.map((e) => ({
			id: e.id,
			at: e.createdAt,
			action: e.action,
			who: e.userId ? (names.get(e.userId) ?? `user ${e.userId}`) : '—',
			subject: e.subjectType ? `${e.subjectType} ${e.subjectId ?? ''}` : '',
			detail: e.detail ? JSON.stringify(e.detail) : ''
		}))
	};
};
