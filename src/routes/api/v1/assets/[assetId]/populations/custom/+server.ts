import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';
import {
	createCustomPopulation,
	customPopulationSchema,
	customPopulationsOf
} from '$lib/server/populations';
import { scopedAsset } from '$lib/server/access';

/** The populations the engineers made from chosen members of this asset. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'population:read');
	const assetId = pathId(params.assetId);
	await api(() => scopedAsset(actor, assetId, 'read'));
	return json({ populations: await customPopulationsOf(assetId) });
};

/** Save a population made of chosen members (split out of a group when `splitFrom` is given). */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'assessment:write');
	const assetId = pathId(params.assetId);
	await api(() => scopedAsset(actor, assetId, 'read'));
	const input = await readJson(request, customPopulationSchema);
	const created = await api(() => createCustomPopulation(actor, assetId, input));
	return json({ population: created }, { status: 201 });
};
