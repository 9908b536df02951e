import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { Assessment } from '$lib/server/db';
import { apiError, readJson } from '$lib/server/web/http';
import { authorize } from '$lib/server/web/actor';
import {
	assessedSource,
	CARBONATION_DEFAULTS,
	CHLORIDE_DEFAULTS,
	durabilityParametersSchema,
	loadAnnex,
	saveRisk,
	toRiskView,
	visibleAsset
} from '$lib/server/risk';

const idSchema = z.coerce.number().int().positive().max(4_294_967_295);
const bodySchema = z.object({ parameters: durabilityParametersSchema });

function assessmentId(raw: string): number {
	const parsed = idSchema.safeParse(raw);
	if (!parsed.success) apiError(404, 'not_found', 'No such assessment.');
	return parsed.data;
}

/**
 * The parameters kept with an assessment (or none yet), its populations' risk (measured fronts
 * where there are some), the risk view with every input's provenance, and the stated defaults.
 */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'assessment:read');
	const id = assessmentId(params.id);
	const row = await Assessment.findByPk(id);
	if (!row) apiError(404, 'not_found', 'No such assessment.');
	const { own } = await visibleAsset(actor, row.assetId, 'No such assessment.');
	if (row.state === 'draft' && !own) apiError(404, 'not_found', 'No such assessment.');
	const annex = await loadAnnex(id);
	return json({
		parameters: annex?.parameters ?? null,
		populations: annex?.populations ?? null,
		risk: annex ? toRiskView(await assessedSource(row)) : null,
		defaults: { carbonation: CARBONATION_DEFAULTS, chloride: CHLORIDE_DEFAULTS }
	});
};

/** Enter the durability parameters of a draft; the risk figures are computed and kept with it. */
export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'assessment:write');
	const id = assessmentId(params.id);
	const { parameters } = await readJson(request, bodySchema);
	const annex = await saveRisk(actor, id, parameters);
	return json({ parameters: annex.parameters, populations: annex.populations });
};
