import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { visibleAsset } from '$lib/server/populations';
import { pathId } from '$lib/server/web/params';

/** The frame of a population detail; the figures are fetched from the API by the browser. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'population:read');
	const { asset } = await visibleAsset(actor, pathId(event.params.assetId));
	return { asset: { id: asset.id, name: asset.name } };
};
