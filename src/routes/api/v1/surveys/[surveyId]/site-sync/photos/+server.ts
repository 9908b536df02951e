import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { apiError } from '$lib/server/web/http';
import { sitePhotoQuerySchema } from '$lib/intake/schemas';
import { ATTACHMENT_MAX_BYTES } from '$lib/server/storage/attachments';
import { receiveSitePhoto } from '$lib/server/intake/siteSync';
import { api, noBodyAnswer } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** A photo taken on site, the bytes as the body; sent again under the same client id, a no-op. */
export const POST: RequestHandler = async ({ locals, params, request, url }) => {
	const actor = authorize(locals, 'attachment:upload');
	const surveyId = pathId(params.surveyId);
	const q = sitePhotoQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!q.success)
		apiError(400, 'invalid_input', q.error.issues[0].message, String(q.error.issues[0].path[0]));
	if (Number(request.headers.get('content-length') ?? 0) > ATTACHMENT_MAX_BYTES) {
		apiError(413, 'too-large', `Photos may be up to ${ATTACHMENT_MAX_BYTES / 1024 / 1024} MB.`);
	}
	if (!request.body) noBodyAnswer(request);
	const photo = { ...q.data, caption: q.data.caption ?? null };
	const answer = await api(() => receiveSitePhoto(actor, surveyId, photo, request.body!));
	return json(answer, { status: answer.received === 'now' ? 201 : 200 });
};
