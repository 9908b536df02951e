import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { apiError } from '$lib/server/web/http';
import {
	ATTACHMENT_MAX_BYTES,
	listAttachments,
	uploadAttachment
} from '$lib/server/storage/attachments';
import { attachmentUploadQuerySchema } from '$lib/server/storage/attachmentQuery';
import { scopedSurvey } from '$lib/server/access';
import { api, noBodyAnswer } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'attachment:read');
	const id = pathId(params.surveyId);
	await api(() => scopedSurvey(actor, id, 'read'));
	return json({ attachments: await listAttachments(id) });
};

/** The file as the raw body; kind, name and caption in the query string. */
export const POST: RequestHandler = async ({ locals, params, request, url }) => {
	const actor = authorize(locals, 'attachment:upload');
	const surveyId = pathId(params.surveyId);
	const q = attachmentUploadQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!q.success)
		apiError(400, 'invalid_input', q.error.issues[0].message, String(q.error.issues[0].path[0]));
	if (Number(request.headers.get('content-length') ?? 0) > ATTACHMENT_MAX_BYTES) {
		apiError(
			413,
			'too-large',
			`Attachments may be up to ${ATTACHMENT_MAX_BYTES / 1024 / 1024} MB.`
		);
	}
	// SvelteKit gives no body to a request without a Content-Type.
	if (!request.body) noBodyAnswer(request);
	const input = {
		kind: q.data.kind,
		fileName: q.data.fileName,
		caption: q.data.caption ?? null,
		memberId: q.data.memberId ?? null
	};
	const attachment = await api(() => uploadAttachment(actor, surveyId, input, request.body!));
	return json({ attachment }, { status: 201 });
};
