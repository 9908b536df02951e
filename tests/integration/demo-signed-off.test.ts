import { execFileSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { demoAssessments } from '../../seeds/scenario';
import { testSequelize } from '../helpers/database';
import { assetIdByName } from '../helpers/actors';
import { signInAs, type HttpClient } from '../helpers/session';

const JSON_ACCEPT = { accept: 'application/json' };
const OUT = 'test-results';

interface Summary {
	id: number;
	title: string;
	state: string;
	createdBy: string | null;
	approvedBy: string | null;
	approvedAt: string | null;
}

/**
 * Signed off by the seed. Files that run earlier on the shared database may supersede it (that
 * needs an approved one), so 'superseded' is accepted; it was approved all the same. The seed's
 * own test, on a database of its own, checks that each is approved.
 */
function expectSignedOff(summary: Summary) {
	expect(['approved', 'superseded']).toContain(summary.state);
	// Prepared by the demo engineer, approved by a second person (the organisation's rule).
	expect(summary.createdBy).toBe('Imogen Hartley');
	expect(summary.approvedBy).toBe('Priya Castellane');
	expect(summary.approvedAt).not.toBeNull();
}

/** The seeded assessment of a plan, as the API lists it to this client. */
async function seeded(client: HttpClient, assetId: number, title: string): Promise<Summary> {
	const response = await client.get(`/api/v1/assets/${assetId}/assessments`, JSON_ACCEPT);
	expect(response.status).toBe(200);
	const { assessments } = (await response.json()) as { assessments: Summary[] };
	const found = assessments.find((a) => a.title === title);
	expect(found, title).toBeDefined();
	return found!;
}

describe('the demo as loaded: one approved assessment per asset, shared with the owner', () => {
	let sequelize: Sequelize;
	let assetIds: number[];

	beforeAll(async () => {
		mkdirSync(OUT, { recursive: true });
		sequelize = testSequelize();
		assetIds = await Promise.all(demoAssessments.map((p) => assetIdByName(sequelize, p.assetName)));
	});
	afterAll(async () => {
		await sequelize.close();
	});

	it('ranks the parts of all three structures on the owner’s portfolio', async () => {
		const owner = await signInAs('owner');
		const response = await owner.get('/portfolio');
		expect(response.status).toBe(200);
		const html = await response.text();
		const all = html.slice(html.indexOf('All structures'));
		for (const plan of demoAssessments) expect(all).toContain(plan.assetName);
		expect(all).not.toContain('No approved assessment yet.');
		const ranked = html.slice(html.indexOf('Look at first'), html.indexOf('All structures'));
		expect(ranked).toContain('Parts ranked by risk, then area');
		// Every structure has at least one ranked part (the list shows ten at most).
		for (const plan of demoAssessments) expect(ranked).toContain(plan.assetName);
	});

	it('lets the owner read each one and download its report with content', async () => {
		const owner = await signInAs('owner');
		for (const [i, plan] of demoAssessments.entries()) {
			const summary = await seeded(owner, assetIds[i], plan.title);
			expectSignedOff(summary);
			const report = await owner.get(`/api/v1/assessments/${summary.id}/report`);
			expect(report.status).toBe(200);
			expect(report.headers.get('content-type')).toBe('application/pdf');
			const file = `${OUT}/demo-report-${i + 1}.pdf`;
			writeFileSync(file, Buffer.from(await report.arrayBuffer()));
			const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
			expect(text).toContain(plan.assetName);
			expect(text).toMatch(/Verdict: (Does not comply|Complies|Too few readings)/);
			// The recommendations the engineer signed, first words (the PDF wraps lines).
			expect(text).toContain(plan.recommendations.split(' ').slice(0, 4).join(' '));
			expect(text).toContain('Decision support, not a decision.');
		}
	});

	it('shows the engineer the approved assessment, saved and approved through the audited services', async () => {
		const engineer = await signInAs('engineer');
		const plan = demoAssessments[0];
		const summary = await seeded(engineer, assetIds[0], plan.title);
		expectSignedOff(summary);
		const detail = await engineer.get(`/api/v1/assessments/${summary.id}`, JSON_ACCEPT);
		expect(detail.status).toBe(200);
		const body = await detail.json();
		expect(body.assessment.snapshot.populations.length).toBeGreaterThan(0);
		const actions = await sequelize.query<{ action: string }>(
			`SELECT action FROM audit_events WHERE subject_type = 'assessment' AND subject_id = ?
			  ORDER BY id`,
			{ replacements: [String(summary.id)], type: QueryTypes.SELECT }
		);
		expect(actions.map((a) => a.action).slice(0, 2)).toEqual([
			'assessment.saved',
			'assessment.approved'
		]);
	});

	it('shows the measured chloride profiles of the car park and carbonation tests of the office', async () => {
		const engineer = await signInAs('engineer');
		for (const [plan, words] of [
			[demoAssessments[0], ['Chloride profile CP-03', 'L2-COL-C1', 'outermost: left out of fits']],
			[demoAssessments[1], ['CT-12', 'B-502', 'from the 5 readings', 'as read']]
		] as const) {
			const [survey] = await sequelize.query<{ id: number }>(
				'SELECT id FROM surveys WHERE title = ?',
				{ replacements: [plan.surveyTitle], type: QueryTypes.SELECT }
			);
			const response = await engineer.get(`/surveys/${survey.id}/measurements`);
			expect(response.status).toBe(200);
			const html = await response.text();
			for (const word of words) expect(html, word).toContain(word);
		}
	});
});
