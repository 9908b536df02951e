import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import { AuditEvent, ReportLink, type Assessment } from '../../src/lib/server/db/models';
import { testSequelize } from '../helpers/database';
import { approvedCarParkAssessment } from '../helpers/assessments';
import { linkIn, waitForMail } from '../helpers/mail';
import { anonymousClient, signInAs, type HttpClient } from '../helpers/session';

const recipient = () => `client-${Date.now()}-${Math.round(Math.random() * 1e6)}@northmoor.example`;

describe('sharing a report as an expiring, revocable link', () => {
	let sequelize: Sequelize;
	let assessment: Assessment;
	let engineer: HttpClient;
	let page: string;

	async function send(email: string): Promise<string> {
		const response = await engineer.postForm(page + '?/share', {
			assessment: String(assessment.id),
			email,
			days: '14',
			view: 'report'
		});
		expect(response.status).toBe(303);
		const link = linkIn(await waitForMail(email), '/r/');
		return link.replace(/#.*$/, '');
	}

	beforeAll(async () => {
		sequelize = testSequelize();
		engineer = await signInAs('engineer');
		assessment = await approvedCarParkAssessment(sequelize, engineer);
		page = `/portfolio/${assessment.assetId}`;
	});
	afterAll(async () => {
		await sequelize.close();
	});

	it('opens without an account, shows that report only, and records every open', async () => {
		const path = await send(recipient());
		const before = await AuditEvent.count({ where: { action: 'report.link_opened' } });
		const anonymous = anonymousClient();
		const view = await anonymous.get(path);
		expect(view.status).toBe(200);
		const html = await view.text();
		expect(html).toContain('Brackenfield Multi-storey Car Park');
		expect(html).not.toContain('Orchard Row Office Building');
		const pdf = await anonymous.get(`${path}/report.pdf`);
		expect(pdf.status).toBe(200);
		expect(pdf.headers.get('content-type')).toBe('application/pdf');
		expect(await AuditEvent.count({ where: { action: 'report.link_opened' } })).toBe(before + 2);
		const link = await ReportLink.findOne({
			where: { assessmentId: assessment.id },
			order: [['id', 'DESC']]
		});
		expect(link!.lastOpenedAt).not.toBeNull();
		expect(link!.tokenHash).toMatch(/^[0-9a-f]{64}$/);
		expect(path).not.toContain(link!.tokenHash);
		const days = (link!.expiresAt.getTime() - Date.now()) / 86_400_000;
		expect(days).toBeGreaterThan(13.9);
		expect(days).toBeLessThanOrEqual(14);
	});

	it('refuses a revoked link', async () => {
		const email = recipient();
		const path = await send(email);
		const link = await ReportLink.findOne({ where: { recipientEmail: email } });
		const response = await engineer.postForm(page + '?/revoke', {
			assessment: String(assessment.id),
			link: String(link!.id)
		});
		expect(response.status).toBe(303);
		expect((await anonymousClient().get(path)).status).toBe(410);
		expect((await anonymousClient().get(`${path}/report.pdf`)).status).toBe(410);
	});

	it('refuses an expired link', async () => {
		const email = recipient();
		const path = await send(email);
		await ReportLink.update(
			{ expiresAt: new Date(Date.now() - 1000) },
			{ where: { recipientEmail: email } }
		);
		expect((await anonymousClient().get(path)).status).toBe(410);
	});

	it('refuses an unknown token, and an owner may not send links', async () => {
		expect((await anonymousClient().get('/r/not-a-real-token-at-all-000000')).status).toBe(404);
		const owner = await signInAs('owner');
		const response = await owner.postForm(page + '?/share', {
			assessment: String(assessment.id),
			email: recipient()
		});
		expect(response.status).toBe(403);
	});

	it('explains a bad address beside the field', async () => {
		const response = await engineer.postForm(page + '?/share', {
			assessment: String(assessment.id),
			email: 'not an address'
		});
		expect(response.status).toBe(400);
		expect(await response.text()).toContain('Enter the recipient’s e-mail address.');
	});
});
