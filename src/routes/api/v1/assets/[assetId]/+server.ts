import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { assetSchema } from '$lib/intake/schemas';
import { updateAsset } from '$lib/server/intake/assets';
import { scopedAsset } from '$lib/server/access';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'asset:read');
	const asset = await api(() => scopedAsset(actor, pathId(params.assetId), 'read'));
	return json({ asset });
};

export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'asset:write');
	const id = pathId(params.assetId);
	const input = await readJson(request, assetSchema);
	return json({ asset: await api(() => updateAsset(actor, id, input)) });
};
