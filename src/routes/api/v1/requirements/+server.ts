import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { apiError } from '$lib/server/web/http';
import { EN_DELTA_C_DEV_RANGE_MM, suggestEnCover } from '$lib/server/intake/requirements';

const { min, max } = EN_DELTA_C_DEV_RANGE_MM;
const querySchema = z.object({
	exposureClass: z.string().max(8),
	barDiameterMm: z.coerce.number().min(0).max(100).default(0),
	structuralClass: z.string().max(4).default('S4'),
	// The Δc_dev typed on the form, if any ('' is none); a decimal comma as the form takes it.
	deltaCDevMm: z.preprocess(
		(v) => (v === '' || v == null ? undefined : String(v).replace(',', '.')),
		z.coerce
			.number({ error: 'Δc_dev must be a number.' })
			.min(min, `EN 1992-1-1 4.4.1.3 takes Δc_dev from ${min} to ${max} mm.`)
			.max(max, `EN 1992-1-1 4.4.1.3 takes Δc_dev from ${min} to ${max} mm.`)
			.optional()
	)
});

/** The EN 1992-1-1 suggestion of c_min and c_nom for the member form, with its typed Δc_dev. */
export const GET: RequestHandler = async ({ locals, url }) => {
	authorize(locals, 'survey:read');
	const parsed = querySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		apiError(400, 'invalid_input', issue.message, String(issue.path[0]));
	}
	const q = parsed.data;
	const suggestion = suggestEnCover(
		q.exposureClass,
		q.barDiameterMm,
		q.structuralClass,
		q.deltaCDevMm
	);
	return json({ suggestion });
};
