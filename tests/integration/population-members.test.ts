import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	compareMembers,
	lowComponentShare,
	percentileSorted,
	poolSorted,
	toSortedCovers,
	type MemberComparison
} from '../../src/lib/analysis';
import type {
	MemberBox,
	PopulationMixture,
	PopulationResult
} from '../../src/lib/server/populations';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName } from '../helpers/actors';
import { anonymousClient, signInAs, type HttpClient } from '../helpers/session';

const JSON_ACCEPT = { accept: 'application/json' };

/** One member's covers straight from the readings table (not the cover counts the service reads). */
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
		return (await response.json()) as {
			population: PopulationResult;
			boxes: MemberBox[];
			members: MemberComparison | null;
			mixture: PopulationMixture | null;
		};
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

	it('the member comparison is made from each member’s own readings and names who stands apart', async () => {
		const { population, members } = await detail('type=deck&exposure=XD3');
		const own = await Promise.all(
			population.members.map(async (m) => ({
				label: m.label,
				coversMm: await memberReadings(sequelize, m.id)
			}))
		);
		const expected = compareMembers(own, poolSorted(own.map((m) => m.coversMm)))!;
		expect(members).toEqual(JSON.parse(JSON.stringify(expected)));
		for (const d of members!.differences) {
			const covers = own.find((m) => m.label === d.label)!.coversMm;
			expect(d.n).toBe(covers.length);
			expect(d.medianMm).toBeCloseTo(percentileSorted(covers, 0.5, 7), 9);
		}
		expect(members!.sentences.length).toBeGreaterThan(0);
	});

	it('when neither model fits, each member’s share of the mixture’s low component is from its own readings', async () => {
		const { population, mixture } = await detail('type=deck&exposure=XD3');
		expect(population.assessment!.models.normal.rejected).toBe(true);
		expect(mixture).not.toBeNull();
		expect(mixture!.members).toHaveLength(population.members.length);
		for (const member of population.members) {
			const own = await memberReadings(sequelize, member.id);
			const shown = mixture!.members.find((m) => m.label === member.label)!;
			expect(shown.lowShare).toBeCloseTo(lowComponentShare(mixture!.mixture, own), 12);
		}
		expect(mixture!.sentence).toMatch(/EM, seed 1/);
	});

	it('a meter verification whose holes all read the same on the meter gives the bias alone, not NaN', async () => {
		// differences 1.5, 2.0, 0.5, 3.0, 2.5 mm: bias 1.9 mm, s = 0.96177 mm,
		// U = t(0.975; 4)·s·√1.2 = 2.92517 mm (scipy 1.17.1 t.ppf, numpy std ddof=1).
		const [column] = await sequelize.query<{ id: number }>(
			"SELECT id FROM members WHERE asset_id = ? AND member_type = 'column' AND exposure_class = 'XD3' ORDER BY id LIMIT 1",
			{ replacements: [carParkId], type: QueryTypes.SELECT }
		);
		const measured = [41.5, 42, 40.5, 43, 42.5];
		for (const [i, m] of measured.entries()) {
			await sequelize.query(
				`INSERT INTO verification_holes (member_id, label, meter_reading_mm, measured_cover_mm, created_at)
				 VALUES (?, ?, 40, ?, NOW())`,
				{ replacements: [column.id, `equal-meter-${i}`, m] }
			);
		}
		try {
			const response = await engineer.get(
				`/api/v1/assets/${carParkId}/populations/detail?type=column&exposure=XD3`,
				JSON_ACCEPT
			);
			expect(response.status).toBe(200);
			const body = await response.json();
			const v = body.meter.verification;
			expect(v.slopeFixed).toBe(true);
			expect(v.slope).toBe(1);
			expect(v.biasMm).toBeCloseTo(1.9, 9);
			expect(v.uncertaintyMm).toBeCloseTo(2.925166429216675, 6);
		} finally {
			await sequelize.query("DELETE FROM verification_holes WHERE label LIKE 'equal-meter-%'");
		}
	});
});
