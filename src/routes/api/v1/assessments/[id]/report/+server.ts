import { z } from 'zod';
import type { RequestHandler } from './$types';
import { apiError } from '$lib/server/web/http';
import { authorize } from '$lib/server/web/actor';
import { pdfResponse } from '$lib/server/reports';
import { assessedSource, readableAssessment } from '$lib/server/risk';

const idSchema = z.coerce.number().int().positive().max(4_294_967_295);

/** The report PDF of an approved (or superseded) assessment the caller may read. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'report:read');
	const id = idSchema.safeParse(params.id);
	if (!id.success) apiError(404, 'not_found', 'No such assessment.');
	const row = await readableAssessment(actor, id.data);
	return pdfResponse(await assessedSource(row));
};
