import { mkdirSync } from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { appUrl } from '../helpers/env';
import { actorFor, freshSurvey, testSequelize } from '../helpers/intake';
import { DEMO_USERS } from '../helpers/session';
import { browserSignIn, canvasPixels, screenshot } from '../helpers/pages';
import { OKABE_ITO } from '../../src/lib/charts/palette';

describe('the survey plan page in chromium (the built app)', () => {
	let browser: Browser;
	let page: Page;
	let sequelize: Sequelize;
	let surveyId: number;
	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		sequelize = testSequelize();
		browser = await launchChromium();
		page = await browserSignIn(browser, 'engineer');
		const { survey } = await freshSurvey(await actorFor(DEMO_USERS.engineer), [
			'P-01',
			'P-02',
			'P-03',
			'P-04'
		]);
		surveyId = survey.id;
	});
	afterAll(async () => {
		await browser?.close();
		await sequelize?.close();
	});

	it('is linked from the survey page, proposes the populations and saves a plan with its curves', async () => {
		await page.goto(`${appUrl()}/surveys/${surveyId}`, { waitUntil: 'networkidle' });
		await Promise.all([
			page.waitForURL(`**/surveys/${surveyId}/plan`),
			page.getByRole('link', { name: 'Survey plan' }).click()
		]);
		await page.waitForLoadState('networkidle');
		// One population proposed from the four slab × XC3 members.
		expect(await page.inputValue('input[aria-label="Exposure class, row 1"]')).toBe('XC3');
		expect(await page.inputValue('input[aria-label="memberCount, row 1"]')).toBe('4');
		await page.fill('input[name=replicates]', '80');
		await page.fill('input[name=p1]', '0.08');
		await Promise.all([
			page.waitForResponse((r) => r.url().includes('?/save')),
			page.getByRole('button', { name: 'Compute and save the plan' }).click()
		]);
		await page.getByText('Plan saved.').waitFor();
		await page.waitForLoadState('networkidle');
		await expect(page.getByRole('heading', { name: 'slab × XC3' }).isVisible()).resolves.toBe(true);
		expect(await page.getByText('— governs').count()).toBe(1);
		const caption = await page.locator('figcaption').first().innerText();
		expect(caption).toContain('exact, binomial');
		expect(caption).toContain('exact, noncentral t, normal model');
		expect(caption).toContain('seeded simulation');
		// The first curve (Okabe–Ito blue) is drawn on the canvas.
		const { inked, coloured } = await canvasPixels(page, 'figure canvas', [0, 114, 178]);
		expect(OKABE_ITO.blue).toBe('#0072b2');
		expect(inked).toBeGreaterThan(1000);
		expect(coloured).toBeGreaterThan(50);
		expect(await page.locator('tbody tr', { hasText: 'P-01' }).innerText()).toMatch(/to go/);
		await screenshot(page, 'survey-plan');
	});

	it('shows a surveyor the saved plan and its site sheet, without the form', async () => {
		const surveyor = await browserSignIn(browser, 'surveyor');
		await surveyor.goto(`${appUrl()}/surveys/${surveyId}/plan`, { waitUntil: 'networkidle' });
		await expect(
			surveyor.getByRole('link', { name: 'Site sheet (PDF)' }).isVisible()
		).resolves.toBe(true);
		expect(await surveyor.getByRole('button', { name: 'Compute and save the plan' }).count()).toBe(
			0
		);
		await surveyor.context().close();
	});
});
