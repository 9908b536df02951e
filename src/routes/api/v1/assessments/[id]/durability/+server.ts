import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { readJson } from '$lib/server/web/http';
import { authorize } from '$lib/server/web/actor';
import { pathId } from '$lib/server/web/params';
import { api } from '$lib/server/web/respond';
import { visibleAssessment } from '$lib/server/access';
import {
	assessedSource,
	CARBONATION_DEFAULTS,
	CHLORIDE_DEFAULTS,
	durabilityParametersSchema,
	loadAnnex,
	saveRisk,
	toRiskView
} from '$lib/server/risk';

const bodySchema = z.object({ parameters: durabilityParametersSchema });

/**
 * The parameters kept with an assessment (or none yet), its populations' risk (measured fronts
 * where there are some), the risk view with every input's provenance, and the stated defaults.
 */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'assessment:read');
	const id = pathId(params.id);
	const { assessment: row } = await api(() => visibleAssessment(actor, id));
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
	const id = pathId(params.id);
	const { parameters } = await readJson(request, bodySchema);
	const annex = await api(() => saveRisk(actor, id, parameters));
	return json({ parameters: annex.parameters, populations: annex.populations });
};
