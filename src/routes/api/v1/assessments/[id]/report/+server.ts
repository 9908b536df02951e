import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { pathId } from '$lib/server/web/params';
import { api } from '$lib/server/web/respond';
import { signedAssessment } from '$lib/server/access';
import { pdfResponse } from '$lib/server/reports';
import { assessedSource } from '$lib/server/risk';

/** The report PDF of an approved (or superseded) assessment the caller may read. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'report:read');
	const id = pathId(params.id);
	const row = await api(() => signedAssessment(actor, id));
	return pdfResponse(await assessedSource(row));
};
