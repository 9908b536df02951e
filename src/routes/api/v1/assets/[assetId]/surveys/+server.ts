import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { parseInput } from '$lib/server/api/request';
import { idParam } from '$lib/server/api/schemas';
import { visibleAsset } from '$lib/server/api/visible';
import { surveysOf } from '$lib/server/api/ownRecords';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'asset:read');
	const { assetId } = parseInput(z.object({ assetId: idParam('asset') }), params);
	const asset = await visibleAsset(actor, assetId);
	return json({ surveys: await surveysOf(asset.id) });
};
