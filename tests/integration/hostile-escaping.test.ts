/**
 * Hostile input: script and markup in the names people type (member labels and notes, asset and
 * survey names, assessment titles and recommendations, token, person and organisation names)
 * come back as text on every page that shows them — never as live markup.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import { testSequelize } from '../helpers/database';
import { createOtherOrganisation, type OtherOrganisation } from '../helpers/otherOrganisation';
import { SCRIPT } from '../helpers/hostile';

let sequelize: Sequelize;
let org: OtherOrganisation;
let assessmentId: number;

/** The markup itself, unescaped, as a browser would run it. */
const LIVE = ['<script>alert("fractile")', '<img src=x onerror'];
/** What Svelte writes for the same text: the angle bracket escaped. */
const SHOWN = '&lt;script>alert("fractile")&lt;/script>';

beforeAll(async () => {
	sequelize = testSequelize();
	org = await createOtherOrganisation(sequelize);
	const { ids } = org;
	// Typed through intake's forms in real life; written here directly so that every place that
	// shows the text is checked, whichever route stored it.
	const set = (sql: string, id: number) => sequelize.query(sql, { replacements: [SCRIPT, id] });
	await set('UPDATE members SET label = ? WHERE id = ?', ids.memberId);
	await sequelize.query('UPDATE members SET notes = ? WHERE id = ?', {
		replacements: [SCRIPT, ids.memberId]
	});
	await set('UPDATE assets SET name = ? WHERE id = ?', ids.assetId);
	await set('UPDATE surveys SET title = ? WHERE id = ?', ids.surveyId);
	await sequelize.query(
		`UPDATE users u JOIN memberships m ON m.user_id = u.id SET u.display_name = ? WHERE m.id = ?`,
		{ replacements: [SCRIPT, ids.membershipId] }
	);
	await sequelize.query(
		`UPDATE organisations o JOIN memberships m ON m.organisation_id = o.id SET o.name = ? WHERE m.id = ?`,
		{ replacements: [SCRIPT, ids.membershipId] }
	);
	const saved = await org.admin.postJson(`/api/v1/assets/${ids.assetId}/assessments`, {
		title: SCRIPT,
		recommendations: SCRIPT,
		// The fixture's survey is a draft, which the default selection leaves out: name it.
		surveys: [ids.surveyId]
	});
	expect(saved.status).toBe(201);
	assessmentId = (await saved.json()).assessment.id;
	expect(
		(await org.admin.postJson('/api/v1/tokens', { name: SCRIPT, expiresInDays: 1 })).status
	).toBe(201);
});

afterAll(async () => {
	await sequelize.close();
});

const pages = () => {
	const { assetId, surveyId, memberId, membershipId } = org.ids;
	return [
		`/assets/${assetId}/edit`,
		`/surveys/${surveyId}/edit`,
		`/members/${memberId}/edit`,
		'/dashboard',
		'/account',
		'/account/tokens',
		'/organisation/members',
		`/organisation/members/${membershipId}`,
		'/organisation/audit',
		`/members/${memberId}`,
		`/assets/${assetId}/populations`,
		`/assets/${assetId}/populations?split=survey`,
		`/assets/${assetId}/populations/detail?type=deck&exposure=XD3`,
		`/assets/${assetId}/assessments`,
		`/assessments/${assessmentId}`
	];
};

describe('script and markup are shown as text', () => {
	it('no page runs the markup, and each shows the text escaped', async () => {
		for (const path of pages()) {
			const response = await org.admin.get(path);
			expect(response.status, path).toBe(200);
			const html = await response.text();
			for (const live of LIVE) expect(html, path).not.toContain(live);
			expect(html, `${path} shows the name`).toContain(SHOWN);
		}
	});

	it('JSON answers carry the text as data, and say they are JSON', async () => {
		const { assetId, memberId } = org.ids;
		for (const path of [
			`/api/v1/assets/${assetId}/populations?split=member`,
			`/api/v1/members/${memberId}/cover-map`,
			`/api/v1/assessments/${assessmentId}`
		]) {
			const response = await org.admin.get(path);
			expect(response.status, path).toBe(200);
			expect(response.headers.get('content-type'), path).toContain('application/json');
			expect(response.headers.get('x-content-type-options'), path).toBe('nosniff');
		}
	});

	it('pages carry a Content-Security-Policy that allows no inline script without a nonce', async () => {
		const response = await org.admin.get(`/members/${org.ids.memberId}`);
		const csp = response.headers.get('content-security-policy') ?? '';
		expect(csp).toMatch(/script-src 'self' 'nonce-[^']+'/);
		expect(csp).not.toContain("unsafe-inline' 'nonce");
		expect(csp).toContain("object-src 'none'");
	});
});
