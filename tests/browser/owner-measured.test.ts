import { execFileSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { appUrl } from '../helpers/env';
import { DEMO_PASSWORD, DEMO_USERS } from '../helpers/session';

/**
 * The owner's path on the demo as seeded (one approved assessment a structure, made from the
 * demo's chloride profiles and carbonation tests): the ranked portfolio, the risk chart with a
 * band from the measured fronts, and the report, read back as text.
 */
describe('the demo owner sees risk from what was measured', () => {
	let browser: Browser;

	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		browser = await launchChromium();
	});
	afterAll(async () => {
		await browser?.close();
	});

	it('portfolio, band on the chart, and a report whose inputs are measured and fitted', async () => {
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
		expect(await ranked.getByRole('listitem').count()).toBeGreaterThan(3);

		await ranked.getByRole('link', { name: 'Brackenfield Multi-storey Car Park' }).first().click();
		await page.waitForURL('**/portfolio/*');
		await page.getByRole('heading', { name: 'Risk over time' }).waitFor();
		await expect(page.getByTestId('measured').first().textContent()).resolves.toMatch(
			/^\s*Measured: from 6 fitted chloride profiles/
		);
		await expect(page.getByTestId('sensitivity').first().textContent()).resolves.toMatch(
			/Most telling input/
		);
		await expect(page.getByTestId('convention').textContent()).resolves.toMatch(
			/cover is less than the depth/
		);
		const canvas = page.locator('canvas').first();
		await canvas.waitFor();
		await page.waitForTimeout(300);
		// The band: pixels of a series colour laid on at the band's 18 % opacity (alpha ≈ 46 of
		// 255; where two bands overlap, more), not the opaque line.
		const banded = await canvas.evaluate((el: HTMLCanvasElement) => {
			const data = el.getContext('2d')!.getImageData(0, 0, el.width, el.height).data;
			let count = 0;
			for (let i = 0; i < data.length; i += 4) if (data[i + 3] >= 30 && data[i + 3] <= 90) count++;
			return count;
		});
		// Antialiased line edges give a few thousand such pixels; the bands give tens of thousands.
		expect(banded).toBeGreaterThan(20_000);
		await page.getByText('The same figures as a table').click();
		await expect(page.locator('details table').textContent()).resolves.toMatch(
			/\d+\.\d %\s*\(\d+ %–\d+ %\)/
		);
		await page.screenshot({ path: `${SCREENSHOT_DIR}/owner-measured-asset.png`, fullPage: true });

		const [download] = await Promise.all([
			page.waitForEvent('download'),
			page.getByRole('link', { name: 'Download the report (PDF)' }).click()
		]);
		const saved = 'test-results/browser-measured-report.pdf';
		await download.saveAs(saved);
		const text = execFileSync('pdftotext', ['-layout', saved, '-'], { encoding: 'utf8' });
		const table = text.slice(text.indexOf('What the projections rest on'));
		expect(table).toMatch(/Surface chloride\s+[\s\S]*fitted/);
		expect(table).toMatch(/Cover to the bars\s+\d+ readings\s+measured/);
		expect(text).toContain('Chloride profiles');
		expect(text).toMatch(/At the design life: \d+ %, band \d+ %–\d+ %/);
		await context.close();
	});
});
