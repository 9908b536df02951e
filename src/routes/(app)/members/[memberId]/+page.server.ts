import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { scopedMember } from '$lib/server/access';
import { loadOr404 } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';

/** The frame of a member's view; readings and holes are fetched from the API by the browser. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'population:read');
	const { member, asset } = await loadOr404(() =>
		scopedMember(actor, pathId(event.params.memberId), 'read')
	);
	return {
		member: { id: member.id, label: member.label },
		asset: { id: asset.id, name: asset.name }
	};
};
