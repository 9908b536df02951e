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

	const surveysOf = (assetId: number) =>
		sequelize.query<{ id: number; status: string }>(
			'SELECT id, status FROM surveys WHERE asset_id = ? ORDER BY id',
			{ replacements: [assetId], type: QueryTypes.SELECT }
		);

	it('gives, for each group, exactly the engine’s figures on the same readings', async () => {
		const every = (await surveysOf(carParkId)).map((s) => s.id).join(',');
		const response = await engineer.get(
			`/api/v1/assets/${carParkId}/populations?fractile=0.1&method=tolerance&surveys=${every}`,
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

	it('counts only approved surveys unless others are chosen, and says which it used', async () => {
		const surveys = await surveysOf(carParkId);
		const approved = surveys.filter((s) => s.status === 'approved').map((s) => s.id);
		const others = surveys.filter((s) => s.status !== 'approved').map((s) => s.id);
		expect(approved.length).toBeGreaterThan(0);
		expect(others.length).toBeGreaterThan(0);
		const readingsOf = async (ids: number[]) =>
			(await sequelize.query<{ n: number }>(
				`SELECT COUNT(*) AS n FROM readings r JOIN members m ON m.id = r.member_id
					  WHERE m.survey_id IN (${ids.map(() => '?').join(',')})`,
				{ replacements: ids, type: QueryTypes.SELECT, plain: true }
			))!.n;
		const total = (o: PopulationOverview) =>
			o.populations.reduce((sum, p) => sum + (p.assessment?.description.n ?? 0), 0);
		const byDefault = await (
			await engineer.get(`/api/v1/assets/${carParkId}/populations`, JSON_ACCEPT)
		).json();
		expect(byDefault.selection.basis).toBe('approved');
		expect(byDefault.selection.surveyIds).toEqual(approved);
		expect(total(byDefault)).toBe(Number(await readingsOf(approved)));
		const chosen = await (
			await engineer.get(
				`/api/v1/assets/${carParkId}/populations?surveys=${others.join(',')}`,
				JSON_ACCEPT
			)
		).json();
		expect(chosen.selection.basis).toBe('chosen');
		expect(chosen.selection.words).toMatch(/not approved/);
		expect(total(chosen)).toBe(Number(await readingsOf(others)));
		const foreign = await engineer.get(
			`/api/v1/assets/${carParkId}/populations?surveys=999999`,
			JSON_ACCEPT
		);
		expect(foreign.status).toBe(400);
		expect((await foreign.json()).error.field).toBe('surveys');
	});

	it('leaves a draft survey out of a default assessment, and names an unapproved one chosen', async () => {
		const surveys = await surveysOf(carParkId);
		const approved = surveys.filter((s) => s.status === 'approved').map((s) => s.id);
		const other = surveys.find((s) => s.status !== 'approved')!;
		const snapshotOf = async (response: Response) => {
			expect(response.status).toBe(201);
			const row = await sequelize.query<{ snapshot: string }>(
				'SELECT snapshot FROM assessments WHERE id = ?',
				{
					replacements: [(await response.json()).assessment.id],
					type: QueryTypes.SELECT,
					plain: true
				}
			);
			return JSON.parse(row!.snapshot);
		};
		// The car park's second survey, set back to a draft for this test.
		await sequelize.query("UPDATE surveys SET status = 'draft' WHERE id = ?", {
			replacements: [other.id]
		});
		try {
			const byDefault = await snapshotOf(
				await engineer.postJson(`/api/v1/assets/${carParkId}/assessments`, {
					title: 'Car park, default selection'
				})
			);
			expect(byDefault.scope.surveyIds).toEqual(approved);
			expect(byDefault.surveys.map((s: { id: number }) => s.id)).toEqual(approved);
			expect(byDefault.scope.selectionWords).toMatch(/^Approved surveys only/);
			const chosen = await snapshotOf(
				await engineer.postJson(`/api/v1/assets/${carParkId}/assessments`, {
					title: 'Car park, the draft survey chosen',
					surveys: [other.id]
				})
			);
			expect(chosen.readingCount).toBeGreaterThan(0);
			expect(chosen.surveys.map((s: { status: string }) => s.status)).toEqual(['draft']);
			expect(chosen.scope.selectionWords).toMatch(/not approved/);
		} finally {
			await sequelize.query('UPDATE surveys SET status = ? WHERE id = ?', {
				replacements: [other.status, other.id]
			});
		}
		// An asset with no approved or submitted survey has nothing to assess by default.
		const empty = await engineer.postJson(`/api/v1/assets/${carParkId}/assessments`, {
			title: 'No survey at all',
			surveys: []
		});
		expect(empty.status).toBe(400);
		expect((await empty.json()).error.field).toBe('surveys');
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
		// The engineer who saved it may not approve it alone (the organisation's default rule).
		const own = await engineer.postJson(`/api/v1/assessments/${assessment.id}/approve`, {});
		expect(own.status).toBe(409);
		expect((await own.json()).error.message).toMatch(/second engineer/);
		const admin = await signInAs('admin');
		const approved = await admin.postJson(`/api/v1/assessments/${assessment.id}/approve`, {});
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
