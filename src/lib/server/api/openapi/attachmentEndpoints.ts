import { ATTACHMENT_MAX_BYTES } from '../../storage/attachments';
import {
	attachmentDownloadQuerySchema,
	attachmentUploadQuerySchema
} from '../../storage/attachmentQuery';
import { attachmentAnswerSchema } from '../intakeAnswers';
import { jsonAnswer, recordParams, type Endpoint } from './endpoint';
import { FROZEN, READ_ONLY } from './errors';
import { exampleMeterFile } from './intakeExamples';

const MB = 1024 * 1024;
const STORAGE_DOWN = 'Object storage cannot be reached; nothing was saved. Try again later.';

/** Files kept with a survey as evidence: stored in object storage, read through the API. */
export const attachmentEndpoints: Endpoint[] = [
	{
		method: 'post',
		path: '/api/v1/surveys/{surveyId}/attachments',
		operationId: 'uploadAttachment',
		tag: 'Intake',
		summary: "Keep a file with the survey: a photo, a drawing, the meter's own file",
		description:
			'Type judged from the bytes, never SVG or HTML; file name sanitised; images get a thumbnail.',
		action: 'attachment:upload',
		params: recordParams('survey'),
		query: attachmentUploadQuerySchema,
		exampleQuery: 'fileName=wall-scan-log.csv&kind=meter-file&caption=Meter%20log%2C%20W-01',
		file: {
			mediaTypes: ['image/jpeg', 'image/png', 'image/webp', 'application/pdf', '*/*'],
			description: 'The file itself as the body (not multipart), with any Content-Type.',
			example: { contentType: 'text/csv', text: exampleMeterFile }
		},
		response: jsonAnswer(attachmentAnswerSchema, 'The attachment as stored.', 201),
		errors: {
			'400': 'No fileName or kind, an empty file, or a type its kind does not take.',
			'403': READ_ONLY,
			'409': FROZEN,
			'413': `Larger than ${ATTACHMENT_MAX_BYTES / MB} MB.`,
			'503': STORAGE_DOWN
		}
	},
	{
		method: 'get',
		path: '/api/v1/attachments/{attachmentId}',
		operationId: 'downloadAttachment',
		tag: 'Intake',
		summary: 'Download an attachment (images inline, other files as a download)',
		action: 'attachment:read',
		params: recordParams('attachment'),
		query: attachmentDownloadQuerySchema,
		exampleQuery: 'thumbnail=0',
		response: { mediaType: '*/*', description: 'The file, with the type judged at upload.' },
		errors: { '503': STORAGE_DOWN }
	}
];
