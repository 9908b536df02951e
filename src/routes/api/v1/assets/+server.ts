import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readableAssets, standingOf } from '$lib/server/access';
import { assetAnswer } from '$lib/server/api/ownRecords';
import { readJson } from '$lib/server/web/http';
import { assetSchema } from '$lib/intake/schemas';
import { createAsset } from '$lib/server/intake/assets';
import { api } from '$lib/server/web/respond';

/** Assets the caller's organisation owns or has been shared. */
export const GET: RequestHandler = async ({ locals }) => {
	const actor = authorize(locals, 'asset:read');
	const assets = await readableAssets(actor, 'id');
	return json({
		assets: assets.map((asset) => assetAnswer(asset, standingOf(actor, asset) === 'own'))
	});
};

export const POST: RequestHandler = async ({ locals, request }) => {
	const actor = authorize(locals, 'asset:write');
	const input = await readJson(request, assetSchema);
	const asset = await api(() => createAsset(actor, input));
	return json({ asset }, { status: 201 });
};
