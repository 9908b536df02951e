import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { assessPopulation } from '../../src/lib/analysis';
import type { PopulationOverview } from '../../src/lib/server/populations';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName, coversBySql, unsharedAsset } from '../helpers/actors';
import { anonymousClient, signInAs, type HttpClient } from '../helpers/session';

const JSON_ACCEPT = { accept: 'application/json' };

describe('the population API over HTTP', () => {
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

	it('gives, for each group, exactly the engine’s figures on the same readings', async () => {
		const response = await engineer.get(
			`/api/v1/assets/${carParkId}/populations?fractile=0.1&method=tolerance`,
			JSON_ACCEPT
		);
		expect(response.status).toBe(200);
		const overview = (await response.json()) as PopulationOverview;
		expect(overview.populations.length).toBe(3);
		for (const p of overview.populations) {
			const covers = await coversBySql(sequelize, carParkId, p.key.memberType, p.key.exposureClass);
			const engine = assessPopulation(covers, p.requirement.requirement, {
				fractileP: 0.1,
				characteristicMethod: 'tolerance',
				confidence: 0.95,
				percentileType: 7,
				model: 'best-fit',
				charts: false
			});
			expect(p.assessment).toEqual(JSON.parse(JSON.stringify(engine)));
		}
	});

	it('refuses a bad method choice with the field named', async () => {
		const response = await engineer.get(
			`/api/v1/assets/${carParkId}/populations?confidence=2`,
			JSON_ACCEPT
		);
		expect(response.status).toBe(400);
		const body = await response.json();
		expect(body.error).toMatchObject({ code: 'invalid_input', field: 'confidence' });
	});

	it('answers 401 signed out, 404 for another organisation’s asset, 403 for a surveyor approving', async () => {
		expect(
			(await anonymousClient().get(`/api/v1/assets/${carParkId}/populations`, JSON_ACCEPT)).status
		).toBe(401);
		const owner = await signInAs('owner');
		const unsharedId = await unsharedAsset(sequelize, `populations-api${Date.now()}`);
		// Owners read approved assessments of shared assets, not live populations.
		expect((await owner.get(`/api/v1/assets/${carParkId}/populations`, JSON_ACCEPT)).status).toBe(
			403
		);
		expect((await owner.get(`/api/v1/assets/${unsharedId}/assessments`, JSON_ACCEPT)).status).toBe(
			404
		);
		const saved = await engineer.postJson(`/api/v1/assets/${carParkId}/assessments`, {
			title: 'API draft'
		});
		expect(saved.status).toBe(201);
		const { assessment } = await saved.json();
		const surveyor = await signInAs('surveyor');
		const refused = await surveyor.postJson(`/api/v1/assessments/${assessment.id}/approve`, {});
		expect(refused.status).toBe(403);
		expect((await refused.json()).error.code).toBe('forbidden');
		const approved = await engineer.postJson(`/api/v1/assessments/${assessment.id}/approve`, {});
		expect(approved.status).toBe(200);
		expect((await approved.json()).assessment.state).toBe('approved');
	});

	it('serves a member’s cover map with its readings and the meter’s check', async () => {
		const [member] = await sequelize.query<{ id: number }>(
			"SELECT id FROM members WHERE label = 'L2-BAY-04'",
			{ type: QueryTypes.SELECT }
		);
		const response = await engineer.get(`/api/v1/members/${member.id}/cover-map`, JSON_ACCEPT);
		expect(response.status).toBe(200);
		const view = await response.json();
		expect(view.readings.length).toBeGreaterThan(500);
		expect(view.surveyMeter.verification.n).toBeGreaterThanOrEqual(3);
	});
});
