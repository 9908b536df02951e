import { mkdirSync } from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { signedInContext } from '../helpers/browserSession';
import { appUrl } from '../helpers/env';
import { identifyingTextsIn } from '../helpers/research';
import { demoPeople } from '../../seeds/scenario';

let browser: Browser;

beforeAll(async () => {
	mkdirSync(SCREENSHOT_DIR, { recursive: true });
	browser = await launchChromium();
});
afterAll(() => browser?.close());

/** Pixels of a canvas that are not blank, read in the page. */
function drawnPixels(page: Page, index: number): Promise<number> {
	return page.evaluate((i) => {
		const canvas = document.querySelectorAll('canvas')[i] as HTMLCanvasElement;
		const data = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
		let count = 0;
		for (let p = 3; p < data.length; p += 4) if (data[p] !== 0) count++;
		return count;
	}, index);
}

const readingCount = (page: Page) =>
	page.locator('[data-testid="selection-summary"] dd').first().innerText();

describe('research explorer in chromium', () => {
	it('draws both populations, filters through the URL and shows nothing identifying', async () => {
		const context = await signedInContext(browser, 'researcher');
		const page = await context.newPage();
		await page.goto(`${appUrl()}/research`, { waitUntil: 'networkidle' });
		await page.waitForSelector('canvas');
		expect(await page.locator('canvas').count()).toBe(3);
		expect(await drawnPixels(page, 0)).toBeGreaterThan(1000);
		expect(await drawnPixels(page, 1)).toBeGreaterThan(1000);
		expect(await drawnPixels(page, 2)).toBeGreaterThan(1000);
		const allReadings = await readingCount(page);
		await page.screenshot({ path: `${SCREENSHOT_DIR}/research-explorer.png`, fullPage: true });

		await page.getByLabel('deck', { exact: true }).check();
		await page.waitForURL(/memberType=deck/);
		await page.waitForFunction(
			(before) =>
				document.querySelector('[data-testid="selection-summary"] dd')?.textContent?.trim() !==
				before,
			allReadings
		);
		expect(Number(await readingCount(page))).toBeLessThan(Number(allReadings));
		expect(await page.locator('[data-testid="group-table"] tbody tr').count()).toBe(1);
		// Visible text only: the markup's CSS classes (col-span-3, p-1) would match short member labels.
		// The page's frame rightly shows the researcher's own name and organisation, and no one else's.
		const own = demoPeople.find((p) => p.role === 'researcher')!;
		const text = await page.locator('body').innerText();
		expect(identifyingTextsIn(text, [own.displayName, own.email, own.organisation])).toEqual([]);
		await page.screenshot({
			path: `${SCREENSHOT_DIR}/research-explorer-decks.png`,
			fullPage: true
		});
		await context.close();
	});

	it("shows the owner's admin a consent control per asset, and the API reference renders", async () => {
		const context = await signedInContext(browser, 'admin');
		const page = await context.newPage();
		await page.goto(`${appUrl()}/organisation/research-consent`, { waitUntil: 'networkidle' });
		// One row per asset of the organisation: the demo's three, and any that earlier tests made.
		const rowOf = (name: string) =>
			page.locator('[data-testid="consent-table"] tbody tr', { hasText: name });
		expect(await rowOf('Brackenfield Multi-storey Car Park').count()).toBe(1);
		expect(await rowOf('Orchard Row Office Building').count()).toBe(1);
		// The demo's footbridge is the one asset not opted in.
		await expect
			.poll(() => rowOf('Millrace Footbridge').getByText('✗ Not opted in').count())
			.toBe(1);
		await page.screenshot({ path: `${SCREENSHOT_DIR}/research-consent.png`, fullPage: true });
		await page.goto(`${appUrl()}/docs/api`, { waitUntil: 'networkidle' });
		expect(await page.locator('article').count()).toBeGreaterThanOrEqual(14);
		await page.screenshot({ path: `${SCREENSHOT_DIR}/api-docs.png`, fullPage: true });
		await context.close();
	});
});
