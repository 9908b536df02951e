import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { apiError } from '$lib/server/web/http';
import { listImports } from '$lib/server/import/batchActions';
import { receiveUpload } from '$lib/server/import/batches';
import { IMPORT_LIMITS } from '$lib/server/import/limits';
import { importUploadQuerySchema } from '$lib/server/import/mapping';
import { api, noBodyAnswer } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	return json({ imports: await api(() => listImports(actor, pathId(params.surveyId))) });
};

/**
 * Step 1 of an import: the file itself as the request body (not multipart, so it streams to
 * disk without being held), its name in ?fileName=. Answers the detected settings, a preview,
 * matching templates and an earlier import of the same bytes, if any.
 */
export const POST: RequestHandler = async ({ locals, params, request, url }) => {
	const actor = authorize(locals, 'reading:import');
	const surveyId = pathId(params.surveyId);
	const declared = Number(request.headers.get('content-length') ?? 0);
	const limitMb = IMPORT_LIMITS.maxFileBytes / 1024 / 1024;
	if (declared > IMPORT_LIMITS.maxFileBytes) {
		apiError(
			413,
			'too-large',
			`The file is larger than the ${limitMb} MB limit for one import; split it into smaller files.`
		);
	}
	// SvelteKit gives no body to a request without a Content-Type.
	if (!request.body) noBodyAnswer(request);
	const { fileName, kind } = importUploadQuerySchema.parse(Object.fromEntries(url.searchParams));
	const result = await api(() =>
		receiveUpload(actor, surveyId, fileName, request.body!, undefined, kind)
	);
	return json(result, { status: 201 });
};
