import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import {
	depassivationAssessment,
	fitChlorideProfile,
	measuredDepassivation,
	toSortedCovers
} from '../../src/lib/analysis';
import { concreteAgeYears } from '../../src/lib/intake/measurements';
import {
	AssessmentRisk,
	ChlorideIncrement,
	ChlorideProfile,
	type Assessment
} from '../../src/lib/server/db/models';
import {
	CARBONATION_DEFAULTS,
	CHLORIDE_DEFAULTS,
	SIMULATION
} from '../../src/lib/server/risk/parameters';
import { testSequelize } from '../helpers/database';
import { approveDirectly, coversByMember, insertDraft } from '../helpers/assessments';
import { signInAs, type HttpClient } from '../helpers/session';

interface RiskJson {
	populationId: string;
	n: number;
	level: string;
	reason: string;
	atDesignLife: {
		modelProbability: number;
		empiricalShare: number;
		reliabilityIndex: number;
		method: string;
		band: { low: number; high: number };
	};
	atAges: { years: number; modelProbability: number }[];
	measured: { kind: string; locations: unknown[] } | null;
}

interface ApiProfile {
	testedOn: string;
	initialContentPercent: number | null;
	increments: { fromMm: number; toMm: number; percentOfBinder: number; outermost: boolean }[];
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

	const snapshotPopulation = (id: string) =>
		JSON.parse(draft.snapshot).populations.find((p: { id: string }) => p.id === id);
	const coversOf = async (population: { members: { id: number }[] }) =>
		toSortedCovers(
			[...(await coversByMember(population.members.map((m) => m.id))).values()].flat()
		);

	it('gives the engine’s figures for a part on assumed inputs (slab, XC3 carbonation defaults)', async () => {
		const slab = risks.find((r) => r.populationId === 'slab|XC3')!;
		const population = snapshotPopulation('slab|XC3');
		const sorted = await coversOf(population);
		const chosen = population.assessment.models[population.assessment.chosenModel];
		const d = CARBONATION_DEFAULTS.XC3;
		const engine = depassivationAssessment(
			sorted,
			{ model: chosen.model, location: chosen.location, scale: chosen.scale },
			{ kind: 'carbonation', kMmPerSqrtYear: d.k.value, depthCov: d.depthCov.value },
			{ years: [10, 25, 50], designLifeYears: 50, ...SIMULATION }
		);
		expect(slab.n).toBe(sorted.length);
		expect(slab.measured).toBeNull();
		expect(slab.atDesignLife.modelProbability).toBe(engine.designLife.modelProbability);
		expect(slab.atDesignLife.empiricalShare).toBe(engine.designLife.empiricalShare);
		expect(slab.atDesignLife.reliabilityIndex).toBe(engine.designLife.reliabilityIndex);
		expect(slab.atAges.slice(0, 3).map((a) => a.modelProbability)).toEqual(
			engine.atAges.map((a) => a.modelProbability)
		);
	});

	it('gives the engine’s figures for the car-park deck from its measured chloride profiles', async () => {
		const deck = risks.find((r) => r.populationId === 'deck|XD3')!;
		const snapshot = JSON.parse(draft.snapshot);
		const population = snapshotPopulation('deck|XD3');
		const sorted = await coversOf(population);
		// The profiles as the API gives them, contents in % of binder, fitted by the engine.
		const fits = [];
		for (const member of population.members) {
			const response = await engineer.get(`/api/v1/members/${member.id}/chloride-profiles`);
			expect(response.status).toBe(200);
			for (const p of (await response.json()).chlorideProfiles as ApiProfile[])
				fits.push(
					fitChlorideProfile(
						{
							ageYears: concreteAgeYears(snapshot.asset.yearOfConstruction, p.testedOn),
							increments: p.increments.map((i) => ({
								fromMm: i.fromMm,
								toMm: i.toMm,
								content: i.percentOfBinder,
								outermost: i.outermost
							})),
							...(p.initialContentPercent === null
								? {}
								: { initialContent: p.initialContentPercent })
						},
						{ initialContent: CHLORIDE_DEFAULTS.XD3.initialContent.value }
					)
				);
		}
		expect(fits).toHaveLength(6);
		const front = {
			kind: 'chloride' as const,
			fits,
			criticalContent: CHLORIDE_DEFAULTS.XD3.criticalContent.value
		};
		const atLife = measuredDepassivation(sorted, front, 50);
		expect(deck.measured?.kind).toBe('chloride');
		expect(deck.measured?.locations).toHaveLength(6);
		expect(deck.atDesignLife.method).toBe('measured-front');
		expect(deck.atDesignLife.modelProbability).toBeCloseTo(atLife.share, 12);
		expect(deck.atDesignLife.band.low).toBeLessThanOrEqual(atLife.share);
		expect(deck.atDesignLife.band.high).toBeGreaterThanOrEqual(atLife.share);
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

	it('keeps the measured fronts it was computed with: a profile recorded later changes nothing of the approved assessment', async () => {
		const deckMember = snapshotPopulation('deck|XD3').members[0].id;
		const before = await (await engineer.get(`/api/v1/assessments/${draft.id}/durability`)).json();
		const profile = await ChlorideProfile.create({
			memberId: deckMember,
			label: `LATE-${Date.now()}`,
			xMm: null,
			yMm: null,
			testedOn: '2026-11-30',
			basis: 'binder',
			binderContentKgM3: null,
			concreteDensityKgM3: null,
			initialContentPercent: 0.05,
			method: null,
			notes: null
		});
		await ChlorideIncrement.bulkCreate(
			[4.0, 3.5, 3.0, 2.5].map((c, i) => ({
				profileId: profile.id,
				position: i + 1,
				fromMm: 10 * i,
				toMm: 10 * i + 10,
				chloridePercent: c,
				outermost: i === 0
			}))
		);
		try {
			const after = await (await engineer.get(`/api/v1/assessments/${draft.id}/durability`)).json();
			expect(after.populations).toEqual(before.populations);
			const deck = after.populations.find((p: RiskJson) => p.populationId === 'deck|XD3');
			expect(deck.measured.locations).toHaveLength(6);
			expect(after.risk.provenance.some((r: { basis: string }) => r.basis === 'fitted')).toBe(true);
		} finally {
			await ChlorideIncrement.destroy({ where: { profileId: profile.id } });
			await profile.destroy();
		}
	});
});
