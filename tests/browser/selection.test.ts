import type { Browser } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName } from '../helpers/actors';
import { browserSignIn, screenshot } from '../helpers/pages';

describe('what is signed is what was seen', () => {
	let browser: Browser;
	const sequelize = testSequelize();
	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		browser = await launchChromium();
	});
	afterAll(async () => {
		await browser?.close();
		await sequelize.close();
	});

	it('filters the car park to one survey and other methods, saves, and the snapshot holds exactly those', async () => {
		const assetId = await assetIdByName(sequelize, CAR_PARK);
		const surveys = await sequelize.query<{ id: number; status: string; title: string }>(
			'SELECT id, status, title FROM surveys WHERE asset_id = ? ORDER BY id',
			{ replacements: [assetId], type: QueryTypes.SELECT }
		);
		const approved = surveys.find((s) => s.status === 'approved')!;
		const other = surveys.find((s) => s.status !== 'approved')!;
		const page = await browserSignIn(browser, 'engineer');
		await page.goto(`/assets/${assetId}/populations?method=tolerance&fractile=0.1`);
		await page.locator('[data-testid=selection-words]').waitFor();
		const picker = page.getByTestId('survey-picker');
		// By default the approved survey only; tick the other and untick the approved one.
		// The choice is written into the URL in place (history.replaceState): poll for it.
		const urlSurveys = () => new URL(page.url()).searchParams.get('surveys');
		await picker.getByRole('checkbox', { name: other.title }).check();
		await expect.poll(urlSurveys).toBe([approved.id, other.id].sort((a, b) => a - b).join(','));
		await picker.getByRole('checkbox', { name: approved.title }).uncheck();
		await expect.poll(urlSurveys).toBe(String(other.id));
		await page.locator('[data-population="deck|XD3"]').waitFor();
		// The words follow the new selection once its figures arrive: poll for them.
		await expect
			.poll(() => page.getByTestId('selection-words').textContent())
			.toMatch(/not approved/);
		await screenshot(page, 'population-one-survey');
		await Promise.all([
			page.waitForURL('**/assessments?query=*'),
			page.getByTestId('to-assessments').click()
		]);
		const preview = page.getByTestId('save-preview');
		expect(await preview.locator(`[data-survey="${other.id}"]`).count()).toBe(1);
		expect(await preview.locator(`[data-survey="${approved.id}"]`).count()).toBe(0);
		const previewReadings = Number(await page.getByTestId('save-preview-readings').textContent());
		await screenshot(page, 'assessment-save-preview');
		await page.fill('input[name=title]', 'Roof only, tolerance at 10 %');
		await Promise.all([page.waitForURL('**/assessments/*'), page.click('text=Save as a draft')]);
		const id = Number(new URL(page.url()).pathname.split('/').pop());
		const row = await sequelize.query<{ snapshot: string }>(
			'SELECT snapshot FROM assessments WHERE id = ?',
			{ replacements: [id], type: QueryTypes.SELECT, plain: true }
		);
		const snapshot = JSON.parse(row!.snapshot);
		const counted = await sequelize.query<{ n: number }>(
			`SELECT COUNT(*) AS n FROM readings r JOIN members m ON m.id = r.member_id
			  WHERE m.survey_id = ?`,
			{ replacements: [other.id], type: QueryTypes.SELECT, plain: true }
		);
		expect(snapshot.scope.surveyIds).toEqual([other.id]);
		expect(snapshot.surveys.map((s: { id: number }) => s.id)).toEqual([other.id]);
		expect(snapshot.readingCount).toBe(Number(counted!.n));
		expect(snapshot.readingCount).toBe(previewReadings);
		expect(snapshot.methods).toMatchObject({ method: 'tolerance', fractile: 0.1 });
		expect(snapshot.populations[0].assessment.options).toMatchObject({
			characteristicMethod: 'tolerance',
			fractileP: 0.1
		});
		expect(await page.getByTestId('snapshot-surveys').textContent()).toContain(other.title);
		await screenshot(page, 'assessment-one-survey');
		await page.context().close();
	});
});
