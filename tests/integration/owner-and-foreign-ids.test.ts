/**
 * What an owner may read of an asset shared with them (docs/roles.md: assessments and reports,
 * not surveys), and that another organisation's assessment or member is refused with exactly the
 * answer an id that does not exist gets.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { testSequelize } from '../helpers/database';
import { signInAs, type HttpClient } from '../helpers/session';
import {
	createOtherOrganisation,
	draftAndToken,
	type OtherOrganisation
} from '../helpers/otherOrganisation';

/** An id no table reaches (ids are unsigned 32-bit). */
const MISSING_ID = 4_000_000_000;

let sequelize: Sequelize;
beforeAll(() => {
	sequelize = testSequelize();
});
afterAll(async () => {
	await sequelize.close();
});

describe('owners do not read survey data (survey:read, not asset:read)', () => {
	let owner: HttpClient;
	let engineer: HttpClient;
	let shared: { assetId: number; surveyId: number; memberId: number; titles: string[] };

	beforeAll(async () => {
		owner = await signInAs('owner');
		engineer = await signInAs('engineer');
		const row = await sequelize.query<{ assetId: number; surveyId: number; memberId: number }>(
			`SELECT s.asset_id AS assetId, s.id AS surveyId, m.id AS memberId
			   FROM asset_shares sh
			   JOIN organisations o ON o.id = sh.organisation_id
			   JOIN memberships ms ON ms.organisation_id = o.id
			   JOIN users u ON u.id = ms.user_id AND u.email = 'owner@northmoor.example'
			   JOIN surveys s ON s.asset_id = sh.asset_id
			   JOIN members m ON m.survey_id = s.id
			  ORDER BY s.id, m.id LIMIT 1`,
			{ type: QueryTypes.SELECT, plain: true }
		);
		expect(row, 'the demo shares an asset with surveys with the owner').toBeTruthy();
		const titles = await sequelize.query<{ title: string }>(
			'SELECT title FROM surveys WHERE asset_id = ?',
			{ replacements: [row!.assetId], type: QueryTypes.SELECT }
		);
		shared = { ...row!, titles: titles.map((t) => t.title) };
	});

	it('refuses an owner the surveys, members and readings endpoints with 403', async () => {
		for (const path of [
			`/api/v1/assets/${shared.assetId}/surveys`,
			`/api/v1/surveys/${shared.surveyId}/members`,
			`/api/v1/members/${shared.memberId}/readings`
		]) {
			const response = await owner.get(path);
			expect(response.status, path).toBe(403);
			expect(await response.text(), path).not.toContain('coverMm');
		}
	});

	it('still answers them to an engineer of the owning organisation', async () => {
		expect((await engineer.get(`/api/v1/assets/${shared.assetId}/surveys`)).status).toBe(200);
		expect((await engineer.get(`/api/v1/surveys/${shared.surveyId}/members`)).status).toBe(200);
		expect((await engineer.get(`/api/v1/members/${shared.memberId}/readings`)).status).toBe(200);
	});

	it('shows an owner the asset page without any survey title', async () => {
		const page = await owner.get(`/assets/${shared.assetId}`);
		expect(page.status).toBe(200);
		const html = await page.text();
		expect(shared.titles.length).toBeGreaterThan(0);
		for (const title of shared.titles) expect(html).not.toContain(title);
		expect(html).not.toContain(`/surveys/${shared.surveyId}`);
		const engineerHtml = await (await engineer.get(`/assets/${shared.assetId}`)).text();
		expect(engineerHtml).toContain(shared.titles[0]);
	});
});

describe("another organisation's id is answered exactly as a missing one (ids reveal nothing)", () => {
	let other: OtherOrganisation;
	let demoAdmin: HttpClient;
	let draftId: number;
	let approvedId: number;

	beforeAll(async () => {
		other = await createOtherOrganisation(sequelize);
		demoAdmin = await signInAs('admin');
		draftId = other.ids.assessmentId;
		approvedId = (await draftAndToken(other.admin, other.ids.assetId)).assessmentId;
		// This organisation has one person: let the preparer approve (the rule is tested elsewhere).
		await sequelize.query(
			`UPDATE organisations o JOIN assets a ON a.organisation_id = o.id
			    SET o.second_approver_required = 0 WHERE a.id = ?`,
			{ replacements: [other.ids.assetId] }
		);
		const approved = await other.admin.postJson(`/api/v1/assessments/${approvedId}/approve`, {});
		expect(approved.status).toBe(200);
	});

	type Send = (id: number) => Promise<Response>;
	const routes: [string, Send, () => number[]][] = [
		[
			'GET /api/v1/assessments/:id',
			(id) => demoAdmin.get(`/api/v1/assessments/${id}`),
			() => [draftId, approvedId]
		],
		[
			'GET /api/v1/assessments/:id/durability',
			(id) => demoAdmin.get(`/api/v1/assessments/${id}/durability`),
			() => [draftId, approvedId]
		],
		[
			'GET /api/v1/assessments/:id/report',
			(id) => demoAdmin.get(`/api/v1/assessments/${id}/report`),
			() => [draftId, approvedId]
		],
		[
			'POST /api/v1/assessments/:id/approve',
			(id) => demoAdmin.postJson(`/api/v1/assessments/${id}/approve`, {}),
			() => [draftId]
		],
		[
			'GET /api/v1/members/:id/cover-map',
			(id) => demoAdmin.get(`/api/v1/members/${id}/cover-map`),
			() => [other.ids.memberId]
		]
	];

	for (const [name, send, theirs] of routes) {
		it(`${name}: same status and body for their record as for none`, async () => {
			const missing = await send(MISSING_ID);
			const missingBody = await missing.text();
			expect(missing.status).toBe(404);
			for (const id of theirs()) {
				const foreign = await send(id);
				expect(foreign.status, `id ${id}`).toBe(missing.status);
				expect(await foreign.text(), `id ${id}`).toBe(missingBody);
			}
		});
	}
});
