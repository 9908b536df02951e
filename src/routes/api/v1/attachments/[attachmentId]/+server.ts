import { Readable } from 'node:stream';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { scopedAttachment } from '$lib/server/access';
import { attachmentDownloadQuerySchema } from '$lib/server/storage/attachmentQuery';
import { getObject } from '$lib/server/storage/s3';
import { contentDisposition } from '$lib/server/storage/names';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** Downloads go through the policy and the scope, never straight to the bucket. */
export const GET: RequestHandler = async ({ locals, params, url }) => {
	const actor = authorize(locals, 'attachment:read');
	const attachment = await api(() => scopedAttachment(actor, pathId(params.attachmentId)));
	const { thumbnail } = attachmentDownloadQuerySchema.parse(Object.fromEntries(url.searchParams));
	const wantThumb = thumbnail === '1' && attachment.thumbnailKey;
	const object = await api(() =>
		getObject(wantThumb ? attachment.thumbnailKey! : attachment.storageKey)
	);
	const isImage = attachment.contentType.startsWith('image/');
	return new Response(Readable.toWeb(object.body) as ReadableStream, {
		headers: {
			'content-type': wantThumb ? 'image/jpeg' : attachment.contentType,
			'content-disposition': contentDisposition(
				attachment.fileName,
				isImage ? 'inline' : 'attachment'
			),
			'x-content-type-options': 'nosniff',
			'cache-control': 'private, no-store'
		}
	});
};
