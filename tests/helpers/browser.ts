import { chromium, type Browser } from 'playwright-core';

/**
 * Debian's chromium driven by playwright-core (never a downloaded browser). The flags keep it
 * from reaching for the network, which this machine does not have (STACK.md). Playwright gives
 * each launch a fresh, empty profile of its own.
 */
export function launchChromium(): Promise<Browser> {
	return chromium.launch({
		executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
		args: [
			'--headless',
			'--no-sandbox',
			'--disable-gpu',
			'--disable-quic',
			'--no-first-run',
			'--disable-background-networking',
			'--disable-component-update',
			'--disable-sync'
		]
	});
}

/** Where the browser tests keep their screenshots (git-ignored), for a person to look at. */
export const SCREENSHOT_DIR = 'test-results/screenshots';
