import type { Browser } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Member } from '../../src/lib/server/db';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName } from '../helpers/actors';
import { addReadings, removeReadings } from '../helpers/readings';
import { browserSignIn, screenshot } from '../helpers/pages';

describe('signing an assessment off', () => {
	let browser: Browser;
	let assetId: number;
	let assessmentPath = '';
	const sequelize = testSequelize();
	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		assetId = await assetIdByName(sequelize, CAR_PARK);
		browser = await launchChromium();
	});
	afterAll(async () => {
		await browser?.close();
		await sequelize.close();
	});

	it('the engineer prepares, a second person approves, and a later import leaves it as signed', async () => {
		const preparer = await browserSignIn(browser, 'engineer');
		await preparer.goto(`/assets/${assetId}/assessments`);
		await preparer.fill('input[name=title]', 'Car park, browser sign-off');
		await Promise.all([
			preparer.waitForURL('**/assessments/*'),
			preparer.click('text=Save as a draft')
		]);
		assessmentPath = new URL(preparer.url()).pathname;
		// The organisation asks a second engineer: the preparer is told so and offered no button.
		expect(await preparer.getByTestId('approve').count()).toBe(0);
		expect(await preparer.getByTestId('second-approver-note').textContent()).toContain(
			'second engineer'
		);
		await preparer.context().close();
		const page = await browserSignIn(browser, 'admin');
		await page.goto(assessmentPath);
		await Promise.all([page.waitForLoadState('load'), page.getByTestId('approve').click()]);
		await page.waitForSelector('[data-testid=assessment-state][data-state=approved]');
		expect(await page.getByTestId('prepared-by').textContent()).not.toBe(
			await page.getByTestId('approved-by').textContent()
		);
		const sha = await page.getByTestId('snapshot-sha').textContent();
		const deckN = await page.locator('[data-population="deck|XD3"] [data-testid=n]').textContent();
		await screenshot(page, 'assessment-approved');

		// A member of the approved survey: the populations page includes approved surveys by default.
		const member = await Member.findOne({ where: { assetId, label: 'L2-BAY-01' } });
		const batchId = await addReadings(
			member!.surveyId,
			member!.id,
			Array.from({ length: 40 }, (_, i) => ({ xMm: 20 * i, yMm: 20, coverMm: 20 })),
			'later.csv'
		);

		await page.reload();
		expect(await page.getByTestId('snapshot-sha').textContent()).toBe(sha);
		expect(await page.locator('[data-population="deck|XD3"] [data-testid=n]').textContent()).toBe(
			deckN
		);
		await page.goto(`/assets/${assetId}/populations`);
		const liveN = page.locator('[data-population="deck|XD3"] td').first();
		await liveN.waitFor();
		expect(Number(await liveN.textContent())).toBe(Number(deckN) + 40);
		await removeReadings(batchId);
		await page.context().close();
	});

	it('the surveyor sees no approve button and the API refuses', async () => {
		const page = await browserSignIn(browser, 'surveyor');
		await screenshot(page, 'dashboard-surveyor');
		await page.goto(`/assets/${assetId}/populations/detail?type=deck&exposure=XD3`);
		await page.locator('canvas[data-chart="histogram"]').waitFor();
		expect(await page.getByTestId('approve').count()).toBe(0);
		const response = await page.goto(assessmentPath);
		expect(response!.status()).toBe(403);
		expect(await page.getByTestId('approve').count()).toBe(0);
		await screenshot(page, 'surveyor-assessment-refused');
		const id = assessmentPath.split('/').pop();
		const api = await page.request.post(`/api/v1/assessments/${id}/approve`, { data: {} });
		expect(api.status()).toBe(403);
		await page.context().close();
	});
});
