import type { Browser, Page } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName } from '../helpers/actors';
import { browserSignIn, screenshot } from '../helpers/pages';

/** The demo's low bay: its cover dips over a patch (seeds/scenario.ts, deckBays). */
const LOW_BAY = 'L2-BAY-04';

describe('the engineer finds the low-cover areas of a member on its map', () => {
	let browser: Browser;
	let page: Page;
	let memberId: number;
	let assetId: number;
	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		const sequelize = testSequelize();
		assetId = await assetIdByName(sequelize, CAR_PARK);
		const [row] = await sequelize.query<{ id: number }>(
			'SELECT id FROM members WHERE label = ? ORDER BY id LIMIT 1',
			{ replacements: [LOW_BAY], type: QueryTypes.SELECT }
		);
		memberId = row.id;
		await sequelize.close();
		browser = await launchChromium();
		page = await browserSignIn(browser, 'engineer');
	});
	afterAll(async () => {
		await browser?.close();
	});

	it('draws the map to the member’s shape with its low area outlined and listed', async () => {
		await page.goto(`/members/${memberId}`);
		const map = page.locator('svg[data-chart="cover-map"]');
		await map.waitFor();
		const widthMm = Number(await map.getAttribute('data-width-mm'));
		const heightMm = Number(await map.getAttribute('data-height-mm'));
		// The plot area is the first rect after the cells: the member's outline.
		const frame = await map.evaluate((svg) => {
			const outline = [...svg.querySelectorAll('rect')].find(
				(r) => r.getAttribute('fill') === 'none'
			)!;
			const box = outline.getBoundingClientRect();
			return { width: box.width, height: box.height };
		});
		// Drawn to scale: the outline's width over height is the member's, within a pixel.
		expect(frame.width / frame.height).toBeCloseTo(widthMm / heightMm, 1);
		expect(await map.locator('[data-low-area]').count()).toBeGreaterThanOrEqual(1);
		const list = page.getByTestId('low-areas');
		await expect(list.locator('tbody tr').count()).resolves.toBeGreaterThanOrEqual(1);
		await expect(list.locator('h2').textContent()).resolves.toMatch(/m² in all/);
		await screenshot(page, 'member-low-cover-areas');
		// Single cells and areas under the smallest area listed are counted as small spots, not
		// outlined; 0 lists and outlines every area.
		const listed = await list.locator('tbody tr').count();
		const outlined = await map.locator('[data-low-area]').count();
		expect(outlined).toBe(listed);
		await list.getByTestId('min-area').fill('0');
		await expect
			.poll(() => list.locator('tbody tr').count(), { timeout: 5000 })
			.toBeGreaterThan(listed);
		await expect(map.locator('[data-low-area]').count()).resolves.toBe(
			await list.locator('tbody tr').count()
		);
		await list.getByTestId('min-area').fill('');
		// A threshold typed in redraws the areas against it (the number input's value is a number).
		await list.getByLabel('Threshold (mm)').fill('40');
		await expect
			.poll(() => list.locator('h2').textContent(), { timeout: 5000 })
			.toMatch(/below 40 mm/);
		await list.getByLabel('Threshold (mm)').fill('');
	});

	it('splits the low bay out of the deck and shows two verdicts, then the bay’s outlined map', async () => {
		await page.goto(`/assets/${assetId}/populations/detail?type=deck&exposure=XD3`);
		const form = page.getByTestId('split-members');
		await form.waitFor();
		await form.getByLabel(LOW_BAY).check();
		const name = `Low bay ${Date.now()}`;
		await form.getByLabel('Name of the new population').fill(name);
		await Promise.all([
			page.waitForURL(new RegExp(`/assets/${assetId}/populations(\\?.*)?$`)),
			form.getByRole('button', { name: /Split out/ }).click()
		]);
		const made = page.getByTestId('custom-populations');
		await made.waitFor();
		const heading = made.locator('h3', { hasText: name });
		await expect(heading.textContent()).resolves.toMatch(
			/split from deck · XD3: 1 member taken out/
		);
		const customId = await heading.getAttribute('data-custom');
		const bay = made.locator(`[data-population="deck|XD3|custom:${customId}"]`);
		const rest = made.locator(`[data-population="deck|XD3|custom:${customId}:rest"]`);
		const verdictOf = (row: typeof bay) =>
			row.locator('[data-verdict]').first().getAttribute('data-verdict');
		// The bay with its low patch does not comply; the other bays of the deck, judged apart, do.
		await expect(verdictOf(bay)).resolves.toBe('fail');
		await expect(verdictOf(rest)).resolves.toBe('pass');
		await heading.scrollIntoViewIfNeeded();
		await screenshot(page, 'custom-population-split');

		// The split's own page, shared by its URL, lists the bay; its map shows the low area.
		await bay.locator('a').first().click();
		await page.waitForURL(`**/populations/detail?*custom=${customId}*`);
		await page.locator(`a[href="/members/${memberId}"]`).click();
		const map = page.locator('svg[data-chart="cover-map"]');
		await map.waitFor();
		await expect(map.locator('[data-low-area]').count()).resolves.toBeGreaterThanOrEqual(1);
		await screenshot(page, 'custom-population-bay-map');
	});
});
