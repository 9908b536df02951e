import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { authorize, can } from '$lib/server/policy';
import { pageActor } from '$lib/server/guard';
import { parseForm } from '$lib/server/forms';
import { assetSchema } from '$lib/intake/schemas';
import { createAsset, listAssets } from '$lib/server/intake/assets';
import { actOr } from '$lib/server/intake/pages';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'asset:read');
	return { assets: await listAssets(actor), canWrite: can(actor.role, 'asset:write') };
};

export const actions = {
	create: async ({ locals, request }) => {
		const actor = authorize(locals, 'asset:write');
		const parsed = await parseForm(request, assetSchema);
		if (!parsed.ok) return parsed.failure;
		const asset = await actOr(parsed.form, () => createAsset(actor, parsed.data));
		if (!('id' in asset)) return asset;
		redirect(303, `/assets/${asset.id}`);
	}
} satisfies Actions;
