import type { Actions, PageServerLoad } from './$types';
import { can } from '$lib/server/policy';
import { pageActor } from '$lib/server/web/guard';
import { assetSchema } from '$lib/intake/schemas';
import { createAsset, listAssets } from '$lib/server/intake/assets';
import { savingAction } from '$lib/server/web/pages';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'asset:read');
	return { assets: await listAssets(actor), canWrite: can(actor.role, 'asset:write') };
};

export const actions = {
	create: savingAction(
		'asset:write',
		assetSchema,
		(actor, input) => createAsset(actor, input),
		(asset) => `/assets/${asset.id}`
	)
} satisfies Actions;
