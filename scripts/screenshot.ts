// Takes a screenshot of a page of the running app, for looking at it:
// `tsx scripts/screenshot.ts http://127.0.0.1:3000/ out.png [width]`
import { launchChromium } from '../tests/helpers/browser';

const [url, out = 'screenshot.png', width = '1280'] = process.argv.slice(2);
if (!url) throw new Error('usage: tsx scripts/screenshot.ts URL [OUT.png] [WIDTH]');
const browser = await launchChromium();
try {
	const page = await browser.newPage({ viewport: { width: Number(width), height: 900 } });
	await page.goto(url, { waitUntil: 'networkidle' });
	await page.screenshot({ path: out, fullPage: true });
	console.log(`saved ${out}`);
} finally {
	await browser.close();
}
