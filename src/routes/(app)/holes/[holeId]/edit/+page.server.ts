import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { can } from '$lib/server/policy';
import { holeSchema } from '$lib/intake/schemas';
import { formValuesOf } from '$lib/intake/formValues';
import { deleteHole, updateHole } from '$lib/server/intake/holes';
import { frozenReason } from '$lib/server/intake/frozen';
import { loadOr404, savingAction } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { withSavedNotice } from '$lib/intake/savedNotice';
import { scopedHole } from '$lib/server/access';

/** A verification hole to correct or delete, while its survey is a draft or returned. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'hole:write');
	const holeId = pathId(event.params.holeId);
	const { hole, member, survey } = await loadOr404(() => scopedHole(actor, holeId, 'write'));
	return {
		hole: { id: hole.id, label: hole.label },
		member: { id: member.id, label: member.label },
		values: formValuesOf(hole.get({ plain: true }), holeSchema),
		frozen: frozenReason(survey, can(actor.role, 'survey:review'))
	};
};

export const actions = {
	save: savingAction(
		'hole:write',
		holeSchema,
		(actor, input, params: { holeId: string }) => updateHole(actor, pathId(params.holeId), input),
		(hole) => withSavedNotice(`/members/${hole.memberId}/entry`, 'hole')
	),
	delete: savingAction(
		'hole:write',
		z.object({}),
		(actor, _input, params: { holeId: string }) => deleteHole(actor, pathId(params.holeId)),
		(deleted) => withSavedNotice(`/members/${deleted.memberId}/entry`, 'hole-deleted')
	)
} satisfies Actions;
