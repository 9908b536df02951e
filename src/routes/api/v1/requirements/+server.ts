import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { apiError } from '$lib/server/http';
import { suggestEnCover } from '$lib/server/intake/requirements';

const querySchema = z.object({
	exposureClass: z.string().max(8),
	barDiameterMm: z.coerce.number().min(0).max(100).default(0),
	structuralClass: z.string().max(4).default('S4')
});

/** The EN 1992-1-1 suggestion of c_min and c_nom for the member form. */
export const GET: RequestHandler = async ({ locals, url }) => {
	authorize(locals, 'survey:read');
	const parsed = querySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!parsed.success) apiError(400, 'invalid_input', parsed.error.issues[0].message);
	const q = parsed.data;
	return json({ suggestion: suggestEnCover(q.exposureClass, q.barDiameterMm, q.structuralClass) });
};
