/**
 * Hostile input: another organisation's ids on every route with an id answer 404 and show none
 * of its data (docs/roles.md: "never 403, so ids reveal nothing"). The route list is read from
 * src/routes, so a new route with a parameter and no case here fails the first test.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { testSequelize } from '../helpers/database';
import { appUrl } from '../helpers/env';
import { signInAs, type HttpClient } from '../helpers/session';
import { routeIdsWithParams } from '../helpers/routes';
import {
	createOtherOrganisation,
	customPopulationOf,
	draftAndToken,
	insertMeasurements,
	researchExportOf,
	type OrganisationIds,
	type OtherOrganisation
} from '../helpers/otherOrganisation';

type Probe = {
	method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE' | 'FORM' | 'RAW';
	path: string;
	body?: unknown;
};

/** Bodies each edit's schema accepts, so that an attack gets past validation to the lookup. */
const VALID = {
	asset: {
		name: 'Stolen asset',
		designCode: 'EN 1992-1-1',
		unitSystem: 'mm',
		designServiceLifeYears: '50'
	},
	survey: { title: 'Stolen survey', surveyDate: '2026-01-01' },
	member: {
		label: 'STOLEN-5',
		memberType: 'slab',
		face: 'top',
		exposureClass: 'XC3',
		requirementSource: 'EN 1992-1-1',
		cMinMm: '25',
		cNomMm: '35',
		deltaCDevMm: '10'
	},
	hole: { label: 'STOLEN-H', meterReadingMm: '40', measuredCoverMm: '41' },
	carbonationTest: { label: 'STOLEN-CT', testedOn: '2026-01-01', depthsMm: [10] },
	chlorideProfile: {
		label: 'STOLEN-CP',
		testedOn: '2026-01-01',
		basis: 'binder',
		increments: [{ fromMm: 0, toMm: 5, chloridePercent: 1 }]
	},
	plan: {
		settings: { replicates: 20 },
		populations: [{ memberType: 'slab', exposureClass: 'XC3', cMinMm: 25, cNomMm: 35 }]
	},
	planForm: {
		memberType: 'slab',
		exposureClass: 'XC3',
		memberCount: '2',
		cMinMm: '25',
		cNomMm: '35',
		replicates: '20'
	}
};

/** For each route with an organisation's id: the requests an attacker would try with a victim's ids. */
const ORG_ROUTES: Record<string, (v: OrganisationIds, own: OrganisationIds) => Probe[]> = {
	'/assessments/[id]': (v) => [
		{ method: 'GET', path: `/assessments/${v.assessmentId}` },
		{ method: 'FORM', path: `/assessments/${v.assessmentId}?/approve` }
	],
	'/assets/[assetId]/assessments': (v) => [
		{ method: 'GET', path: `/assets/${v.assetId}/assessments` },
		{ method: 'FORM', path: `/assets/${v.assetId}/assessments?/save`, body: { title: 'Stolen' } }
	],
	'/assets/[assetId]/populations': (v) => [
		{ method: 'GET', path: `/assets/${v.assetId}/populations` },
		{ method: 'GET', path: `/assets/${v.assetId}/populations?survey=${v.surveyId}` }
	],
	'/assets/[assetId]/populations/detail': (v) => [
		{ method: 'GET', path: `/assets/${v.assetId}/populations/detail?type=deck&exposure=XD3` }
	],
	'/assets/[assetId]/edit': (v) => [
		{ method: 'GET', path: `/assets/${v.assetId}/edit` },
		{ method: 'FORM', path: `/assets/${v.assetId}/edit?/save`, body: VALID.asset }
	],
	'/surveys/[surveyId]/edit': (v) => [
		{ method: 'GET', path: `/surveys/${v.surveyId}/edit` },
		{ method: 'FORM', path: `/surveys/${v.surveyId}/edit?/save`, body: VALID.survey }
	],
	'/members/[memberId]/edit': (v) => [
		{ method: 'GET', path: `/members/${v.memberId}/edit` },
		{ method: 'FORM', path: `/members/${v.memberId}/edit?/save`, body: VALID.member }
	],
	'/holes/[holeId]/edit': (v) => [
		{ method: 'GET', path: `/holes/${v.holeId}/edit` },
		{ method: 'FORM', path: `/holes/${v.holeId}/edit?/save`, body: VALID.hole },
		{ method: 'FORM', path: `/holes/${v.holeId}/edit?/delete` }
	],
	'/api/v1/holes/[holeId]': (v) => [
		{ method: 'GET', path: `/api/v1/holes/${v.holeId}` },
		{
			method: 'PUT',
			path: `/api/v1/holes/${v.holeId}`,
			body: { label: 'STOLEN-H', meterReadingMm: 40, measuredCoverMm: 41 }
		},
		{ method: 'DELETE', path: `/api/v1/holes/${v.holeId}` }
	],
	'/members/[memberId]': (v) => [{ method: 'GET', path: `/members/${v.memberId}` }],
	'/organisation/members/[id]': (v) => [
		{ method: 'GET', path: `/organisation/members/${v.membershipId}` }
	],
	'/portfolio/[assetId]': (v, own) => [
		{ method: 'GET', path: `/portfolio/${v.assetId}` },
		{
			method: 'FORM',
			path: `/portfolio/${v.assetId}?/share`,
			body: { assessment: String(v.assessmentId), email: 'thief@tests.example' }
		},
		// The asset in the path is the attacker's own; only the assessment in the body is foreign.
		{
			method: 'FORM',
			path: `/portfolio/${own.assetId}?/share`,
			body: { assessment: String(v.assessmentId), email: 'thief@tests.example' }
		},
		{
			method: 'FORM',
			path: `/portfolio/${own.assetId}?/revoke`,
			body: { assessment: String(v.assessmentId), link: '1' }
		}
	],
	'/api/v1/assessments/[id]': (v) => [
		{ method: 'GET', path: `/api/v1/assessments/${v.assessmentId}` }
	],
	'/api/v1/assessments/[id]/approve': (v) => [
		{ method: 'POST', path: `/api/v1/assessments/${v.assessmentId}/approve`, body: {} }
	],
	'/api/v1/assessments/[id]/durability': (v) => [
		{ method: 'GET', path: `/api/v1/assessments/${v.assessmentId}/durability` },
		{
			method: 'PUT',
			path: `/api/v1/assessments/${v.assessmentId}/durability`,
			body: { parameters: {} }
		}
	],
	'/api/v1/assessments/[id]/report': (v) => [
		{ method: 'GET', path: `/api/v1/assessments/${v.assessmentId}/report` }
	],
	'/api/v1/assets/[assetId]/assessments': (v) => [
		{ method: 'GET', path: `/api/v1/assets/${v.assetId}/assessments` },
		{ method: 'POST', path: `/api/v1/assets/${v.assetId}/assessments`, body: { title: 'Stolen' } }
	],
	'/api/v1/assets/[assetId]/populations': (v) => [
		{ method: 'GET', path: `/api/v1/assets/${v.assetId}/populations` }
	],
	'/api/v1/assets/[assetId]/populations/custom': (v) => [
		{ method: 'GET', path: `/api/v1/assets/${v.assetId}/populations/custom` },
		{
			method: 'POST',
			path: `/api/v1/assets/${v.assetId}/populations/custom`,
			body: { name: 'Stolen', members: [v.memberId] }
		}
	],
	'/api/v1/assets/[assetId]/populations/custom/[customId]': (v, own) => [
		{
			method: 'PATCH',
			path: `/api/v1/assets/${v.assetId}/populations/custom/${v.customPopulationId}`,
			body: { name: 'Stolen' }
		},
		{
			method: 'DELETE',
			path: `/api/v1/assets/${v.assetId}/populations/custom/${v.customPopulationId}`
		},
		// The attacker's own asset with the victim's population: still none of theirs.
		{
			method: 'PATCH',
			path: `/api/v1/assets/${own.assetId}/populations/custom/${v.customPopulationId}`,
			body: { name: 'Stolen' }
		},
		{
			method: 'DELETE',
			path: `/api/v1/assets/${own.assetId}/populations/custom/${v.customPopulationId}`
		}
	],
	'/api/v1/assets/[assetId]/populations/detail': (v) => [
		{ method: 'GET', path: `/api/v1/assets/${v.assetId}/populations/detail?type=deck&exposure=XD3` }
	],
	'/api/v1/members/[memberId]/cover-map': (v) => [
		{ method: 'GET', path: `/api/v1/members/${v.memberId}/cover-map` }
	],
	'/api/v1/organisation/members/[id]': (v) => [
		{
			method: 'PATCH',
			path: `/api/v1/organisation/members/${v.membershipId}`,
			body: { role: 'surveyor' }
		},
		{ method: 'DELETE', path: `/api/v1/organisation/members/${v.membershipId}` }
	],
	'/api/v1/assets/[assetId]/research-consent': (v) => [
		{ method: 'GET', path: `/api/v1/assets/${v.assetId}/research-consent` },
		{
			method: 'PUT',
			path: `/api/v1/assets/${v.assetId}/research-consent`,
			body: { researchOptIn: true }
		}
	],
	'/api/v1/assets/[assetId]/surveys': (v) => [
		{ method: 'GET', path: `/api/v1/assets/${v.assetId}/surveys` }
	],
	'/api/v1/members/[memberId]/readings': (v) => [
		{ method: 'GET', path: `/api/v1/members/${v.memberId}/readings` }
	],
	'/api/v1/research/exports/[exportId]': (v) => [
		{ method: 'GET', path: `/api/v1/research/exports/${v.exportId}` }
	],
	'/api/v1/surveys/[surveyId]/members': (v) => [
		{ method: 'GET', path: `/api/v1/surveys/${v.surveyId}/members` },
		{ method: 'POST', path: `/api/v1/surveys/${v.surveyId}/members`, body: { label: 'STOLEN-4' } }
	],
	'/assets/[assetId]': (v) => [
		{ method: 'GET', path: `/assets/${v.assetId}` },
		{
			method: 'FORM',
			path: `/assets/${v.assetId}?/createSurvey`,
			body: { title: 'Stolen', surveyDate: '2026-01-01' }
		}
	],
	'/members/[memberId]/entry': (v) => [
		{ method: 'GET', path: `/members/${v.memberId}/entry` },
		{
			method: 'FORM',
			path: `/members/${v.memberId}/entry?/addHole`,
			body: { label: 'H1', meterReadingMm: '40', measuredMm: '41' }
		}
	],
	'/surveys/[surveyId]': (v) => [
		{ method: 'GET', path: `/surveys/${v.surveyId}` },
		{ method: 'FORM', path: `/surveys/${v.surveyId}?/addMember`, body: { label: 'STOLEN-1' } },
		{ method: 'FORM', path: `/surveys/${v.surveyId}?/pasteMembers`, body: { text: 'STOLEN-2' } },
		{ method: 'FORM', path: `/surveys/${v.surveyId}?/submit` },
		{ method: 'FORM', path: `/surveys/${v.surveyId}?/review`, body: { decision: 'approve' } }
	],
	'/api/v1/assets/[assetId]': (v) => [
		{ method: 'GET', path: `/api/v1/assets/${v.assetId}` },
		{ method: 'PUT', path: `/api/v1/assets/${v.assetId}`, body: { name: 'Stolen asset' } }
	],
	'/api/v1/attachments/[attachmentId]': (v) => [
		{ method: 'GET', path: `/api/v1/attachments/${v.attachmentId}` },
		{ method: 'GET', path: `/api/v1/attachments/${v.attachmentId}?thumbnail=1` }
	],
	'/api/v1/imports/[batchId]': (v) => [{ method: 'GET', path: `/api/v1/imports/${v.batchId}` }],
	'/api/v1/imports/[batchId]/cancel': (v) => [
		{ method: 'POST', path: `/api/v1/imports/${v.batchId}/cancel`, body: {} }
	],
	'/api/v1/imports/[batchId]/rejected': (v) => [
		{ method: 'GET', path: `/api/v1/imports/${v.batchId}/rejected` }
	],
	'/api/v1/imports/[batchId]/start': (v) => [
		{
			method: 'POST',
			path: `/api/v1/imports/${v.batchId}/start`,
			body: {
				mapping: { memberLabel: 0, x: 1, y: 2, cover: 3 },
				options: {},
				confirmDuplicate: true
			}
		}
	],
	'/api/v1/imports/[batchId]/check': (v) => [
		{
			method: 'POST',
			path: `/api/v1/imports/${v.batchId}/check`,
			body: {
				mapping: { memberLabel: 0, x: 1, y: 2, cover: 3 },
				options: {},
				headers: ['member', 'x', 'y', 'cover'],
				rows: [['W-01', '0.1', '0.2', '35']]
			}
		}
	],
	'/api/v1/imports/[batchId]/undo': (v) => [
		{ method: 'POST', path: `/api/v1/imports/${v.batchId}/undo`, body: {} }
	],
	'/api/v1/members/[memberId]': (v) => [
		{ method: 'GET', path: `/api/v1/members/${v.memberId}` },
		{ method: 'PUT', path: `/api/v1/members/${v.memberId}`, body: { label: 'STOLEN' } }
	],
	'/api/v1/members/[memberId]/carbonation-tests': (v) => [
		{ method: 'GET', path: `/api/v1/members/${v.memberId}/carbonation-tests` },
		{
			method: 'POST',
			path: `/api/v1/members/${v.memberId}/carbonation-tests`,
			body: VALID.carbonationTest
		}
	],
	'/api/v1/members/[memberId]/chloride-profiles': (v) => [
		{ method: 'GET', path: `/api/v1/members/${v.memberId}/chloride-profiles` },
		{
			method: 'POST',
			path: `/api/v1/members/${v.memberId}/chloride-profiles`,
			body: VALID.chlorideProfile
		}
	],
	'/api/v1/carbonation-tests/[carbonationTestId]': (v) => [
		{ method: 'GET', path: `/api/v1/carbonation-tests/${v.carbonationTestId}` },
		{ method: 'DELETE', path: `/api/v1/carbonation-tests/${v.carbonationTestId}` }
	],
	'/api/v1/chloride-profiles/[chlorideProfileId]': (v) => [
		{ method: 'GET', path: `/api/v1/chloride-profiles/${v.chlorideProfileId}` },
		{ method: 'DELETE', path: `/api/v1/chloride-profiles/${v.chlorideProfileId}` }
	],
	'/surveys/[surveyId]/site': (v) => [{ method: 'GET', path: `/surveys/${v.surveyId}/site` }],
	'/surveys/[surveyId]/measurements': (v) => [
		{ method: 'GET', path: `/surveys/${v.surveyId}/measurements` },
		{
			method: 'FORM',
			path: `/surveys/${v.surveyId}/measurements?/addCarbonation`,
			body: { ...VALID.carbonationTest, memberId: String(v.memberId), depthsMm: '10' }
		},
		{
			method: 'FORM',
			path: `/surveys/${v.surveyId}/measurements?/deleteCarbonation`,
			body: { id: String(v.carbonationTestId) }
		},
		{
			method: 'FORM',
			path: `/surveys/${v.surveyId}/measurements?/deleteChloride`,
			body: { id: String(v.chlorideProfileId) }
		}
	],
	'/api/v1/members/[memberId]/holes': (v) => [
		{ method: 'GET', path: `/api/v1/members/${v.memberId}/holes` },
		{
			method: 'POST',
			path: `/api/v1/members/${v.memberId}/holes`,
			body: { label: 'H1', meterReadingMm: 40, measuredMm: 41 }
		}
	],
	'/api/v1/surveys/[surveyId]': (v) => [
		{ method: 'GET', path: `/api/v1/surveys/${v.surveyId}` },
		{ method: 'PUT', path: `/api/v1/surveys/${v.surveyId}`, body: { title: 'Stolen survey' } }
	],
	'/api/v1/surveys/[surveyId]/plan': (v) => [
		{ method: 'GET', path: `/api/v1/surveys/${v.surveyId}/plan` },
		{ method: 'PUT', path: `/api/v1/surveys/${v.surveyId}/plan`, body: VALID.plan },
		{ method: 'DELETE', path: `/api/v1/surveys/${v.surveyId}/plan` }
	],
	'/api/v1/surveys/[surveyId]/plan/site-sheet': (v) => [
		{ method: 'GET', path: `/api/v1/surveys/${v.surveyId}/plan/site-sheet` }
	],
	'/surveys/[surveyId]/plan': (v) => [
		{ method: 'GET', path: `/surveys/${v.surveyId}/plan` },
		{ method: 'FORM', path: `/surveys/${v.surveyId}/plan?/save`, body: VALID.planForm }
	],
	'/api/v1/surveys/[surveyId]/attachments': (v) => [
		{ method: 'GET', path: `/api/v1/surveys/${v.surveyId}/attachments` },
		{
			method: 'RAW',
			path: `/api/v1/surveys/${v.surveyId}/attachments?fileName=x.txt&kind=other`,
			body: 'x'
		}
	],
	'/api/v1/surveys/[surveyId]/site-sync': (v) => [
		{
			method: 'POST',
			path: `/api/v1/surveys/${v.surveyId}/site-sync`,
			body: {
				batchId: '6f1c2a7e-0d4b-4c1e-9a55-1b2c3d4e5f60',
				readings: [
					{
						memberId: v.memberId,
						clientId: '6f1c2a7e-0d4b-4c1e-9a55-1b2c3d4e5f61',
						cover: '30'
					}
				]
			}
		}
	],
	'/api/v1/surveys/[surveyId]/site-sync/photos': (v) => [
		{
			method: 'RAW',
			path: `/api/v1/surveys/${v.surveyId}/site-sync/photos?clientId=6f1c2a7e-0d4b-4c1e-9a55-1b2c3d4e5f62&memberId=${v.memberId}&fileName=x.png`,
			body: 'x'
		}
	],
	'/api/v1/surveys/[surveyId]/imports': (v) => [
		{ method: 'GET', path: `/api/v1/surveys/${v.surveyId}/imports` },
		{
			method: 'RAW',
			path: `/api/v1/surveys/${v.surveyId}/imports?fileName=x.csv`,
			body: 'Member,Cover\nX,40\n'
		}
	],
	'/api/v1/surveys/[surveyId]/members/bulk': (v) => [
		{
			method: 'POST',
			path: `/api/v1/surveys/${v.surveyId}/members/bulk`,
			body: { text: 'STOLEN-3' }
		}
	],
	'/api/v1/surveys/[surveyId]/review': (v) => [
		{ method: 'POST', path: `/api/v1/surveys/${v.surveyId}/review`, body: { decision: 'approve' } }
	],
	'/api/v1/surveys/[surveyId]/submit': (v) => [
		{ method: 'POST', path: `/api/v1/surveys/${v.surveyId}/submit`, body: {} }
	],
	'/api/v1/tokens/[id]': (v) => [{ method: 'DELETE', path: `/api/v1/tokens/${v.tokenId}` }]
};

/** Routes whose parameter is a secret token rather than a record id: a guess opens nothing. */
const TOKEN_ROUTES: Record<string, { path: string; gone: RegExp }> = {
	'/invitations/[token]': {
		path: '/invitations/guessed-token',
		gone: /has expired, was withdrawn/
	},
	'/reset-password/[token]': {
		path: '/reset-password/guessed-token',
		gone: /expired or was already used/
	},
	'/r/[token]': { path: '/r/guessed-token', gone: /404|not valid/ },
	'/r/[token]/report.pdf': { path: '/r/guessed-token/report.pdf', gone: /not valid/ }
};

function send(client: HttpClient, probe: Probe): Promise<Response> {
	switch (probe.method) {
		case 'GET':
			return client.get(probe.path);
		case 'FORM':
			return client.postForm(probe.path, (probe.body ?? {}) as Record<string, string>);
		case 'POST':
			return client.postJson(probe.path, probe.body);
		case 'PUT':
			return client.putJson(probe.path, probe.body);
		case 'PATCH':
			return client.patchJson(probe.path, probe.body);
		case 'DELETE':
			return client.delete(probe.path);
		case 'RAW':
			return fetch(new URL(probe.path, appUrl()), {
				method: 'POST',
				body: String(probe.body),
				headers: {
					cookie: client.cookie,
					'content-type': 'text/plain',
					origin: new URL(appUrl()).origin
				}
			});
	}
}

/** Ids that exist nowhere (the largest an id parameter accepts is 4,294,967,295). */
const NOWHERE = 4_000_000_000;
const GHOST: OrganisationIds = {
	assetId: NOWHERE,
	surveyId: NOWHERE,
	memberId: NOWHERE,
	holeId: NOWHERE,
	carbonationTestId: NOWHERE,
	chlorideProfileId: NOWHERE,
	assessmentId: NOWHERE,
	membershipId: NOWHERE,
	tokenId: NOWHERE,
	exportId: NOWHERE,
	batchId: NOWHERE,
	attachmentId: NOWHERE,
	customPopulationId: NOWHERE,
	marker: 'nowhere'
};

let sequelize: Sequelize;
let other: OtherOrganisation;
let demoAdmin: HttpClient;
let demo: OrganisationIds;
let demoOptIn: number;

beforeAll(async () => {
	sequelize = testSequelize();
	other = await createOtherOrganisation(sequelize);
	demoAdmin = await signInAs('admin');
	const engineer = await signInAs('engineer');
	const made = await draftAndToken(engineer, 1);
	const exportId = await researchExportOf(demoAdmin);
	const membership = await sequelize.query<{ id: number }>(
		`SELECT m.id FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = ?`,
		{ replacements: ['engineer@kestrel-lane.example'], type: QueryTypes.SELECT, plain: true }
	);
	demoOptIn = await optInOf(1);
	const hole = await sequelize.query<{ id: number }>(
		'SELECT id FROM verification_holes WHERE member_id = 1 ORDER BY id LIMIT 1',
		{ type: QueryTypes.SELECT, plain: true }
	);
	const [attachmentId] = await sequelize.query(
		`INSERT INTO attachments (survey_id, kind, file_name, content_type, byte_size, sha256, storage_key,
		   uploaded_by_user_id, created_at) VALUES (1, 'other', 'demo.txt', 'text/plain', 1, ?, ?, 1, NOW())`,
		{ replacements: ['0'.repeat(64), `hostile/${Date.now()}`], type: QueryTypes.INSERT }
	);
	demo = {
		attachmentId: Number(attachmentId),
		batchId: 1,
		assetId: 1,
		surveyId: 1,
		memberId: 1,
		holeId: hole!.id,
		...(await insertMeasurements(sequelize, 1)),
		membershipId: membership!.id,
		...made,
		exportId,
		customPopulationId: await customPopulationOf(engineer, 1, 1),
		marker: 'Brackenfield'
	};
});

afterAll(async () => {
	// The demo draft and token were made for this test only; leave the demo data as it was.
	await sequelize.query('DELETE FROM assessment_risks WHERE assessment_id = ?', {
		replacements: [demo.assessmentId]
	});
	await sequelize.query('DELETE FROM assessments WHERE id = ?', {
		replacements: [demo.assessmentId]
	});
	await sequelize.query('DELETE FROM api_tokens WHERE id = ?', { replacements: [demo.tokenId] });
	await sequelize.query('DELETE FROM carbonation_tests WHERE id = ?', {
		replacements: [demo.carbonationTestId]
	});
	await sequelize.query('DELETE FROM chloride_profiles WHERE id = ?', {
		replacements: [demo.chlorideProfileId]
	});
	await sequelize.query('DELETE FROM research_exports WHERE id = ?', {
		replacements: [demo.exportId]
	});
	await sequelize.query('DELETE FROM custom_populations WHERE id = ?', {
		replacements: [demo.customPopulationId]
	});
	await sequelize.close();
});

describe('every route with a parameter has a hostile case', () => {
	it('the cases cover exactly the routes in src/routes', () => {
		const covered = [...Object.keys(ORG_ROUTES), ...Object.keys(TOKEN_ROUTES)].sort();
		expect(covered).toEqual(routeIdsWithParams());
	});
});

describe('the fixture is real', () => {
	it('each side reads its own asset, member and assessment (so the 404s below are scoping)', async () => {
		for (const [client, ids] of [
			[other.admin, other.ids],
			[demoAdmin, demo]
		] as const) {
			for (const path of [
				`/api/v1/assets/${ids.assetId}/populations`,
				`/api/v1/members/${ids.memberId}/cover-map`,
				`/api/v1/assessments/${ids.assessmentId}`,
				`/api/v1/surveys/${ids.surveyId}/members`,
				`/api/v1/members/${ids.memberId}/readings`,
				`/api/v1/holes/${ids.holeId}`,
				`/api/v1/research/exports/${ids.exportId}`,
				`/api/v1/imports/${ids.batchId}`,
				`/api/v1/surveys/${ids.surveyId}/attachments`
			]) {
				expect((await client.get(path)).status, path).toBe(200);
			}
		}
	});
});

describe.each([
	{
		direction: "the new organisation's admin with the demo's ids",
		attacker: () => other.admin,
		victim: () => demo,
		own: () => other.ids
	},
	{
		direction: "the demo admin with the new organisation's ids",
		attacker: () => demoAdmin,
		victim: () => other.ids,
		own: () => demo
	}
])('$direction', ({ attacker, victim, own }) => {
	it.each(Object.keys(ORG_ROUTES))('%s answers 404 and shows nothing', async (route) => {
		const probes = ORG_ROUTES[route](victim(), own());
		const ghosts = ORG_ROUTES[route](GHOST, own());
		for (const [i, probe] of probes.entries()) {
			const label = `${probe.method} ${probe.path}`;
			const response = await send(attacker(), probe);
			const text = await response.text();
			expect(text, label).not.toContain(victim().marker);
			if (probe.method === 'GET' || response.status !== 400) {
				expect(response.status, label).toBe(404);
				continue;
			}
			// A write whose body is checked before the record is looked up may answer 400, but
			// only exactly as it answers for an id that exists nowhere: the id reveals nothing.
			const ghost = await send(attacker(), ghosts[i]);
			expect(ghost.status, `${label} as for an id that does not exist`).toBe(400);
			expect(await ghost.text(), label).toBe(text);
		}
	});
});

async function optInOf(assetId: number): Promise<number> {
	const row = await sequelize.query<{ optIn: number }>(
		'SELECT research_opt_in AS optIn FROM assets WHERE id = ?',
		{ replacements: [assetId], type: QueryTypes.SELECT, plain: true }
	);
	return Number(row!.optIn);
}

describe('after the attacks', () => {
	it('no member, survey, asset or hole was added or renamed, and the batches are as they were', async () => {
		const stolen = await sequelize.query(
			`SELECT id FROM members WHERE label LIKE 'STOLEN%' UNION ALL SELECT id FROM surveys WHERE title LIKE 'Stolen%'
			 UNION ALL SELECT id FROM assets WHERE name LIKE 'Stolen%'
			 UNION ALL SELECT id FROM verification_holes WHERE label LIKE 'STOLEN%'
			 UNION ALL SELECT id FROM carbonation_tests WHERE label LIKE 'STOLEN%'
			 UNION ALL SELECT id FROM chloride_profiles WHERE label LIKE 'STOLEN%'`,
			{ type: QueryTypes.SELECT }
		);
		expect(stolen).toEqual([]);
		const states = await sequelize.query<{ state: string }>(
			'SELECT state FROM import_batches WHERE id IN (?, ?) ORDER BY id',
			{ replacements: [demo.batchId, other.ids.batchId], type: QueryTypes.SELECT }
		);
		expect(states.map((r) => r.state)).toEqual(['completed', 'pending']);
	});

	it("the victims' carbonation tests and chloride profiles are still there", async () => {
		for (const [table, key] of [
			['carbonation_tests', 'carbonationTestId'],
			['chloride_profiles', 'chlorideProfileId']
		] as const) {
			const rows = await sequelize.query(`SELECT id FROM ${table} WHERE id IN (?, ?)`, {
				replacements: [demo[key], other.ids[key]],
				type: QueryTypes.SELECT
			});
			expect(rows, table).toHaveLength(2);
		}
	});

	it("the victims' holes are still there", async () => {
		const holes = await sequelize.query('SELECT id FROM verification_holes WHERE id IN (?, ?)', {
			replacements: [demo.holeId, other.ids.holeId],
			type: QueryTypes.SELECT
		});
		expect(holes).toHaveLength(2);
	});

	it("the victims' custom populations are still there under their own names", async () => {
		const rows = await sequelize.query<{ name: string }>(
			'SELECT name FROM custom_populations WHERE id IN (?, ?)',
			{
				replacements: [demo.customPopulationId, other.ids.customPopulationId],
				type: QueryTypes.SELECT
			}
		);
		expect(rows).toHaveLength(2);
		expect(rows.map((r) => r.name)).not.toContain('Stolen');
	});

	it("the victims' research consent is as it was", async () => {
		expect(await optInOf(1)).toBe(demoOptIn);
		expect(await optInOf(other.ids.assetId)).toBe(0);
	});

	it("the victims' assessments are still drafts, their memberships and tokens still there", async () => {
		const rows = await sequelize.query<{ state: string }>(
			'SELECT state FROM assessments WHERE id IN (?, ?)',
			{ replacements: [demo.assessmentId, other.ids.assessmentId], type: QueryTypes.SELECT }
		);
		expect(rows.map((r) => r.state)).toEqual(['draft', 'draft']);
		const tokens = await sequelize.query(
			'SELECT id FROM api_tokens WHERE id IN (?, ?) AND revoked_at IS NULL',
			{
				replacements: [demo.tokenId, other.ids.tokenId],
				type: QueryTypes.SELECT
			}
		);
		expect(tokens).toHaveLength(2);
		const roles = await sequelize.query<{ role: string }>(
			'SELECT role FROM memberships WHERE id IN (?, ?) ORDER BY id',
			{
				replacements: [demo.membershipId, other.ids.membershipId],
				type: QueryTypes.SELECT
			}
		);
		expect(roles.map((r) => r.role)).toEqual(['engineer', 'admin']);
	});
});

describe('secret-token routes', () => {
	it.each(Object.keys(TOKEN_ROUTES))('%s with a guessed token opens nothing', async (route) => {
		const { path, gone } = TOKEN_ROUTES[route];
		const response = await demoAdmin.get(path);
		expect(response.status).toBeLessThan(500);
		expect(await response.text()).toMatch(gone);
	});
});
