import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import {
	assessPopulation,
	describeSorted,
	projectRequirement,
	toSortedCovers,
	toSortedValues
} from '../../../src/lib/analysis';
import { researchFilterSchema } from '../../../src/lib/server/research/filter';
import { groupStatisticsCsv } from '../../../src/lib/server/research/groupsCsv';
import { researchStatistics } from '../../../src/lib/server/research/statistics';
import { testSequelize } from '../../helpers/database';
import { identifyingTextsIn } from '../../helpers/research';

let sequelize: Sequelize;
const secret = () => process.env.RESEARCH_ID_SECRET!;

async function coversOf(memberType: string, exposureClass: string) {
	const rows = await sequelize.query<{ coverMm: number; cNomMm: number }>(
		`SELECT r.cover_mm AS coverMm, m.c_nom_mm AS cNomMm FROM readings r
		   JOIN members m ON m.id = r.member_id JOIN surveys s ON s.id = m.survey_id
		   JOIN assets a ON a.id = m.asset_id
		  WHERE a.research_opt_in = 1 AND s.status IN ('submitted', 'approved')
		    AND m.member_type = ? AND m.exposure_class = ?`,
		{ type: QueryTypes.SELECT, replacements: [memberType, exposureClass] }
	);
	return rows;
}

beforeAll(() => {
	sequelize = testSequelize();
});
afterAll(() => sequelize.close());

describe('research statistics (the engine on the selection)', () => {
	it("gives each group exactly the engine's figures for the same readings", async () => {
		const stats = await researchStatistics(sequelize, secret(), researchFilterSchema.parse({}), {
			groupBy: ['memberType', 'exposureClass']
		});
		const deck = stats.groups.find(
			(g) => g.key.memberType === 'deck' && g.key.exposureClass === 'XD3'
		);
		const rows = await coversOf('deck', 'XD3');
		expect(deck!.readingCount).toBe(rows.length);
		const expected = describeSorted(toSortedCovers(rows.map((r) => r.coverMm)));
		expect(deck!.cover!.description.meanMm).toBeCloseTo(expected.meanMm, 9);
		expect(deck!.cover!.description.sdMm).toBeCloseTo(expected.sdMm, 9);
		const deviations = describeSorted(toSortedValues(rows.map((r) => r.coverMm - r.cNomMm)));
		expect(deck!.deviationFromNominal!.description.meanMm).toBeCloseTo(deviations.meanMm, 9);
		// The same P5 the population pages get from assessPopulation on these covers.
		const assessed = assessPopulation(
			rows.map((r) => r.coverMm),
			projectRequirement(50, 10, {})
		);
		expect(deck!.cover!.percentiles[0].valueMm).toBeCloseTo(assessed.percentiles[0].valueMm, 9);
		expect(deck!.deviationFromNominal!.models.lognormal).toBeNull();
	});

	it('adds the groups up to the selection and carries charts only when asked', async () => {
		const stats = await researchStatistics(sequelize, secret(), researchFilterSchema.parse({}), {
			groupBy: ['face'],
			charts: true
		});
		const sum = stats.groups.reduce((n, g) => n + g.readingCount, 0);
		expect(sum).toBe(stats.selection.readingCount);
		expect(stats.selection.assetCount).toBe(2);
		expect(stats.selection.cover!.charts!.histogram.length).toBeGreaterThan(4);
		expect(stats.selection.deviationFromNominal!.charts!.curves[0].coverMm).toBeLessThan(0);
		expect(stats.groups.every((g) => g.cover?.charts === null)).toBe(true);
	});

	it('lays the groups out as CSV with no identifying text', async () => {
		const stats = await researchStatistics(sequelize, secret(), researchFilterSchema.parse({}), {
			groupBy: ['memberType', 'exposureClass']
		});
		const csv = groupStatisticsCsv(stats);
		const lines = csv.trimEnd().split('\r\n');
		expect(lines.length).toBe(2 + stats.groups.length);
		expect(lines[1].startsWith('selection,')).toBe(true);
		expect(identifyingTextsIn(csv)).toEqual([]);
	});

	it('answers an empty selection with counts of zero and no figures', async () => {
		const stats = await researchStatistics(
			sequelize,
			secret(),
			researchFilterSchema.parse({ exposureClass: ['XA3'] }),
			{ groupBy: ['memberType'] }
		);
		expect(stats.selection.readingCount).toBe(0);
		expect(stats.selection.cover).toBeNull();
		expect(stats.groups).toEqual([]);
	});
});
