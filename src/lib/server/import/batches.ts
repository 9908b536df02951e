import { rename } from 'node:fs/promises';
import type { Readable } from 'node:stream';
import { Op, type CreationAttributes } from 'sequelize';
import { ColumnTemplate, ImportBatch, Survey } from '../db/models';
import type { ImportKind } from '../db/models/ImportBatch';
import { InputError, StateError, StorageUnavailableError } from '../domainErrors';
import { assertSurveyEditable } from '../intake/frozen';
import type { Actor } from '../policy';
import { scopedImportBatch, scopedSurvey } from '../access';
import { sanitiseFileName } from '../storage/names';
import { ImportError } from './errors';
import type { ColumnMapping, ImportOptions } from './mapping';
import type { CarbonationMapping, ChlorideMapping } from './measurements/mapping';
import { runMeasurementImport } from './measurements/run';
import { beginProgress } from './progress';
import { expireStalePreviews } from './expirePending';
import { previewStagedFile, type FilePreview } from './preview';
import { runImport } from './run';
import type { WriteMethod } from './writer';
import type { ImportOutcome } from './finish';
import { removeStaged, stagedPathOf, stageUpload, type StagedFile } from './stage';
import { openStaged, removeStagedCopies, storeStaged } from './stagedCopies';

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
	maxBytes?: number,
	kind: ImportKind = 'readings'
): Promise<UploadResult> {
	const { survey, asset } = await scopedSurvey(actor, surveyId, 'write');
	assertSurveyEditable(survey);
	await expireStalePreviews().catch((err: Error) =>
		console.error('expiring stale previews:', err.message)
	);
	const fileName = sanitiseFileName(rawFileName, 'readings.csv');
	const staged = await stageUpload(body, maxBytes);
	let preview: FilePreview;
	let batch: ImportBatch;
	try {
		preview = await previewStagedFile(staged.path, fileName, staged.bytes, kind);
		batch = await recordBatch(staged, {
			surveyId,
			kind,
			createdByUserId: actor.userId,
			sourceFormat: preview.format,
			fileName,
			fileSha256: staged.sha256,
			fileBytes: staged.bytes,
			options: preview.settings
		});
	} catch (err) {
		await removeStaged(staged.path);
		throw err;
	}
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

/**
 * Records a pending batch together with the stored copy of its upload: the object is written
 * before the row commits, so no app machine can see a pending batch whose file it cannot read,
 * and storage that is down rolls the row back (the upload answers 503, nothing recorded).
 */
async function recordBatch(
	staged: StagedFile,
	values: CreationAttributes<ImportBatch>
): Promise<ImportBatch> {
	let storedFor: number | null = null;
	try {
		return await ImportBatch.sequelize!.transaction(async (transaction) => {
			const batch = await ImportBatch.create(values, { transaction });
			await storeStaged(batch.id, staged.path, staged.bytes);
			storedFor = batch.id;
			return batch;
		});
	} catch (err) {
		// The commit failed after the object was stored: the object must not outlive its row.
		if (storedFor !== null) await removeStagedCopies(storedFor);
		throw err;
	}
}

export interface StartInput {
	/** A readings mapping, or a measurements one for a batch of that kind (startSchemaFor). */
	mapping: ColumnMapping | CarbonationMapping | ChlorideMapping;
	options: ImportOptions;
	confirmDuplicate: boolean;
	saveTemplateAs: string | null;
	headerSignature?: string;
	/** Not from the API: the tests and the benchmark compare the two ways of writing. */
	writeMethod?: WriteMethod;
}

/** What a batch's file holds, for the start route to read the mapping of that kind. */
export async function importKindOf(actor: Actor, batchId: number): Promise<ImportKind> {
	const { batch } = await scopedImportBatch(actor, batchId, 'write');
	return batch.kind;
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
	const source = await openAndBegin(batch, input);
	const job = {
		batchId: batch.id,
		surveyId: survey.id,
		organisationId: actor.organisationId,
		userId: actor.userId,
		format: batch.sourceFormat === 'xlsx' ? ('xlsx' as const) : ('csv' as const),
		open: () => source,
		options: input.options
	};
	const run =
		batch.kind === 'carbonation'
			? runMeasurementImport({
					...job,
					kind: 'carbonation',
					mapping: input.mapping as CarbonationMapping
				})
			: batch.kind === 'chloride'
				? runMeasurementImport({
						...job,
						kind: 'chloride',
						mapping: input.mapping as ChlorideMapping
					})
				: runImport({
						...job,
						mapping: input.mapping as ColumnMapping,
						writeMethod: input.writeMethod
					});
	const done: Promise<ImportOutcome> = run.finally(() => removeStagedCopies(batch.id));
	return { batchId: batch.id, done };
}

const START_WITHOUT_STORAGE =
	'File storage cannot be reached right now, so this import has not started; the uploaded file is kept. Try again in a few minutes.';

/**
 * Opens the batch's upload (this machine's copy or the stored one) and marks the batch running.
 * Opened first: storage that is down answers the start with a 503 and leaves the batch pending,
 * to be started again.
 */
async function openAndBegin(batch: ImportBatch, input: StartInput): Promise<Readable> {
	const bytes = Number(batch.fileBytes ?? 0);
	const source = await openStaged(batch.id, bytes).catch((err) => {
		// The shared wording says the file was not saved; here it was, and waits.
		if (!(err instanceof StorageUnavailableError)) throw err;
		throw new ImportError('storage_unavailable', START_WITHOUT_STORAGE, 503);
	});
	try {
		await claimPending(batch, input, bytes);
		return source;
	} catch (err) {
		source.destroy();
		throw err;
	}
}

/**
 * Moves the batch from pending to running as one conditional change, with its heartbeat in
 * the same transaction (a running batch always has one, for the sweep of abandoned imports).
 * Two starts of the same batch within milliseconds both passed a read-then-write check and
 * both wrote the readings; here the second finds no pending row to change and is refused.
 */
async function claimPending(batch: ImportBatch, input: StartInput, bytes: number) {
	await ImportBatch.sequelize!.transaction(async (transaction) => {
		const [claimed] = await ImportBatch.update(
			{ mapping: input.mapping, options: input.options, state: 'running' },
			{ where: { id: batch.id, state: 'pending' }, transaction }
		);
		if (claimed !== 1) {
			throw new StateError(
				'This import has already been started (or cancelled) by another request; follow its progress instead of starting it again.'
			);
		}
		await beginProgress(batch.id, bytes, transaction);
	});
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
