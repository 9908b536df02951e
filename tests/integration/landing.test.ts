import { describe, expect, it } from 'vitest';
import { appUrl } from '../helpers/env';
import { signInAs } from '../helpers/session';

describe('the landing page', () => {
	it('says what the product does and for whom, with the caution', async () => {
		const response = await fetch(appUrl());
		expect(response.status).toBe(200);
		const html = await response.text();
		expect(html).toContain('Fractile');
		for (const audience of ['Surveyors', 'Durability engineers', 'Asset owners', 'Researchers']) {
			expect(html).toContain(audience);
		}
		expect(html).toContain('licensed engineer');
	});

	it('ships Inter with the app and names no external font or CDN', async () => {
		const html = await (await fetch(appUrl())).text();
		expect(html).not.toMatch(/fonts\.googleapis|fonts\.gstatic|cdn\.|unpkg/);
		const css = [...html.matchAll(/href="([^"]+\.css)"/g)].map((m) => m[1]);
		expect(css.length).toBeGreaterThan(0);
		const stylesheet = await (await fetch(new URL(css[0], appUrl()))).text();
		const font = stylesheet.match(/url\(([^)]+inter[^)]+\.woff2)\)/i);
		expect(font, 'the stylesheet refers to an Inter woff2 file').not.toBeNull();
		const fontResponse = await fetch(
			new URL(font![1].replace(/["']/g, ''), new URL(css[0], appUrl()))
		);
		expect(fontResponse.status).toBe(200);
	});

	it('sends the security headers', async () => {
		const response = await fetch(appUrl());
		expect(response.headers.get('x-content-type-options')).toBe('nosniff');
		expect(response.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
		expect(response.headers.get('referrer-policy')).toBeTruthy();
	});

	it('offers a signed-in visitor their dashboard, not sign-in or a new organisation', async () => {
		const engineer = await signInAs('engineer');
		const landing = await (await engineer.get('/')).text();
		expect(landing).toContain('href="/dashboard"');
		expect(landing).not.toContain('Set up an organisation');
		expect(landing).not.toContain('href="/sign-in"');
		const anonymous = await (await fetch(appUrl())).text();
		expect(anonymous).toContain('Set up an organisation');
	});

	it('does not offer "Open my dashboard" on the signed-in pages themselves', async () => {
		const engineer = await signInAs('engineer');
		const dashboard = await (await engineer.get('/dashboard')).text();
		expect(dashboard).not.toContain('Open my dashboard');
	});
});
