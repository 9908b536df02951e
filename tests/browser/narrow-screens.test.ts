import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { QueryTypes, type Sequelize } from 'sequelize';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { signedInContext } from '../helpers/browserSession';
import { testSequelize } from '../helpers/database';
import { appUrl } from '../helpers/env';
import type { DemoRole } from '../helpers/session';

/**
 * Every main page is usable on a tablet (768 px) and a phone (390 px): the page body never
 * scrolls sideways (wide tables scroll inside their own frame), and a screenshot of each is kept
 * for a person to look at. 390 px is a common phone width in CSS pixels (common practice).
 */
const WIDTHS = [768, 390] as const;

interface Ids {
	assetId: number;
	surveyId: number;
	memberId: number;
	assessmentId: number;
}

async function demoIds(sequelize: Sequelize): Promise<Ids> {
	const one = async (sql: string) =>
		(await sequelize.query<{ id: number }>(sql, { type: QueryTypes.SELECT, plain: true }))!.id;
	const assetId = await one(
		"SELECT id FROM assets WHERE name = 'Brackenfield Multi-storey Car Park'"
	);
	const surveyId = await one(
		`SELECT id FROM surveys WHERE asset_id = ${assetId} ORDER BY survey_date, id LIMIT 1`
	);
	const memberId = await one(`SELECT id FROM members WHERE survey_id = ${surveyId} LIMIT 1`);
	const assessmentId = await one(
		`SELECT id FROM assessments WHERE asset_id = ${assetId} AND state = 'approved' ORDER BY id DESC LIMIT 1`
	);
	return { assetId, surveyId, memberId, assessmentId };
}

/** The main pages of each role, by name (the screenshot's) and address. */
function pagesOf(role: DemoRole, ids: Ids): [string, string][] {
	const { assetId, surveyId, memberId, assessmentId } = ids;
	const populations = `/assets/${assetId}/populations`;
	switch (role) {
		case 'surveyor':
			return [
				['dashboard', '/dashboard'],
				['assets', '/assets'],
				['asset', `/assets/${assetId}`],
				['survey', `/surveys/${surveyId}`],
				['member', `/members/${memberId}`],
				['member-edit', `/members/${memberId}/edit`],
				['populations', populations]
			];
		case 'engineer':
			return [
				['dashboard', '/dashboard'],
				['populations', populations],
				['population', `${populations}/detail?type=slab&exposure=XD3`],
				['assessments', `/assets/${assetId}/assessments`],
				['assessment', `/assessments/${assessmentId}`],
				['measurements', `/surveys/${surveyId}/measurements`]
			];
		case 'owner':
			return [
				['portfolio', '/portfolio'],
				['portfolio-asset', `/portfolio/${assetId}`],
				['asset', `/assets/${assetId}`],
				['assessment', `/assessments/${assessmentId}`]
			];
		case 'admin':
			return [
				['members', '/organisation/members'],
				['audit', '/organisation/audit'],
				['research-consent', '/organisation/research-consent'],
				['tokens', '/account/tokens'],
				['api-reference', '/docs/api']
			];
		case 'researcher':
			return [
				['dashboard', '/dashboard'],
				['research', '/research']
			];
	}
}

describe('main pages at tablet and phone widths', () => {
	let browser: Browser;
	let sequelize: Sequelize;
	let ids: Ids;

	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		sequelize = testSequelize();
		ids = await demoIds(sequelize);
		browser = await launchChromium();
	});
	afterAll(async () => {
		await browser?.close();
		await sequelize?.close();
	});

	for (const role of ['surveyor', 'engineer', 'owner', 'admin', 'researcher'] as const) {
		it(`as ${role}: no page is wider than the screen`, async () => {
			const context = await signedInContext(browser, role);
			const page = await context.newPage();
			const overflowing: string[] = [];
			for (const [name, path] of pagesOf(role, ids)) {
				for (const width of WIDTHS) {
					await page.setViewportSize({ width, height: 900 });
					const response = await page.goto(`${appUrl()}${path}`);
					expect(response?.status(), `${path} as ${role}`).toBe(200);
					await page.waitForLoadState('networkidle');
					await page.screenshot({
						path: `${SCREENSHOT_DIR}/narrow-${role}-${name}-${width}.png`,
						fullPage: true
					});
					const { scrollWidth, viewport } = await page.evaluate(() => ({
						scrollWidth: document.documentElement.scrollWidth,
						viewport: window.innerWidth
					}));
					if (scrollWidth > viewport) {
						overflowing.push(`${path} at ${width} px: ${scrollWidth} px wide`);
					}
				}
			}
			await context.close();
			expect(overflowing).toEqual([]);
		}, 180_000);
	}

	it('prints c_min as written in table headings, not upper-cased', async () => {
		const context = await signedInContext(browser, 'surveyor');
		const page = await context.newPage();
		await page.goto(`${appUrl()}/surveys/${ids.surveyId}`);
		const heading = page.locator('th', { hasText: 'c_min' }).first();
		expect(await heading.evaluate((th) => getComputedStyle(th).textTransform)).toBe('none');
		expect(await heading.innerText()).toContain('c_min');
		await context.close();
	});

	it('keeps c_min and the reasons of every population in view at 768 and 390 px', async () => {
		const context = await signedInContext(browser, 'engineer');
		const page = await context.newPage();
		for (const width of [768, 390]) {
			await page.setViewportSize({ width, height: 900 });
			await page.goto(`${appUrl()}/assets/${ids.assetId}/populations`);
			const row = page.locator('[data-testid=population-table] tbody tr').first();
			for (const label of ['c_min', 'Why']) {
				const box = await row.locator(`td[data-label="${label}"]`).boundingBox();
				expect(box, `${label} at ${width} px`).not.toBeNull();
				expect(box!.x, `${label} at ${width} px`).toBeGreaterThanOrEqual(0);
				expect(box!.x + box!.width, `${label} at ${width} px`).toBeLessThanOrEqual(width);
			}
			await page.screenshot({ path: `${SCREENSHOT_DIR}/narrow-population-table-${width}.png` });
		}
		await context.close();
	});
});
