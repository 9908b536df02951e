import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { visibleAsset } from '$lib/server/access';
import { loadOr404 } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { can } from '$lib/server/policy';

/** The frame of a population detail; the figures are fetched from the API by the browser. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'population:read');
	const { asset, access } = await loadOr404(() =>
		visibleAsset(actor, pathId(event.params.assetId))
	);
	return {
		asset: { id: asset.id, name: asset.name },
		canSplit: access === 'own' && can(actor.role, 'assessment:write')
	};
};
