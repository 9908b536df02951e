import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { assetSchema } from '$lib/intake/schemas';
import { formValuesOf } from '$lib/intake/formValues';
import { updateAsset } from '$lib/server/intake/assets';
import { loadOr404, savingAction } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { withSavedNotice } from '$lib/intake/savedNotice';
import { scopedAsset } from '$lib/server/access';

/** An asset's own details; a shared asset is read-only to its guests (403). */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'asset:write');
	const assetId = pathId(event.params.assetId);
	const asset = await loadOr404(() => scopedAsset(actor, assetId, 'write'));
	return {
		asset: { id: asset.id, name: asset.name },
		values: formValuesOf(asset.get({ plain: true }), assetSchema)
	};
};

export const actions = {
	save: savingAction(
		'asset:write',
		assetSchema,
		(actor, input, params: { assetId: string }) =>
			updateAsset(actor, pathId(params.assetId), input),
		(asset) => withSavedNotice(`/assets/${asset.id}`, 'asset')
	)
} satisfies Actions;
