import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { visibleAssets } from '$lib/server/api/visible';
import { assetAnswer } from '$lib/server/api/ownRecords';

/** Assets the caller's organisation owns or has been shared. */
export const GET: RequestHandler = async ({ locals }) => {
	const actor = authorize(locals, 'asset:read');
	const assets = await visibleAssets(actor);
	return json({ assets: assets.map(({ asset, owned }) => assetAnswer(asset, owned)) });
};
