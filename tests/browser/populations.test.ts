import type { Browser, Page } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName } from '../helpers/actors';
import { browserSignIn, canvasPixels, screenshot } from '../helpers/pages';

// c_min is drawn in Okabe–Ito vermillion (#d55e00) on every cover axis.
const VERMILLION: [number, number, number] = [213, 94, 0];

describe('the engineer looks at the car-park deck', () => {
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

	it('shows the dashboard with the assets and their standing', async () => {
		await expect(page.locator(`[data-asset="${CAR_PARK}"]`).count()).resolves.toBe(1);
		await screenshot(page, 'dashboard-engineer');
	});

	it('lists the populations with the engine’s verdicts', async () => {
		await page.goto(`/assets/${assetId}/populations`);
		const deckRow = page.locator('[data-population="deck|XD3"]');
		await deckRow.waitFor();
		await expect(
			deckRow.locator('[data-verdict]').first().getAttribute('data-verdict')
		).resolves.toMatch(/^(pass|fail|not-enough-data)$/);
		await screenshot(page, 'population-overview');
	});

	it('draws the deck histogram with the c_min line, and recomputes when the fractile changes', async () => {
		await page.locator('[data-population="deck|XD3"] a').click();
		await page.waitForURL('**/populations/detail?**');
		await page.locator('canvas[data-chart="histogram"]').waitFor();
		await page.waitForTimeout(300);
		const pixels = await canvasPixels(page, 'canvas[data-chart="histogram"]', VERMILLION);
		expect(pixels.inked).toBeGreaterThan(5000);
		// The c_min line's vermillion: the legend swatches alone give about 34 pixels (the line off
		// the axis), the drawn line more; in the demo the characteristic line (44.9 mm, black) lies
		// over most of c_min's (45.0 mm), so the visible share of the line is small.
		expect(pixels.coloured).toBeGreaterThan(60);
		await screenshot(page, 'population-detail-deck');
		const before = await page.getByTestId('characteristic').textContent();
		await page.selectOption('select[name=fractile]', '0.1');
		await page.waitForURL('**fractile=0.1**');
		await page.waitForFunction(
			(old) => document.querySelector('[data-testid=characteristic]')?.textContent !== old,
			before
		);
		const after = await page.getByTestId('characteristic').textContent();
		expect(parseFloat(after!)).toBeGreaterThan(parseFloat(before!));
		await screenshot(page, 'population-detail-deck-p10');
	});

	it('shows beside the box plot whether the members differ, and names them in the reasons', async () => {
		const table = page.getByTestId('member-differences');
		await table.waitFor();
		// The deck's members in the surveys the page includes by default: the approved ones.
		const sequelize = testSequelize();
		const [row] = await sequelize.query<{ n: number }>(
			`SELECT COUNT(*) AS n FROM members m JOIN surveys s ON s.id = m.survey_id
			  WHERE m.asset_id = ? AND m.member_type = 'deck' AND m.exposure_class = 'XD3'
			    AND s.status = 'approved'`,
			{ replacements: [assetId], type: QueryTypes.SELECT }
		);
		await sequelize.close();
		expect(Number(row.n)).toBeGreaterThan(2);
		await expect(table.locator('tbody tr').count()).resolves.toBe(Number(row.n));
		await expect(page.getByTestId('member-reasons').textContent()).resolves.toMatch(
			/Kruskal–Wallis/
		);
		await expect(page.getByTestId('mixture').textContent()).resolves.toMatch(/by EM \(seed\s+1/);
		await table.scrollIntoViewIfNeeded();
		await screenshot(page, 'population-detail-members');
	});

	it('opens a member’s cover map', async () => {
		await page.locator('a[href^="/members/"]').first().click();
		await page.waitForURL('**/members/**');
		const map = page.locator('svg[data-chart="cover-map"]');
		await map.waitFor();
		// Every cell with readings is drawn: at least one filled rectangle per cell of the grid shown.
		await expect(
			map.locator('rect[fill^="rgb"], rect[fill^="#"]').count()
		).resolves.toBeGreaterThan(100);
		await screenshot(page, 'member-cover-map');
	});
});
