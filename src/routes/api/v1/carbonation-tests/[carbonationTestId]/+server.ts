import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { deleteCarbonationTest } from '$lib/server/intake/carbonation';
import { scopedCarbonationTest } from '$lib/server/access';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const id = pathId(params.carbonationTestId);
	const { record } = await api(() => scopedCarbonationTest(actor, id, 'read'));
	return json({ carbonationTest: record });
};

/** Removes a test recorded in error, while its survey is a draft or returned (audited). */
export const DELETE: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'measurement:write');
	const id = pathId(params.carbonationTestId);
	await api(() => deleteCarbonationTest(actor, id));
	return new Response(null, { status: 204 });
};
