import type { Actor } from '../policy';
import { researchContext } from './context';
import { openExportRecord, closeExportRecord } from './exportRecord';
import { startReadingsExport, type ReadingsFormat } from './exportStream';
import type { GroupKey, ResearchFilter } from './filter';
import { groupStatisticsCsv } from './groupsCsv';
import { researchStatistics } from './statistics';

/** HTTP answers of the export routes: the data, and where its manifest is. */
const MEDIA: Record<ReadingsFormat | 'groups-csv', [string, string]> = {
	'readings-csv': ['text/csv; charset=utf-8', 'readings.csv'],
	'readings-jsonl': ['application/x-ndjson; charset=utf-8', 'readings.jsonl'],
	'groups-csv': ['text/csv; charset=utf-8', 'groups.csv']
};

function headers(format: keyof typeof MEDIA, exportId: number): HeadersInit {
	const [type, name] = MEDIA[format];
	return {
		'content-type': type,
		'content-disposition': `attachment; filename="fractile-research-${exportId}-${name}"`,
		'x-research-export-id': String(exportId),
		link: `</api/v1/research/exports/${exportId}>; rel="describedby"`,
		'cache-control': 'no-store'
	};
}

export async function readingsExportResponse(
	actor: Actor,
	filter: ResearchFilter,
	format: ReadingsFormat
): Promise<Response> {
	const { sequelize, idSecret } = researchContext();
	const started = await startReadingsExport(sequelize, idSecret, actor, filter, format);
	return new Response(started.stream, { headers: headers(format, started.exportId) });
}

export async function groupsExportResponse(
	actor: Actor,
	filter: ResearchFilter,
	groupBy: GroupKey[]
): Promise<Response> {
	const { sequelize } = researchContext();
	const record = await openExportRecord(actor, { ...filter, groupBy }, 'groups-csv');
	const stats = await researchStatistics(sequelize, filter, { groupBy });
	const csv = groupStatisticsCsv(stats);
	await closeExportRecord(record, 1 + stats.groups.length);
	return new Response(csv, { headers: headers('groups-csv', record.id) });
}
