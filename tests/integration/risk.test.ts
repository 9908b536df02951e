import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import {
	depassivationAssessment,
	fitNormal,
	m2PerSToMm2PerYear,
	toSortedCovers
} from '../../src/lib/analysis';
import { AssessmentRisk, type Assessment } from '../../src/lib/server/db/models';
import { CHLORIDE_DEFAULTS, SIMULATION } from '../../src/lib/server/risk/parameters';
import { testSequelize } from '../helpers/database';
import { approveDirectly, coversByMember, insertDraft } from '../helpers/assessments';
import { signInAs, type HttpClient } from '../helpers/session';

interface RiskJson {
	populationId: string;
	n: number;
	level: string;
	reason: string;
	atDesignLife: { modelProbability: number; empiricalShare: number; reliabilityIndex: number };
	atAges: { years: number; modelProbability: number }[];
}

describe('risk of an assessment: durability parameters and the engine', () => {
	let sequelize: Sequelize;
	let draft: Assessment;
	let engineer: HttpClient;
	let risks: RiskJson[];

	beforeAll(async () => {
		sequelize = testSequelize();
		draft = await insertDraft(sequelize);
		engineer = await signInAs('engineer');
		const response = await engineer.putJson(`/api/v1/assessments/${draft.id}/durability`, {
			parameters: {}
		});
		expect(response.status).toBe(200);
		risks = (await response.json()).populations;
	});
	afterAll(async () => {
		await sequelize.close();
	});

	it('gives the engine’s figures for the car-park deck (XD3, chloride defaults)', async () => {
		const deck = risks.find((r) => r.populationId === 'deck|XD3')!;
		const snapshot = JSON.parse(draft.snapshot);
		const population = snapshot.populations.find((p: { id: string }) => p.id === 'deck|XD3');
		const covers = await coversByMember(population.members.map((m: { id: number }) => m.id));
		const sorted = toSortedCovers([...covers.values()].flat());
		const d = CHLORIDE_DEFAULTS.XD3;
		const engine = depassivationAssessment(
			sorted,
			fitNormal(sorted),
			{
				kind: 'chloride',
				chloride: {
					surfaceContent: d.surfaceContent.value,
					initialContent: d.initialContent.value,
					criticalContent: d.criticalContent.value,
					dRefMm2PerYear: m2PerSToMm2PerYear(d.dM2PerS.value),
					ageingExponent: 0
				},
				dCov: d.dCov.value
			},
			{ years: [10, 25, 50], designLifeYears: 50, ...SIMULATION }
		);
		expect(population.assessment.chosenModel).toBe('normal');
		expect(deck.n).toBe(sorted.length);
		expect(deck.atDesignLife.modelProbability).toBe(engine.designLife.modelProbability);
		expect(deck.atDesignLife.empiricalShare).toBe(engine.designLife.empiricalShare);
		expect(deck.atDesignLife.reliabilityIndex).toBe(engine.designLife.reliabilityIndex);
		expect(deck.atAges.slice(0, 3).map((a) => a.modelProbability)).toEqual(
			engine.atAges.map((a) => a.modelProbability)
		);
		expect(deck.level).toBe('act-now');
		expect(deck.reason).toMatch(/lost its protection/);
	});

	it('refuses a carbonation model for a chloride class, naming the field', async () => {
		const response = await engineer.putJson(`/api/v1/assessments/${draft.id}/durability`, {
			parameters: { XD3: { kind: 'carbonation', kMmPerSqrtYear: 4, depthCov: 0.2 } }
		});
		expect(response.status).toBe(400);
		const body = await response.json();
		expect(body.error.message).toMatch(/chloride model/);
	});

	it('lets an owner read but not enter parameters', async () => {
		const owner = await signInAs('owner');
		const response = await owner.putJson(`/api/v1/assessments/${draft.id}/durability`, {
			parameters: {}
		});
		expect(response.status).toBe(403);
	});

	it('freezes the parameters once the assessment is approved', async () => {
		await approveDirectly(draft);
		const response = await engineer.putJson(`/api/v1/assessments/${draft.id}/durability`, {
			parameters: {}
		});
		expect(response.status).toBe(409);
		const row = (await AssessmentRisk.findOne({ where: { assessmentId: draft.id } }))!;
		await expect(row.update({ annex: '{}' })).rejects.toThrow(/cannot be changed/);
		await expect(row.destroy()).rejects.toThrow(/cannot be changed/);
	});
});
