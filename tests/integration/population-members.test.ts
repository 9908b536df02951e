import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { percentileSorted, toSortedCovers } from '../../src/lib/analysis';
import type { MemberBox, PopulationResult } from '../../src/lib/server/populations';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName } from '../helpers/actors';
import { anonymousClient, signInAs, type HttpClient } from '../helpers/session';

const JSON_ACCEPT = { accept: 'application/json' };

/** One member's covers straight from the readings table (not the cover sets the service reads). */
async function memberReadings(sequelize: Sequelize, memberId: number): Promise<Float64Array> {
	const rows = await sequelize.query<{ c: number }>(
		'SELECT cover_mm AS c FROM readings WHERE member_id = ?',
		{ replacements: [memberId], type: QueryTypes.SELECT }
	);
	return toSortedCovers(rows.map((r) => Number(r.c)));
}

describe('per-member figures of a population come from each member’s own readings', () => {
	let sequelize: Sequelize;
	let carParkId: number;
	let engineer: HttpClient;
	beforeAll(async () => {
		sequelize = testSequelize();
		carParkId = await assetIdByName(sequelize, CAR_PARK);
		await anonymousClient().get('/api/health');
		engineer = await signInAs('engineer');
	});
	afterAll(async () => {
		await sequelize.close();
	});

	async function detail(query: string) {
		const response = await engineer.get(
			`/api/v1/assets/${carParkId}/populations/detail?${query}`,
			JSON_ACCEPT
		);
		expect(response.status).toBe(200);
		return (await response.json()) as { population: PopulationResult; boxes: MemberBox[] };
	}

	it.each([
		['type=deck&exposure=XD3', 7],
		['type=deck&exposure=XD3&percentile=6', 6],
		['type=column&exposure=XD3', 7]
	] as const)(
		'every box of %s equals its member’s least, quartiles, median, greatest and mean',
		async (query, type) => {
			const { population, boxes } = await detail(query);
			expect(boxes.length).toBe(population.members.filter((m) => m.readings > 0).length);
			for (const box of boxes) {
				const own = await memberReadings(sequelize, box.memberId);
				// Hyndman & Fan (1996) quartiles of the member's own readings, same type as asked.
				expect(box.n).toBe(own.length);
				expect(box.minMm).toBe(own[0]);
				expect(box.maxMm).toBe(own[own.length - 1]);
				expect(box.q1Mm).toBeCloseTo(percentileSorted(own, 0.25, type), 9);
				expect(box.medianMm).toBeCloseTo(percentileSorted(own, 0.5, type), 9);
				expect(box.q3Mm).toBeCloseTo(percentileSorted(own, 0.75, type), 9);
				const mean = own.reduce((s, c) => s + c, 0) / own.length;
				expect(box.meanMm!).toBeCloseTo(mean, 9);
			}
			for (const member of population.members) {
				expect(member.readings).toBe((await memberReadings(sequelize, member.id)).length);
			}
		}
	);
});
