import type { Browser, BrowserContext } from 'playwright-core';
import { appUrl } from './env';
import { signInAs, type DemoRole } from './session';

/** A browser context signed in as a demo role (the session cookie of a real sign-in over HTTP). */
export async function signedInContext(browser: Browser, role: DemoRole): Promise<BrowserContext> {
	const client = await signInAs(role);
	const [name, value] = client.cookie.split('=');
	const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
	await context.addCookies([{ name, value, url: appUrl() }]);
	return context;
}
