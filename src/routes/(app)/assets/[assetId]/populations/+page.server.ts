import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { can } from '$lib/server/policy';
import { visibleAsset } from '$lib/server/access';
import { surveysOf } from '$lib/server/api/ownRecords';
import { loadOr404 } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';

/** The frame of the overview; the table itself is fetched from the API by the browser. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'population:read');
	const { asset, access } = await loadOr404(() =>
		visibleAsset(actor, pathId(event.params.assetId))
	);
	const surveys = await surveysOf(asset.id);
	return {
		asset: { id: asset.id, name: asset.name },
		surveys,
		canAssess: access === 'own' && can(actor.role, 'assessment:write'),
		canReadAssessments: can(actor.role, 'assessment:read')
	};
};
