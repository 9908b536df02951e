import type { Browser, Page } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName } from '../helpers/actors';
import { browserSignIn, screenshot } from '../helpers/pages';

describe('the engineer applies the check-hole calibration on a population', () => {
	let browser: Browser;
	let page: Page;
	let assetId: number;
	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		const sequelize = testSequelize();
		assetId = await assetIdByName(sequelize, CAR_PARK);
		await sequelize.close();
		browser = await launchChromium();
		page = await browserSignIn(browser, 'engineer');
	});
	afterAll(async () => {
		await browser?.close();
	});

	it('ticks the choice, sees both outcomes side by side with the sentence and the method, and the URL keeps it', async () => {
		await page.goto(`/assets/${assetId}/populations/detail?type=deck&exposure=XD3`);
		const panel = page.getByTestId('calibration-panel');
		await panel.waitFor();
		await expect(panel.getByTestId('calibration-sentence').count()).resolves.toBe(0);
		await Promise.all([
			page.waitForURL(/calibration=apply/),
			panel.getByTestId('apply-calibration').check()
		]);
		const sentence = panel.getByTestId('calibration-sentence');
		await sentence.waitFor();
		await expect(sentence.textContent()).resolves.toMatch(
			/^Applying the check-hole calibration (does not change the outcome|changes the outcome from)/
		);
		// Two verdicts: as the meter logged them and through the calibration.
		await expect(panel.locator('[data-verdict]').count()).resolves.toBe(2);
		await expect(panel.getByTestId('predicted-share').textContent()).resolves.toMatch(/ %$/);
		await expect(panel.getByTestId('calibration-method').textContent()).resolves.toMatch(
			/prediction interval/
		);
		await panel.scrollIntoViewIfNeeded();
		await screenshot(page, 'population-calibration-applied');
		await panel.screenshot({ path: `${SCREENSHOT_DIR}/population-calibration-panel.png` });
		// A reload keeps the choice: it lives in the URL.
		await page.reload();
		await page.getByTestId('calibration-sentence').waitFor();
		await expect(page.getByTestId('apply-calibration').isChecked()).resolves.toBe(true);
	});

	it('ticks the calibration when saving an assessment, and the saved assessment shows both verdicts', async () => {
		await page.goto(`/assets/${assetId}/assessments`);
		await page.getByTestId('save-calibration').locator('input[name=calibration]').check();
		await page.fill('input[name=title]', 'Car park, calibrated in the browser');
		await page
			.locator('form[action="?/save"]')
			.screenshot({ path: `${SCREENSHOT_DIR}/assessment-save-calibration.png` });
		await Promise.all([page.waitForURL('**/assessments/*'), page.click('text=Save as a draft')]);
		const section = page.getByTestId('assessment-calibration');
		await section.waitFor();
		const deck = section.locator('[data-calibrated]', { hasText: 'deck · XD3' });
		await expect(deck.getByTestId('calibration-sentence').textContent()).resolves.toMatch(
			/^Applying the check-hole calibration (does not change the outcome|changes the outcome from)/
		);
		await expect(deck.locator('[data-verdict]').count()).resolves.toBe(2);
		await expect(deck.getByTestId('calibration-line').textContent()).resolves.toMatch(
			/^From \d+ check holes: measured = /
		);
		// A population with no check holes says why, in words.
		await expect(section.textContent()).resolves.toContain('there are 0');
		await section.scrollIntoViewIfNeeded();
		await screenshot(page, 'assessment-calibration');
		await section.screenshot({ path: `${SCREENSHOT_DIR}/assessment-calibration-section.png` });
	});
});
