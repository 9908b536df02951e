import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { apiError, readJson } from '$lib/server/web/http';
import { parseInput } from '$lib/server/api/request';
import { idParam } from '$lib/server/api/schemas';
import { consentBodySchema } from '$lib/server/research/apiSchemas';
import { AssetNotFoundError, readConsent, setConsent } from '$lib/server/research/consent';

const paramsSchema = z.object({ assetId: idParam('asset') });

function notFound(e: unknown): never {
	if (e instanceof AssetNotFoundError) apiError(404, 'not_found', e.message);
	throw e;
}

/** The consent of an asset the caller's organisation owns (a shared one is not theirs to give). */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'research:consent');
	const { assetId } = parseInput(paramsSchema, params);
	return json(await readConsent(actor.organisationId, assetId).catch(notFound));
};

export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'research:consent');
	const { assetId } = parseInput(paramsSchema, params);
	const { researchOptIn } = await readJson(request, consentBodySchema);
	return json(await setConsent(actor, assetId, researchOptIn).catch(notFound));
};
