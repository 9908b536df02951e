import { mkdirSync, statSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import type { Sequelize } from 'sequelize';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { testSequelize } from '../helpers/database';
import { approvedCarParkAssessment } from '../helpers/assessments';
import { appUrl } from '../helpers/env';
import { DEMO_PASSWORD, DEMO_USERS, signInAs } from '../helpers/session';

describe('the demo owner in a real browser', () => {
	let browser: Browser;
	let sequelize: Sequelize;

	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		sequelize = testSequelize();
		const assessment = await approvedCarParkAssessment(sequelize, await signInAs('engineer'));
		// The owner sees the latest approval; assessments.test.ts may have approved one today.
		await assessment.update({ approvedAt: new Date() });
		browser = await launchChromium();
	});
	afterAll(async () => {
		await browser?.close();
		await sequelize?.close();
	});

	it('signs in, sees the ranked list, opens an asset and downloads the report', async () => {
		const context = await browser.newContext({
			viewport: { width: 1280, height: 900 },
			acceptDownloads: true
		});
		const page = await context.newPage();
		await page.goto(`${appUrl()}/sign-in?next=/portfolio`);
		await page.waitForLoadState('networkidle');
		await page.fill('input[name="email"]', DEMO_USERS.owner);
		await page.fill('input[name="password"]', DEMO_PASSWORD);
		await Promise.all([page.waitForURL('**/portfolio'), page.click('button[type="submit"]')]);

		const ranked = page.getByRole('list', { name: 'Parts ranked by risk, then area' });
		await expect(ranked.getByRole('listitem').first().textContent()).resolves.toContain(
			'deck · XD3'
		);
		await page.screenshot({ path: `${SCREENSHOT_DIR}/owner-portfolio.png`, fullPage: true });

		await ranked.getByRole('link', { name: 'Brackenfield Multi-storey Car Park' }).first().click();
		await page.waitForURL('**/portfolio/*');
		await page.getByRole('heading', { name: 'Risk over time' }).waitFor();
		const canvas = page.locator('canvas').first();
		await canvas.waitFor();
		// The chart drew something: the canvas has pixels that are not blank.
		const inked = await canvas.evaluate((el: HTMLCanvasElement) => {
			const data = el.getContext('2d')!.getImageData(0, 0, el.width, el.height).data;
			let count = 0;
			for (let i = 3; i < data.length; i += 4) if (data[i] > 0) count++;
			return count;
		});
		expect(inked).toBeGreaterThan(1000);
		await page.screenshot({ path: `${SCREENSHOT_DIR}/owner-asset.png`, fullPage: true });

		const [download] = await Promise.all([
			page.waitForEvent('download'),
			page.getByRole('link', { name: 'Download the report (PDF)' }).click()
		]);
		expect(download.suggestedFilename()).toMatch(
			/^fractile-brackenfield-multi-storey-car-park-assessment-\d+\.pdf$/
		);
		const saved = `test-results/browser-download.pdf`;
		await download.saveAs(saved);
		expect(statSync(saved).size).toBeGreaterThan(20_000);
		await context.close();
	});
});
