import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { assessCalibrated, fitCalibration } from '../../src/lib/analysis';
import type { CalibrationOutcome, PopulationResult } from '../../src/lib/server/populations';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName, coversBySql } from '../helpers/actors';
import { anonymousClient, signInAs, type HttpClient } from '../helpers/session';

const JSON_ACCEPT = { accept: 'application/json' };

describe('the check-hole calibration chosen over the population detail API', () => {
	let sequelize: Sequelize;
	let carParkId: number;
	let engineer: HttpClient;
	let every: string;
	beforeAll(async () => {
		sequelize = testSequelize();
		carParkId = await assetIdByName(sequelize, CAR_PARK);
		await anonymousClient().get('/api/health');
		engineer = await signInAs('engineer');
		const surveys = await sequelize.query<{ id: number }>(
			'SELECT id FROM surveys WHERE asset_id = ? ORDER BY id',
			{ replacements: [carParkId], type: QueryTypes.SELECT }
		);
		every = surveys.map((s) => s.id).join(',');
	});
	afterAll(async () => {
		await sequelize.close();
	});

	async function detail(query: string) {
		const response = await engineer.get(
			`/api/v1/assets/${carParkId}/populations/detail?surveys=${every}&${query}`,
			JSON_ACCEPT
		);
		return {
			status: response.status,
			body: (await response.json()) as {
				population: PopulationResult;
				calibration: CalibrationOutcome | null;
				error?: { code: string; field?: string; message: string };
			}
		};
	}

	/** The holes of the group's members straight from SQL, not through the service. */
	const holesBySql = (memberType: string, exposureClass: string) =>
		sequelize.query<{ r: number; m: number }>(
			`SELECT h.meter_reading_mm AS r, h.measured_cover_mm AS m FROM verification_holes h
			   JOIN members m ON m.id = h.member_id
			  WHERE m.asset_id = ? AND m.member_type = ? AND m.exposure_class = ? ORDER BY h.id`,
			{ replacements: [carParkId, memberType, exposureClass], type: QueryTypes.SELECT }
		);

	it('calibration=apply gives the engine’s calibrated assessment of the same readings and holes, and says whether the outcome changes', async () => {
		const { status, body } = await detail('type=deck&exposure=XD3&calibration=apply');
		expect(status).toBe(200);
		const outcome = body.calibration!;
		expect(outcome.problem).toBeNull();
		const holes = await holesBySql('deck', 'XD3');
		expect(holes.length).toBeGreaterThanOrEqual(3);
		const covers = await coversBySql(sequelize, carParkId, 'deck', 'XD3');
		const calibration = fitCalibration(
			holes.map((h) => h.r),
			holes.map((h) => h.m)
		);
		// The engine on readings and holes read by SQL here (the service reads cover counts).
		const engine = assessCalibrated(covers, calibration, body.population.requirement.requirement, {
			fractileP: 0.05,
			confidence: 0.95,
			percentileType: 7,
			model: 'best-fit',
			characteristicMethod: 'prediction',
			charts: true
		});
		expect(outcome.calibrated!.calibration).toEqual(JSON.parse(JSON.stringify(calibration)));
		expect(outcome.calibrated!.spread.slope).toBeCloseTo(engine.spread.slope, 12);
		expect(outcome.calibrated!.assessment.characteristic.chosenMm).toBeCloseTo(
			engine.assessment.characteristic.chosenMm,
			9
		);
		expect(outcome.calibrated!.assessment.verdict).toBe(engine.assessment.verdict);
		expect(outcome.calibrated!.predictiveShareBelowCMin).toBeCloseTo(
			engine.predictiveShareBelowCMin,
			12
		);
		expect(outcome.asRead).toBe(body.population.assessment!.verdict);
		const same = outcome.asRead === outcome.calibrated!.assessment.verdict;
		expect(outcome.sentence).toMatch(
			same
				? /^Applying the check-hole calibration does not change the outcome/
				: /^Applying the check-hole calibration changes the outcome from/
		);
		expect(outcome.method).toMatch(/s·√\(1 \+ 1\/n \+ \(r − r̄\)²\/Sxx\)/);
	});

	it('leaves the calibration out unless asked, and refuses an unknown choice naming the field', async () => {
		const plain = await detail('type=deck&exposure=XD3');
		expect(plain.status).toBe(200);
		expect(plain.body.calibration).toBeNull();
		const bad = await detail('type=deck&exposure=XD3&calibration=yes');
		expect(bad.status).toBe(400);
		expect(bad.body.error?.field).toBe('calibration');
		expect(bad.body.error?.message).toBe('calibration: The calibration is none or apply.');
	});

	it('a population without check holes says in words why nothing was applied', async () => {
		const holes = await holesBySql('column', 'XD3');
		const { status, body } = await detail('type=column&exposure=XD3&calibration=apply');
		expect(status).toBe(200);
		expect(body.calibration!.calibrated).toBeNull();
		// The demo drills no check holes in the columns.
		expect(holes.length).toBe(0);
		expect(body.calibration!.problem).toBe(
			'The calibration needs at least 3 check holes; there are 0.'
		);
		expect(body.calibration!.sentence).toMatch(/^The check-hole calibration was not applied\./);
	});
});
