import type { Browser, Page } from 'playwright-core';
import { appUrl } from './env';
import { DEMO_PASSWORD, DEMO_USERS, type DemoRole } from './session';
import { SCREENSHOT_DIR } from './browser';

/** A fresh browser context signed in through the real sign-in form as a demo role. */
export async function browserSignIn(browser: Browser, role: DemoRole): Promise<Page> {
	const context = await browser.newContext({
		baseURL: appUrl(),
		viewport: { width: 1280, height: 900 }
	});
	const page = await context.newPage();
	// The first request of a fresh server initialises the models; sign-in must not be it.
	await page.request.get('/api/health');
	await page.goto('/sign-in');
	await page.waitForLoadState('networkidle');
	await page.fill('input[name=email]', DEMO_USERS[role]);
	await page.fill('input[name=password]', DEMO_PASSWORD);
	await Promise.all([
		page.waitForURL('**/dashboard'),
		page.click('button[type=submit], form button')
	]);
	return page;
}

export async function screenshot(page: Page, name: string): Promise<void> {
	await page.screenshot({ path: `${SCREENSHOT_DIR}/${name}.png`, fullPage: true });
}

/** Pixels of a canvas that are not blank, and those near a colour (r, g, b). */
export function canvasPixels(page: Page, selector: string, rgb: [number, number, number]) {
	return page.$eval(
		selector,
		(canvas, [r, g, b]) => {
			const c = canvas as HTMLCanvasElement;
			const data = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
			let inked = 0;
			let coloured = 0;
			for (let i = 0; i < data.length; i += 4) {
				if (data[i + 3] > 0) inked++;
				if (
					Math.abs(data[i] - r) < 30 &&
					Math.abs(data[i + 1] - g) < 30 &&
					Math.abs(data[i + 2] - b) < 30 &&
					data[i + 3] > 200
				)
					coloured++;
			}
			return { inked, coloured };
		},
		rgb
	);
}
