import { ENGINE_VERSION } from '$lib/analysis';
import { ResearchExport } from '../db/models';
import { NotFoundError } from '../domainErrors';
import type { ResearchFilter } from './filter';

/**
 * The citable record of an export: its filter, format, row count, engine version and time.
 * The row is written before the first byte leaves and its count when the last one has, so an
 * export that was cut off shows `rowCount: null` (not completed) rather than a wrong number.
 */
export const EXPORT_FORMATS = ['readings-csv', 'readings-jsonl', 'groups-csv'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

export interface ExportActor {
	userId: number | null;
	organisationId: number;
}

export async function openExportRecord(
	actor: ExportActor,
	filter: ResearchFilter & { groupBy?: string[] },
	format: ExportFormat
): Promise<ResearchExport> {
	return ResearchExport.create({
		userId: actor.userId,
		organisationId: actor.organisationId,
		filter,
		format,
		rowCount: null,
		engineVersion: ENGINE_VERSION
	});
}

export async function closeExportRecord(record: ResearchExport, rowCount: number): Promise<void> {
	await ResearchExport.update({ rowCount }, { where: { id: record.id } });
}

export interface ExportSummary {
	id: number;
	format: ExportFormat;
	filter: unknown;
	rowCount: number | null;
	engineVersion: string;
	createdAt: string;
}

export function summariseExport(record: ResearchExport): ExportSummary {
	return {
		id: record.id,
		format: record.format as ExportFormat,
		filter: record.filter,
		rowCount: record.rowCount == null ? null : Number(record.rowCount),
		engineVersion: record.engineVersion,
		createdAt: new Date(record.createdAt).toISOString()
	};
}

/** The exports of the organisation, newest first (the last 200). */
export async function exportsOf(organisationId: number): Promise<ExportSummary[]> {
	const rows = await ResearchExport.findAll({
		where: { organisationId },
		order: [['id', 'DESC']],
		limit: 200
	});
	return rows.map(summariseExport);
}

/** One export of the organisation; NotFoundError for any other (ids reveal nothing). */
export async function exportOf(organisationId: number, id: number): Promise<ExportSummary> {
	const record = await ResearchExport.findOne({ where: { id, organisationId } });
	if (!record) throw new NotFoundError('The export', 'No such export in your organisation.');
	return summariseExport(record);
}
