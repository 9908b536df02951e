import { z } from 'zod';
import { ENGINE_VERSION } from '$lib/analysis';
import { GROUP_STAT_COLUMNS } from './groupsCsv';
import { researchFilterSchema } from './filter';
import { READING_COLUMNS, researchMemberSchema, researchReadingSchema } from './schemas';

/**
 * The data dictionary that goes with every export: JSON Schema (draft 2020-12) generated from
 * the same zod schemas that shape the rows, so the dictionary cannot drift from the data.
 */
export function dataDictionary() {
	return {
		$schema: 'https://json-schema.org/draft/2020-12/schema',
		title: 'Fractile research export: data dictionary',
		engineVersion: ENGINE_VERSION,
		readingColumns: READING_COLUMNS,
		groupStatisticsColumns: GROUP_STAT_COLUMNS,
		$defs: {
			ResearchReading: z.toJSONSchema(researchReadingSchema),
			ResearchMember: z.toJSONSchema(researchMemberSchema),
			ResearchFilter: z.toJSONSchema(researchFilterSchema, { io: 'input' })
		}
	};
}

/** The README that goes with every export: what the rows are and how to cite them. */
export function exportReadme(exportId: number | null, citationDate: string | null): string {
	const cite =
		exportId === null
			? 'Cite an export by its id, e.g. "Fractile research export 12 (engine 1.0.0, 2026-01-31)".'
			: `Cite this export as "Fractile research export ${exportId} (engine ${ENGINE_VERSION}, ${citationDate})".`;
	return `# Fractile research export

Cover-meter readings from structures whose owners opted in to anonymised research use.

- One row per reading. Columns: ${READING_COLUMNS.join(', ')}.
- Lengths are in millimetres. deviationMm = coverMm − cNomMm (negative: less cover than specified).
- assetRef and memberRef are pseudonyms: a keyed hash of the record's id with a secret kept by
  the server. They are the same in every export, so readings can be joined across exports, but
  they cannot be turned back into the structure.
- xMm and yMm are positions on the member's own grid, from the member's own origin.
- constructionDecade is the first year of the decade (1990 = built 1990–1999).
- Not included, on purpose: names, locations, organisations, people, survey dates, labels and notes.
- Only readings of submitted or approved surveys are included; consent is checked at export time.
- The group statistics (groups CSV) are computed by the Fractile analysis engine ${ENGINE_VERSION};
  percentiles are Hyndman–Fan type 7; characteristic values follow EN 1990 Annex D (prediction).

The JSON Schema of each column is in the data dictionary (dictionary.json / the manifest).

${cite}
`;
}
