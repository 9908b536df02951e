import { manualEntrySchema } from '$lib/intake/schemas';
import { IMPORT_LIMITS } from '../../import/limits';
import { importCheckSchema } from '../../import/checkRows';
import { importStartSchema, importUploadQuerySchema } from '../../import/mapping';
import {
	cancelRequestedSchema,
	importCheckAnswerSchema,
	importStartedSchema,
	importStatusAnswerSchema,
	manualEntryAnswerSchema,
	undoneSchema,
	uploadAnswerSchema
} from '../importAnswers';
import { jsonAnswer, recordParams, type Endpoint } from './endpoint';
import { FROZEN, READ_ONLY } from './errors';
import { exampleEntry, exampleReadingsCsv, exampleStart } from './intakeExamples';

const MB = 1024 * 1024;
const batchParams = recordParams('batch', 'import');

/**
 * Readings: typed in, or imported from a meter's CSV or XLSX in two steps (upload →
 * preview, then start with the mapping), followed, their refused rows fetched, undone.
 */
export const importEndpoints: Endpoint[] = [
	{
		method: 'post',
		path: '/api/v1/members/{memberId}/readings',
		operationId: 'enterReadings',
		tag: 'Intake',
		summary: "Add readings typed into the member's entry grid, all or none",
		description:
			'Cells as typed (a decimal comma is taken). They go through the import path: the same checks, one transaction, and an import that can be undone.',
		action: 'reading:edit',
		params: recordParams('member'),
		body: manualEntrySchema,
		exampleBody: exampleEntry,
		response: jsonAnswer(manualEntryAnswerSchema, 'Every row written.', 201),
		errors: {
			'400':
				'Invalid input, or a row refused (`code` rows-rejected, the message names the grid row); nothing is written.',
			'403': READ_ONLY,
			'409': FROZEN
		}
	},
	{
		method: 'post',
		path: '/api/v1/surveys/{surveyId}/imports',
		operationId: 'uploadImport',
		tag: 'Intake',
		summary: 'Import step 1: send a CSV or XLSX file; get its detected settings and a preview',
		description:
			'Nothing is imported yet. The answer names an earlier import of the same bytes into this asset, if any, and saved mappings that fit the headers.',
		action: 'reading:import',
		params: recordParams('survey'),
		query: importUploadQuerySchema,
		exampleQuery: 'fileName=wall-scan.csv',
		file: {
			mediaTypes: [
				'text/csv',
				'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
				'application/octet-stream'
			],
			description:
				'The file itself as the body (not multipart), with any Content-Type: the format is judged from the bytes. UTF-8, UTF-8 with BOM or Windows-1252; delimiter, decimal mark and header row are detected.',
			example: { contentType: 'text/csv', text: exampleReadingsCsv }
		},
		response: jsonAnswer(uploadAnswerSchema, 'The import, pending, with its preview.', 201),
		errors: {
			'400':
				'The file cannot be taken in: empty, a header only, binary, a damaged or zip-bomb XLSX, or a line too long (`code` says which).',
			'403': READ_ONLY,
			'409': FROZEN,
			'413': `Larger than the ${IMPORT_LIMITS.maxFileBytes / MB} MB limit for one import.`
		}
	},
	{
		method: 'post',
		path: '/api/v1/imports/{batchId}/check',
		operationId: 'checkImportRows',
		tag: 'Intake',
		summary: "Between steps 1 and 2: the preview's rows as a mapping and its units would read them",
		description:
			'The same row checks as the import: each row comes back in mm, or with the reason it would be refused. Nothing is written.',
		action: 'reading:import',
		params: batchParams,
		body: importCheckSchema,
		exampleBody: {
			...exampleStart,
			headers: ['Member', 'Position (m)', 'Height (m)', 'Cover (mm)'],
			rows: [['M-01', '1.25', '0.4', '31.5']]
		},
		response: jsonAnswer(importCheckAnswerSchema, 'Each row as read, or why it would be refused.'),
		errors: { '400': 'Invalid mapping, options or rows (`field` names it).' }
	},
	{
		method: 'post',
		path: '/api/v1/imports/{batchId}/start',
		operationId: 'startImport',
		tag: 'Intake',
		summary: 'Import step 2: the column mapping and choices; the import runs on',
		description:
			'Every row is validated; the readings are written in one transaction. failingRows reject-file writes nothing if one row fails; import-valid writes the rest and keeps the refused rows. Follow it with GET /api/v1/imports/{batchId}.',
		action: 'reading:import',
		params: batchParams,
		body: importStartSchema,
		exampleBody: exampleStart,
		response: jsonAnswer(importStartedSchema, 'Started.', 202),
		errors: {
			'400':
				'Invalid mapping or options (`field` names it), or neither a member label column nor one member for every row.',
			'403': READ_ONLY,
			'409': `${FROZEN} Or: the import is not pending, or the file was imported already (\`code\` duplicate-file: send confirmDuplicate).`
		}
	},
	{
		method: 'get',
		path: '/api/v1/imports/{batchId}',
		operationId: 'importStatus',
		tag: 'Intake',
		summary: "An import's state and progress",
		description: 'Read from the database, so any app process answers it; poll while running.',
		action: 'survey:read',
		params: batchParams,
		response: jsonAnswer(importStatusAnswerSchema, 'The import.')
	},
	{
		method: 'get',
		path: '/api/v1/imports/{batchId}/rejected',
		operationId: 'importRejectedRows',
		tag: 'Intake',
		summary: 'The rows an import refused, with row number and reason',
		description: 'Cells that start with =, +, - or @ get a leading apostrophe.',
		action: 'survey:read',
		params: batchParams,
		response: { mediaType: 'text/csv', description: 'row, reason, then the row as it was.' },
		errors: { '404': 'No such import, not yours, or it refused no rows.' }
	},
	{
		method: 'post',
		path: '/api/v1/imports/{batchId}/undo',
		operationId: 'undoImport',
		tag: 'Intake',
		summary: 'Remove exactly the readings a completed import wrote (audited)',
		action: 'reading:edit',
		params: batchParams,
		response: jsonAnswer(undoneSchema, 'Undone.'),
		errors: {
			'403': READ_ONLY,
			'409': `${FROZEN} Or: only a completed import can be undone.`
		}
	},
	{
		method: 'post',
		path: '/api/v1/imports/{batchId}/cancel',
		operationId: 'cancelImport',
		tag: 'Intake',
		summary: 'Cancel a pending import, or stop a running one (it rolls back: nothing written)',
		action: 'reading:import',
		params: batchParams,
		response: jsonAnswer(cancelRequestedSchema, 'Cancelled, or asked to stop.', 202),
		errors: { '403': READ_ONLY, '409': 'The import has finished already.' }
	}
];
