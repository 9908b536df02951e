import type { Actions, PageServerLoad } from './$types';
import { authorize } from '$lib/server/web/actor';
import { can } from '$lib/server/policy';
import { pageActor } from '$lib/server/web/guard';
import { parseForm } from '$lib/server/web/forms';
import { readingCounts } from '$lib/server/readings/coverSets';
import { holeSchema } from '$lib/intake/schemas';
import { createHole, listHoles } from '$lib/server/intake/holes';
import { actOr, loadOr404 } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { scopedMember } from '$lib/server/access';
import { frozenReason } from '$lib/server/intake/frozen';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'survey:read');
	const memberId = pathId(event.params.memberId);
	const { member, survey, asset } = await loadOr404(() => scopedMember(actor, memberId, 'read'));
	const editable =
		asset.organisationId === actor.organisationId &&
		(survey.status === 'draft' || survey.status === 'returned');
	const holes = await listHoles(actor, memberId);
	return {
		member: member.get({ plain: true }),
		survey: { id: survey.id, title: survey.title, status: survey.status },
		readingCount: (await readingCounts([memberId])).get(memberId) ?? 0,
		holes: holes.map((h) => h.get({ plain: true })),
		// Said where the grid would be, so a frozen survey does not just lack one.
		frozen: frozenReason(survey, can(actor.role, 'survey:review')),
		can: {
			enter: editable && can(actor.role, 'reading:edit'),
			editMember: editable && can(actor.role, 'member:write'),
			holes: editable && can(actor.role, 'hole:write')
		}
	};
};

export const actions = {
	addHole: async ({ locals, request, params }) => {
		const actor = authorize(locals, 'hole:write');
		const parsed = await parseForm(request, holeSchema);
		if (!parsed.ok) return parsed.failure;
		const done = await actOr(parsed.form, () =>
			createHole(actor, pathId(params.memberId), parsed.data)
		);
		return 'id' in done ? { ok: `Hole ${parsed.data.label} recorded.` } : done;
	}
} satisfies Actions;
