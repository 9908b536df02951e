import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { can } from '$lib/server/policy';
import { memberSchema } from '$lib/intake/schemas';
import { formValuesOf } from '$lib/intake/formValues';
import { updateMember } from '$lib/server/intake/members';
import { frozenReason } from '$lib/server/intake/frozen';
import { loadOr404, savingAction } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { withSavedNotice } from '$lib/intake/savedNotice';
import { scopedMember } from '$lib/server/access';

/** Every specified value of a member, editable while its survey is a draft or returned. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'member:write');
	const memberId = pathId(event.params.memberId);
	const { member, survey, asset } = await loadOr404(() => scopedMember(actor, memberId, 'write'));
	return {
		member: { id: member.id, label: member.label },
		designCode: asset.designCode,
		values: formValuesOf(member.get({ plain: true }), memberSchema),
		frozen: frozenReason(survey, can(actor.role, 'survey:review'))
	};
};

export const actions = {
	save: savingAction(
		'member:write',
		memberSchema,
		(actor, input, params: { memberId: string }) =>
			updateMember(actor, pathId(params.memberId), input),
		(member) => withSavedNotice(`/members/${member.id}/entry`, 'member')
	)
} satisfies Actions;
