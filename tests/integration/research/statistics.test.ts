import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import {
	assessPopulation,
	describeSorted,
	projectRequirement,
	toSortedCovers,
	toSortedValues
} from '../../../src/lib/analysis';
import { populationFigures } from '../../../src/lib/server/research/population';
import { researchFilterSchema } from '../../../src/lib/server/research/filter';
import { groupStatisticsCsv } from '../../../src/lib/server/research/groupsCsv';
import { researchStatistics } from '../../../src/lib/server/research/statistics';
import { testSequelize } from '../../helpers/database';
import { identifyingTextsIn } from '../../helpers/research';

let sequelize: Sequelize;

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
		const stats = await researchStatistics(sequelize, researchFilterSchema.parse({}), {
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
		const stats = await researchStatistics(sequelize, researchFilterSchema.parse({}), {
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

	it("draws the selection's charts from counts exactly as from its readings", async () => {
		// Source: the raw path — populationFigures on every selected reading, sorted (the engine's
		// sorted-array chart functions). Bins, ECDF and probability-plot points to the bit; the
		// fitted curves to 1e-9 mm⁻¹ (the fit's sums run on whole grid steps from counts, on doubles raw).
		const stats = await researchStatistics(sequelize, researchFilterSchema.parse({}), {
			groupBy: ['memberType'],
			charts: true
		});
		const rows = await sequelize.query<{ coverMm: number; cNomMm: number }>(
			`SELECT r.cover_mm AS coverMm, m.c_nom_mm AS cNomMm FROM readings r
			   JOIN members m ON m.id = r.member_id JOIN surveys s ON s.id = m.survey_id
			   JOIN assets a ON a.id = m.asset_id
			  WHERE a.research_opt_in = 1 AND s.status IN ('submitted', 'approved')`,
			{ type: QueryTypes.SELECT }
		);
		expect(stats.selection.readingCount).toBe(rows.length);
		const pairs = [
			[stats.selection.cover, rows.map((r) => r.coverMm)],
			[stats.selection.deviationFromNominal, rows.map((r) => r.coverMm - r.cNomMm)]
		] as const;
		for (const [counted, values] of pairs) {
			const raw = populationFigures(values, { charts: true })!;
			expect(counted!.charts!.histogram).toEqual(raw.charts!.histogram);
			expect(counted!.charts!.ecdf).toEqual(raw.charts!.ecdf);
			expect(counted!.charts!.probabilityPlot).toEqual(raw.charts!.probabilityPlot);
			expect(counted!.charts!.curves.length).toBe(raw.charts!.curves.length);
			counted!.charts!.curves.forEach((point, i) => {
				expect(point.model).toBe(raw.charts!.curves[i].model);
				expect(point.coverMm).toBeCloseTo(raw.charts!.curves[i].coverMm, 9);
				expect(point.pdf).toBeCloseTo(raw.charts!.curves[i].pdf, 9);
				expect(point.cdf).toBeCloseTo(raw.charts!.curves[i].cdf, 9);
			});
		}
	});

	it('counts the members and assets of each group as the database does', async () => {
		// Source: COUNT(DISTINCT …) over the same selection in SQL.
		const stats = await researchStatistics(sequelize, researchFilterSchema.parse({}), {
			groupBy: ['memberType']
		});
		const expected = await sequelize.query<{ memberType: string; members: number; assets: number }>(
			`SELECT m.member_type AS memberType, COUNT(DISTINCT m.id) AS members, COUNT(DISTINCT m.asset_id) AS assets
			   FROM members m JOIN surveys s ON s.id = m.survey_id JOIN assets a ON a.id = m.asset_id
			  WHERE a.research_opt_in = 1 AND s.status IN ('submitted', 'approved')
			    AND EXISTS (SELECT 1 FROM readings r WHERE r.member_id = m.id)
			  GROUP BY m.member_type`,
			{ type: QueryTypes.SELECT }
		);
		expect(stats.groups.length).toBe(expected.length);
		for (const row of expected) {
			const group = stats.groups.find((g) => g.key.memberType === row.memberType)!;
			expect(group.memberCount).toBe(Number(row.members));
			expect(group.assetCount).toBe(Number(row.assets));
		}
	});

	it('lays the groups out as CSV with no identifying text', async () => {
		const stats = await researchStatistics(sequelize, researchFilterSchema.parse({}), {
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
			researchFilterSchema.parse({ exposureClass: ['XA3'] }),
			{ groupBy: ['memberType'] }
		);
		expect(stats.selection.readingCount).toBe(0);
		expect(stats.selection.cover).toBeNull();
		expect(stats.groups).toEqual([]);
	});
});
