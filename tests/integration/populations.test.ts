import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { assessPopulation, enRequirement } from '../../src/lib/analysis';
import { db, closeDb } from '../../src/lib/server/db';
import { COVER_COUNTS_SQL } from '../../src/lib/server/readings/coverSets';
import {
	methodSchema,
	populationDetail,
	populationOverview,
	toAssessOptions
} from '../../src/lib/server/populations';
import { visibleAsset } from '../../src/lib/server/access';
import { loadOr404 } from '../../src/lib/server/web/pages';
import {
	CAR_PARK,
	ENGINEER,
	OWNER,
	assetIdByName,
	coversBySql,
	demoActor,
	unsharedAsset
} from '../helpers/actors';

describe('the population service on the demo data', () => {
	let sequelize: Sequelize;
	let carParkId: number;
	const choice = methodSchema.parse({});
	beforeAll(async () => {
		sequelize = db();
		carParkId = await assetIdByName(sequelize, CAR_PARK);
	});
	afterAll(async () => {
		await closeDb();
	});

	it('groups by member type × exposure class and gives exactly the engine’s figures', async () => {
		const overview = await populationOverview({ assetId: carParkId, split: 'none', choice });
		expect(overview.populations.map((p) => p.id)).toEqual(['column|XD3', 'deck|XD3', 'slab|XC3']);
		for (const population of overview.populations) {
			const { memberType, exposureClass } = population.key;
			const covers = await coversBySql(sequelize, carParkId, memberType, exposureClass);
			const expected = assessPopulation(
				covers,
				population.requirement.requirement,
				toAssessOptions(choice)
			);
			expect(population.assessment).toEqual(expected);
		}
	});

	it('takes the requirement from the members’ specified values (EN 1992-1-1, XD3, S4)', async () => {
		const overview = await populationOverview({ assetId: carParkId, split: 'none', choice });
		const deck = overview.populations.find((p) => p.id === 'deck|XD3')!;
		const en = enRequirement({ exposureClass: 'XD3', structuralClass: 'S4', barDiameterMm: 16 });
		expect(deck.requirement.requirement.cMinMm).toBe(en.cMinMm);
		expect(deck.requirement.requirement.cNomMm).toBe(en.cNomMm);
		expect(deck.requirement.mixed).toBe(false);
		expect(deck.members).toHaveLength(16);
	});

	it('splits by survey, and a detail of one split group equals its overview row', async () => {
		const tight = methodSchema.parse({ fractile: '0.1', method: 'tolerance' });
		const overview = await populationOverview({
			assetId: carParkId,
			split: 'survey',
			choice: tight
		});
		const decks = overview.populations.filter((p) => p.key.memberType === 'deck');
		expect(decks).toHaveLength(2);
		const roof = decks[1];
		const detail = await populationDetail(
			{ assetId: carParkId, surveyId: roof.key.surveyId, choice: tight },
			{ type: 'deck', exposure: 'XD3' }
		);
		expect(detail!.result.id).toBe(roof.id);
		const { charts, options, ...figures } = detail!.result.assessment!;
		expect(charts!.histogram.length).toBeGreaterThan(4);
		const { charts: none, options: overviewOptions, ...overviewFigures } = roof.assessment!;
		expect(none).toBeNull();
		expect(figures).toEqual(overviewFigures);
		expect({ ...options, charts: false }).toEqual(overviewOptions);
		expect(roof.assessment!.options.fractileP).toBe(0.1);
	});

	it('reads the covers as one summary row a member, by primary key, without a filesort', async () => {
		const ids = await sequelize.query<{ id: number }>('SELECT id FROM members WHERE asset_id = ?', {
			replacements: [carParkId],
			type: QueryTypes.SELECT
		});
		const plan = await sequelize.query<{ key: string; Extra: string; rows: number }>(
			`EXPLAIN ${COVER_COUNTS_SQL}`,
			{ replacements: { part: ids.map((r) => r.id) }, type: QueryTypes.SELECT }
		);
		expect(plan[0].key).toBe('PRIMARY');
		expect(Number(plan[0].rows)).toBeLessThanOrEqual(ids.length);
		expect(plan[0].Extra ?? '').not.toContain('filesort');
	});

	it('answers 404 for an asset that is neither owned nor shared, and read-only when shared', async () => {
		const owner = await demoActor(sequelize, OWNER);
		const engineer = await demoActor(sequelize, ENGINEER);
		expect((await visibleAsset(owner, carParkId)).access).toBe('shared');
		expect((await visibleAsset(engineer, carParkId)).access).toBe('own');
		const unsharedId = await unsharedAsset(sequelize, `populations${Date.now()}`);
		// The rule throws a domain error; the route layer answers it with 404.
		await expect(loadOr404(() => visibleAsset(owner, unsharedId))).rejects.toMatchObject({
			status: 404
		});
	});
});
