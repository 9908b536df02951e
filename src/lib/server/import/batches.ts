import { createReadStream } from 'node:fs';
import { rename } from 'node:fs/promises';
import type { Readable } from 'node:stream';
import { Op } from 'sequelize';
import { ColumnTemplate, ImportBatch, Survey } from '../db/models';
import { InputError, StateError } from '../domainErrors';
import { assertSurveyEditable } from '../intake/frozen';
import type { Actor } from '../policy';
import { scopedImportBatch, scopedSurvey } from '../scope';
import { sanitiseFileName } from '../storage/names';
import { ImportError } from './errors';
import type { ColumnMapping, ImportOptions } from './mapping';
import { beginProgress } from './progress';
import { previewStagedFile, type FilePreview } from './preview';
import { runImport } from './run';
import type { WriteMethod } from './writer';
import type { ImportOutcome } from './finish';
import { removeStaged, stagedPathOf, stageUpload } from './stage';

// Defined beside the staging code (the abandoned-import sweep needs it too); callers keep this path.
export { stagedPathOf };

export interface DuplicateImport {
	batchId: number;
	surveyId: number;
	fileName: string | null;
	importedAt: Date;
	rowsImported: number;
}

/** A completed (not undone) import of the same bytes into any survey of the same asset. */
export async function findDuplicateImport(assetId: number, sha256: string, exceptBatchId: number) {
	const surveys = await Survey.findAll({ where: { assetId }, attributes: ['id'] });
	const earlier = await ImportBatch.findOne({
		where: {
			surveyId: surveys.map((s) => s.id),
			fileSha256: sha256,
			state: 'completed',
			id: { [Op.ne]: exceptBatchId }
		},
		order: [['id', 'DESC']]
	});
	if (!earlier) return null;
	return {
		batchId: earlier.id,
		surveyId: earlier.surveyId,
		fileName: earlier.fileName,
		importedAt: earlier.finishedAt ?? earlier.createdAt,
		rowsImported: earlier.rowsImported
	} satisfies DuplicateImport;
}

export interface UploadResult {
	batchId: number;
	preview: FilePreview;
	duplicateOf: DuplicateImport | null;
	templates: { id: number; name: string; mapping: unknown; options: unknown }[];
}

/** Step 1: the file is staged (hashed, size-limited), detected and previewed; nothing imported. */
export async function receiveUpload(
	actor: Actor,
	surveyId: number,
	rawFileName: string,
	body: ReadableStream<Uint8Array> | Readable,
	maxBytes?: number
): Promise<UploadResult> {
	const { survey, asset } = await scopedSurvey(actor, surveyId, 'write');
	assertSurveyEditable(survey);
	const fileName = sanitiseFileName(rawFileName, 'readings.csv');
	const staged = await stageUpload(body, maxBytes);
	let preview: FilePreview;
	try {
		preview = await previewStagedFile(staged.path, fileName, staged.bytes);
	} catch (err) {
		await removeStaged(staged.path);
		throw err;
	}
	const batch = await ImportBatch.create({
		surveyId,
		createdByUserId: actor.userId,
		sourceFormat: preview.format,
		fileName,
		fileSha256: staged.sha256,
		fileBytes: staged.bytes,
		options: preview.settings
	});
	await rename(staged.path, stagedPathOf(batch.id));
	const templates = await ColumnTemplate.findAll({
		where: { organisationId: actor.organisationId, headerSignature: preview.headerSignature },
		attributes: ['id', 'name', 'mapping', 'options']
	});
	return {
		batchId: batch.id,
		preview,
		duplicateOf: await findDuplicateImport(asset.id, staged.sha256, batch.id),
		templates: templates.map((t) => t.get({ plain: true }))
	};
}

export interface StartInput {
	mapping: ColumnMapping;
	options: ImportOptions;
	confirmDuplicate: boolean;
	saveTemplateAs: string | null;
	headerSignature?: string;
	/** Not from the API: the tests and the benchmark compare the two ways of writing. */
	writeMethod?: WriteMethod;
}

/** Step 2: the import runs in the background; `done` settles when it has finished. */
export async function startImport(actor: Actor, batchId: number, input: StartInput) {
	const { batch, survey, asset } = await scopedImportBatch(actor, batchId, 'write');
	assertSurveyEditable(survey);
	if (batch.state !== 'pending') {
		throw new StateError(`This import is ${batch.state}; upload the file again to import it.`);
	}
	if (input.mapping.memberLabel == null && !input.options.fixedMemberLabel) {
		throw new InputError('Choose the member label column, or the one member all rows belong to.', {
			memberLabel: ['Choose a column or a member.']
		});
	}
	const duplicate = await findDuplicateImport(asset.id, batch.fileSha256 ?? '', batch.id);
	if (duplicate && !input.confirmDuplicate) {
		throw new ImportError(
			'duplicate-file',
			`This file was already imported (import ${duplicate.batchId}, ${duplicate.rowsImported} readings). Confirm to import it again.`,
			409
		);
	}
	if (input.saveTemplateAs && input.headerSignature) {
		await saveTemplate(actor, input.saveTemplateAs, input.headerSignature, input);
	}
	// Progress first: a running batch always has a heartbeat, so a process that dies between
	// these two lines leaves nothing that the sweep for abandoned imports cannot see.
	await beginProgress(batch.id, batch.fileBytes ?? 0);
	await batch.update({ mapping: input.mapping, options: input.options, state: 'running' });
	const path = stagedPathOf(batch.id);
	const done: Promise<ImportOutcome> = runImport({
		batchId: batch.id,
		surveyId: survey.id,
		organisationId: actor.organisationId,
		userId: actor.userId,
		format: batch.sourceFormat === 'xlsx' ? 'xlsx' : 'csv',
		// 16 kB reads: parsed batches stay small and die young (64 kB batches waited long enough
		// to be promoted, and the peak memory of a million-row import was ~30 MB higher).
		open: () => createReadStream(path, { highWaterMark: 16 * 1024 }),
		mapping: input.mapping,
		options: input.options,
		writeMethod: input.writeMethod
	}).finally(() => removeStaged(path));
	return { batchId: batch.id, done };
}

async function saveTemplate(actor: Actor, name: string, signature: string, input: StartInput) {
	const existing = await ColumnTemplate.findOne({
		where: { organisationId: actor.organisationId, name }
	});
	const values = { headerSignature: signature, mapping: input.mapping, options: input.options };
	if (existing) await existing.update(values);
	else
		await ColumnTemplate.create({
			organisationId: actor.organisationId,
			name,
			createdByUserId: actor.userId,
			...values
		});
}
