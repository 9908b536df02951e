import { z } from 'zod';
import { ATTACHMENT_KINDS } from '$lib/words';

/** An attachment upload's query: the file itself is the request body, so its details come here. */
export const attachmentUploadQuerySchema = z.object({
	fileName: z.string().min(1, 'Give the file name in ?fileName=.').max(500),
	kind: z
		.enum(ATTACHMENT_KINDS, { error: 'kind must be photo, drawing, meter-file or other.' })
		.describe(
			'photo: JPEG, PNG or WebP; drawing: those or PDF; meter-file: the meter’s own files, any type but HTML or SVG; other: images, PDF, text or Office files.'
		),
	caption: z.string().max(255).optional(),
	memberId: z.coerce.number().int().positive().optional().describe('The member it shows, if one.')
});

export const attachmentDownloadQuerySchema = z.object({
	thumbnail: z
		.string()
		.optional()
		.describe("1: the image's 320 px JPEG thumbnail; otherwise the file itself.")
});
