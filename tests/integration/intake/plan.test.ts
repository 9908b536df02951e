/**
 * The survey plan over HTTP against the built app and the real database: saved and audited,
 * its SD taken from the asset's earlier survey, planned against measured per member, frozen
 * with the survey, refused to roles that may not plan, and printed as a site sheet whose text
 * does not overlap.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import { sampleStandardDeviation } from 'simple-statistics';
import { auditOf } from '../../helpers/editing';
import {
	actorFor,
	csv,
	freshSurvey,
	importFile,
	otherOrganisation,
	testSequelize
} from '../../helpers/intake';
import { overlappingLines, textLines } from '../../helpers/pdfLayout';
import { DEMO_USERS, signInAs, type HttpClient } from '../../helpers/session';
import { Member } from '../../../src/lib/server/db/models';

let sequelize: Sequelize;
let engineer: HttpClient;
let surveyor: HttpClient;

const EARLIER_COVERS = [31, 36, 29, 40, 33, 38, 27, 35];
const PLAN = {
	settings: { ruleSet: 'en-statistical', marginMm: 2, p0: 0.01, p1: 0.1, replicates: 60, seed: 5 },
	populations: [
		{ memberType: 'slab', exposureClass: 'XC3', memberCount: 3, cMinMm: 25, cNomMm: 35 },
		{ memberType: 'wall', exposureClass: 'XC4', memberCount: 1, sdMm: 6, cMinMm: 30, cNomMm: 40 }
	]
};

let surveyId: number;
let firstMemberId: number;

beforeAll(async () => {
	sequelize = testSequelize();
	engineer = await signInAs('engineer');
	surveyor = await signInAs('surveyor');
	const actor = await actorFor(DEMO_USERS.engineer);
	// An earlier survey of the same asset read the slab × XC3 population.
	const earlier = await freshSurvey(actor, ['E-01']);
	const lines = EARLIER_COVERS.map((c, i) => `E-01,${i * 100},0,${c}`);
	await importFile(actor, earlier.survey.id, 'earlier.csv', csv(['M,X,Y,C', ...lines]));
	const current = await freshSurvey(actor, ['S-01', 'S-02', 'S-03'], earlier.asset);
	await Member.create({
		...current.members[0].get({ plain: true }),
		id: undefined,
		label: 'W-01',
		memberType: 'wall',
		exposureClass: 'XC4',
		cMinMm: 30,
		cNomMm: 40
	} as never);
	surveyId = current.survey.id;
	firstMemberId = current.members[0].id;
	await importFile(actor, surveyId, 'today.csv', csv(['M,X,Y,C', 'S-01,0,0,33', 'S-01,100,0,35']));
});
afterAll(() => sequelize.close());

describe('the survey plan API', () => {
	it('answers 404 before a plan is saved', async () => {
		expect((await engineer.get(`/api/v1/surveys/${surveyId}/plan`)).status).toBe(404);
	});

	it('refuses a surveyor (survey:plan is for engineers and admins) with 403', async () => {
		const response = await surveyor.putJson(`/api/v1/surveys/${surveyId}/plan`, PLAN);
		expect(response.status).toBe(403);
	});

	it('names the field of a bad plan (p0 not below p1)', async () => {
		const bad = { ...PLAN, settings: { ...PLAN.settings, p0: 0.2, p1: 0.1 } };
		const response = await engineer.putJson(`/api/v1/surveys/${surveyId}/plan`, bad);
		expect(response.status).toBe(400);
		const { error } = await response.json();
		expect(error.field).toBe('settings.p1');
		expect(error.message).toBe('p0 must be below p1.');
	});

	it('saves the plan, audited, with the SD of the earlier survey and planned against measured', async () => {
		const response = await engineer.putJson(`/api/v1/surveys/${surveyId}/plan`, PLAN);
		expect(response.status).toBe(200);
		const { plan } = await response.json();
		const [slab, wall] = plan.result;
		// The sample SD (n − 1) of the earlier survey's readings; simple-statistics as the peer.
		expect(slab.sdMm).toBeCloseTo(sampleStandardDeviation(EARLIER_COVERS), 9);
		expect(slab.sdBasis).toMatch(/^measured: sample SD of 8 readings/);
		expect(wall.sdMm).toBe(6);
		expect(wall.sdBasis).toMatch(/^entered/);
		for (const p of plan.result) {
			const largest = Math.max(...p.criteria.map((c: { n: number | null }) => c.n ?? 0));
			expect(p.governing.n).toBe(largest);
			expect(p.readingsPerMember).toBe(Math.ceil(largest / p.memberCount));
			expect(p.curves.map((c: { method: string }) => c.method)).toContain('simulation');
		}
		expect(slab.measuredReadings).toBe(2);
		expect(slab.measuredMembers).toBe(1);
		const first = plan.members.find((m: { memberId: number }) => m.memberId === firstMemberId);
		expect(first).toMatchObject({ planned: slab.readingsPerMember, measured: 2 });
		const events = await auditOf('survey_plan.created', 'survey', surveyId);
		expect(events).toHaveLength(1);
	});

	it('gives the same figures for the same plan (seeded), and audits the change', async () => {
		const before = await (await engineer.get(`/api/v1/surveys/${surveyId}/plan`)).json();
		const again = await engineer.putJson(`/api/v1/surveys/${surveyId}/plan`, PLAN);
		const after = await again.json();
		expect(after.plan.result).toEqual(before.plan.result);
		expect(await auditOf('survey_plan.updated', 'survey', surveyId)).toHaveLength(1);
	});

	it('lets a surveyor read the plan, and hides it from another organisation', async () => {
		expect((await surveyor.get(`/api/v1/surveys/${surveyId}/plan`)).status).toBe(200);
		const other = await otherOrganisation();
		const foreign = await engineer.get(`/api/v1/surveys/${other.survey.id}/plan`);
		expect(foreign.status).toBe(404);
	});

	it('prints a site sheet with a numbered grid per member and no text over text', async () => {
		const response = await surveyor.get(`/api/v1/surveys/${surveyId}/plan/site-sheet`);
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toBe('application/pdf');
		const file = join(mkdtempSync(join(tmpdir(), 'site-sheet-')), 'sheet.pdf');
		writeFileSync(file, Buffer.from(await response.arrayBuffer()));
		const lines = textLines(file);
		const text = lines.map((l) => l.text).join('\n');
		const { plan } = await (await engineer.get(`/api/v1/surveys/${surveyId}/plan`)).json();
		const perMember = plan.result[0].readingsPerMember;
		for (const label of ['S-01', 'S-02', 'S-03', 'W-01']) expect(text).toContain(`Member ${label}`);
		expect(text).toContain(`planned readings ${perMember}`);
		// The cells are numbered 1…planned: the largest number printed is the largest plan.
		const cellNumbers = lines.flatMap((l) => l.text.split(' ')).filter((w) => /^\d+$/.test(w));
		expect(cellNumbers.map(Number)).toContain(perMember);
		expect(overlappingLines(lines)).toEqual([]);
		expect(execFileSync('pdfinfo', [file], { encoding: 'utf8' })).toMatch(/Page size:\s+595/);
	});

	it('is frozen with the survey: a submitted survey refuses a new plan with 409', async () => {
		expect((await engineer.postBody(`/api/v1/surveys/${surveyId}/submit`)).status).toBe(200);
		const response = await engineer.putJson(`/api/v1/surveys/${surveyId}/plan`, PLAN);
		expect(response.status).toBe(409);
		expect((await response.json()).error.message).toContain('frozen');
	});
});
