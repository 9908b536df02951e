import type { Sequelize } from 'sequelize';
import type { ResearchFilter } from './filter';
import { csvLine } from '$lib/csv';
import { closeExportRecord, openExportRecord, type ExportActor } from './exportRecord';
import { selectedMembers } from './members';
import { pseudonymMaker } from './pseudonym';
import { readingBatches } from './readings';
import { READING_COLUMNS, type ResearchReading } from './schemas';

/**
 * A readings export as a byte stream: one keyset batch of rows is read from MariaDB each time
 * the consumer asks for more (ReadableStream's pull), so memory holds one batch however many
 * rows there are, and a slow client slows the reading rather than filling the heap.
 */
export type ReadingsFormat = 'readings-csv' | 'readings-jsonl';

const encoder = new TextEncoder();

function encodeBatch(rows: readonly ResearchReading[], format: ReadingsFormat): Uint8Array {
	let text = '';
	if (format === 'readings-csv') {
		for (const row of rows) text += csvLine(READING_COLUMNS.map((c) => row[c]));
	} else {
		for (const row of rows) text += JSON.stringify(row) + '\n';
	}
	return encoder.encode(text);
}

export interface StartedExport {
	exportId: number;
	stream: ReadableStream<Uint8Array>;
}

export async function startReadingsExport(
	sequelize: Sequelize,
	idSecret: string,
	actor: ExportActor,
	filter: ResearchFilter,
	format: ReadingsFormat
): Promise<StartedExport> {
	const record = await openExportRecord(actor, filter, format);
	const members = await selectedMembers(sequelize, filter, pseudonymMaker(idSecret));
	const batches = readingBatches(sequelize, members);
	let rowCount = 0;
	let headerSent = format !== 'readings-csv';
	const stream = new ReadableStream<Uint8Array>(
		{
			async pull(controller) {
				if (!headerSent) {
					headerSent = true;
					controller.enqueue(encoder.encode(csvLine(READING_COLUMNS)));
					return;
				}
				const next = await batches.next();
				if (next.done) {
					await closeExportRecord(record, rowCount);
					controller.close();
					return;
				}
				rowCount += next.value.length;
				controller.enqueue(encodeBatch(next.value, format));
			},
			async cancel() {
				await batches.return(undefined);
			}
		},
		{ highWaterMark: 1 }
	);
	return { exportId: record.id, stream };
}
