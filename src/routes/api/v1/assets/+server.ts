import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { readJson } from '$lib/server/http';
import { assetSchema } from '$lib/intake/schemas';
import { createAsset, listAssets } from '$lib/server/intake/assets';
import { api } from '$lib/server/intake/respond';

export const GET: RequestHandler = async ({ locals }) => {
	const actor = authorize(locals, 'asset:read');
	return json({ assets: await api(() => listAssets(actor)) });
};

export const POST: RequestHandler = async ({ locals, request }) => {
	const actor = authorize(locals, 'asset:write');
	const input = await readJson(request, assetSchema);
	const asset = await api(() => createAsset(actor, input));
	return json({ asset }, { status: 201 });
};
