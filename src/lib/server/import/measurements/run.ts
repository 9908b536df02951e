import type { Transaction } from 'sequelize';
import { counted } from '$lib/format';
import type { Readable } from 'node:stream';
import {
	CarbonationTest,
	ChlorideIncrement,
	ChlorideProfile,
	ImportBatch,
	Survey
} from '../../db/models';
import { recordAudit } from '../../audit';
import { assertSurveyEditableLocked } from '../../intake/frozen';
import { incrementRows } from '../../intake/chloride';
import { ImportError } from '../errors';
import type { ImportOutcome } from '../finish';
import type { ImportOptions } from '../mapping';
import type { RecordBatch } from '../records';
import { RejectedRows } from '../rejected';
import { extraFields, failImport, memberIndex } from '../run';
import type { SourceFormat } from '../sniff';
import { csvRecordBatches, xlsxRecordBatches } from '../sources';
import { labelKey } from '../validateRow';
import type { CarbonationMapping, ChlorideMapping } from './mapping';
import { carbonationRows, chlorideRows, type FileRow, type RowProblem } from './rows';

/** A measurements file is a few hundred rows; more is the wrong file (a readings export). */
export const MEASUREMENT_MAX_ROWS = 20_000;

export type MeasurementImportJob = {
	batchId: number;
	surveyId: number;
	organisationId: number;
	userId: number | null;
	format: SourceFormat;
	open: () => Readable;
	options: ImportOptions;
} & (
	| { kind: 'carbonation'; mapping: CarbonationMapping }
	| { kind: 'chloride'; mapping: ChlorideMapping }
);

const isBlank = (cells: readonly string[]) => cells.every((c) => c.trim() === '');

/** The file's data rows with their row numbers, the header row apart. */
async function readRows(job: MeasurementImportJob) {
	const source: AsyncGenerator<RecordBatch> =
		job.format === 'xlsx'
			? xlsxRecordBatches(job.open())
			: csvRecordBatches(job.open(), job.options);
	const rows: FileRow[] = [];
	let headers: string[] = [];
	let index = -1;
	let recordNumber = 0;
	for await (const batch of source)
		for (let i = 0; i < batch.length; i++) {
			const rowNumber = batch.rowNumbers ? batch.rowNumbers[i] : ++recordNumber;
			if (isBlank(batch[i])) continue;
			if (++index <= job.options.headerRowIndex) {
				if (index === job.options.headerRowIndex) headers = batch[i];
				continue;
			}
			if (rows.length >= MEASUREMENT_MAX_ROWS)
				throw new ImportError(
					'too-many-rows',
					`A file of measurements has at most ${MEASUREMENT_MAX_ROWS} rows; is this a readings file?`
				);
			rows.push({ rowNumber, cells: batch[i] });
		}
	return { rows, headers };
}

/** Rows whose label is taken on their member already (by a form or an earlier import). */
async function labelClashes(
	existingOn: (memberIds: number[]) => Promise<{ memberId: number; label: string }[]>,
	what: string,
	records: { rowNumber: number; memberId: number; label: string; cells: string[] }[]
): Promise<RowProblem[]> {
	if (records.length === 0) return [];
	const existing = await existingOn([...new Set(records.map((r) => r.memberId))]);
	const taken = new Set(existing.map((e) => `${e.memberId}|${labelKey(e.label)}`));
	return records
		.filter((r) => taken.has(`${r.memberId}|${labelKey(r.label)}`))
		.map((r) => ({
			rowNumber: r.rowNumber,
			cells: r.cells,
			reason: `${what} "${r.label}" is already recorded on this member`
		}));
}

function refuse(rejected: RejectedRows, rowsRead: number): ImportError {
	return new ImportError(
		'rows-rejected',
		`${rejected.count} of ${rowsRead} rows failed the checks, so nothing was imported (a file of measurements is imported whole or not at all). ${rejected.describe()} Download the rejected rows to see each reason.`
	);
}

/**
 * Imports a file of carbonation tests or chloride profiles: every row checked by the same
 * schemas as the forms, then all written in one transaction with the batch's end and its
 * audit events, or nothing. Each record names the batch, so undo removes exactly these.
 */
export async function runMeasurementImport(job: MeasurementImportJob): Promise<ImportOutcome> {
	const tally = { rowsRead: 0, rejected: new RejectedRows(), headers: [] as string[] };
	const sequelize = ImportBatch.sequelize!;
	try {
		const { rows, headers } = await readRows(job);
		tally.rowsRead = rows.length;
		tally.headers = headers;
		if (rows.length === 0)
			throw new ImportError(
				'header-only',
				'The file has a header row but no measurements under it.'
			);
		const index = await memberIndex(job.surveyId);
		const members = {
			memberId: (key: string) => index.get(key),
			fixedLabel: job.options.fixedMemberLabel
		};
		const wide = rows.flatMap((r) => {
			const extra = extraFields(job.format, headers, r.cells);
			return extra ? [{ ...r, reason: extra.reason }] : [];
		});
		for (const p of wide) tally.rejected.add(p.rowNumber, 'width.extra', p.reason, p.cells);
		if (wide.length) throw refuse(tally.rejected, rows.length);
		return await sequelize.transaction(async (transaction) => {
			const survey = await Survey.findByPk(job.surveyId, { transaction });
			await assertSurveyEditableLocked(survey!, transaction);
			const written =
				job.kind === 'carbonation'
					? await writeCarbonation(job, rows, members, tally.rejected, transaction)
					: await writeChloride(job, rows, members, tally.rejected, transaction);
			return finish(job, rows.length, written, transaction);
		});
	} catch (err) {
		return failImport(job, tally, err);
	}
}

function reject(rejected: RejectedRows, problems: RowProblem[], rowsRead: number) {
	for (const p of problems.sort((a, b) => a.rowNumber - b.rowNumber))
		rejected.add(p.rowNumber, 'measurement', p.reason, p.cells);
	if (rejected.count) throw refuse(rejected, rowsRead);
}

async function writeCarbonation(
	job: MeasurementImportJob & { kind: 'carbonation' },
	rows: FileRow[],
	members: Parameters<typeof carbonationRows>[3],
	rejected: RejectedRows,
	transaction: Transaction
) {
	const { tests, problems } = carbonationRows(rows, job.mapping, job.options.decimalMark, members);
	const cellsOf = new Map(rows.map((r) => [r.rowNumber, r.cells]));
	const labelled = tests.map((t) => ({
		rowNumber: t.rowNumber,
		memberId: t.memberId,
		label: t.input.label,
		cells: cellsOf.get(t.rowNumber) ?? []
	}));
	problems.push(
		...(await labelClashes(
			(memberId) =>
				CarbonationTest.findAll({
					attributes: ['memberId', 'label'],
					where: { memberId },
					transaction
				}),
			'Carbonation test',
			labelled
		))
	);
	reject(rejected, problems, rows.length);
	await CarbonationTest.bulkCreate(
		tests.map((t) => ({ ...t.input, memberId: t.memberId, importBatchId: job.batchId })),
		{ transaction }
	);
	return { records: tests.length, labels: tests.map((t) => t.input.label) };
}

async function writeChloride(
	job: MeasurementImportJob & { kind: 'chloride' },
	rows: FileRow[],
	members: Parameters<typeof chlorideRows>[3],
	rejected: RejectedRows,
	transaction: Transaction
) {
	const { profiles, problems } = chlorideRows(rows, job.mapping, job.options.decimalMark, members);
	const cellsOf = new Map(rows.map((r) => [r.rowNumber, r.cells]));
	const labelled = profiles.map((p) => ({
		rowNumber: p.rowNumbers[0],
		memberId: p.memberId,
		label: p.input.label,
		cells: cellsOf.get(p.rowNumbers[0]) ?? []
	}));
	problems.push(
		...(await labelClashes(
			(memberId) =>
				ChlorideProfile.findAll({
					attributes: ['memberId', 'label'],
					where: { memberId },
					transaction
				}),
			'Chloride profile',
			labelled
		))
	);
	reject(rejected, problems, rows.length);
	for (const p of profiles) {
		const { increments, ...fields } = p.input;
		const profile = await ChlorideProfile.create(
			{ ...fields, memberId: p.memberId, importBatchId: job.batchId },
			{ transaction }
		);
		await ChlorideIncrement.bulkCreate(incrementRows(profile.id, increments), { transaction });
	}
	return { records: profiles.length, labels: profiles.map((p) => p.input.label) };
}

async function finish(
	job: MeasurementImportJob,
	rowsRead: number,
	written: { records: number; labels: string[] },
	transaction: Transaction
): Promise<ImportOutcome> {
	const what: [string, string] =
		job.kind === 'carbonation'
			? ['carbonation test', 'carbonation tests']
			: ['chloride profile', 'chloride profiles'];
	const message = `${counted(written.records, ...what)} imported from ${counted(rowsRead, 'row')}.`;
	const [updated] = await ImportBatch.update(
		{
			state: 'completed',
			rowsTotal: rowsRead,
			rowsImported: rowsRead,
			rowsRejected: 0,
			warnings: [message],
			errorMessage: null,
			finishedAt: new Date()
		},
		{ where: { id: job.batchId, state: 'running' }, transaction }
	);
	if (updated !== 1)
		throw new ImportError(
			'not-running',
			'This import was stopped by another process while it ran, so nothing was written. Start it again from a new upload.'
		);
	await recordAudit(
		{
			action: 'import.completed',
			organisationId: job.organisationId,
			userId: job.userId,
			subjectType: 'import_batch',
			subjectId: job.batchId,
			detail: { kind: job.kind, records: written.records, labels: written.labels.slice(0, 200) }
		},
		transaction
	);
	return { state: 'completed', message, rowsImported: rowsRead, rowsRejected: 0, warnings: [] };
}
