import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';
import {
	deleteCustomPopulation,
	renameCustomPopulation,
	renameSchema
} from '$lib/server/populations';
import { scopedAsset } from '$lib/server/access';

/** Rename a population the engineers made (audited); the name stays unique on the asset. */
export const PATCH: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'assessment:write');
	const assetId = pathId(params.assetId);
	const customId = pathId(params.customId);
	// Another organisation's asset answers 404 before its body is read, as a missing one does.
	await api(() => scopedAsset(actor, assetId, 'read'));
	const input = await readJson(request, renameSchema);
	const renamed = await api(() => renameCustomPopulation(actor, assetId, customId, input));
	return json({ population: renamed });
};

/**
 * Delete a population the engineers made (audited). Assessments that carry it keep their own
 * copy in their snapshot, so they read the same afterwards.
 */
export const DELETE: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'assessment:write');
	const assetId = pathId(params.assetId);
	const customId = pathId(params.customId);
	await api(() => scopedAsset(actor, assetId, 'read'));
	await api(() => deleteCustomPopulation(actor, assetId, customId));
	return new Response(null, { status: 204 });
};
