import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { safeNext } from '$lib/server/web/guard';

const APP = 'https://app.example';

/**
 * Where a browser would go for a Location header of `location` on our origin. Browsers (WHATWG
 * URL) drop tab, CR and LF anywhere in a URL before parsing it, which is how "/\t/evil.example"
 * turns into "//evil.example"; the test strips them the same way.
 */
function browserTarget(location: string): URL {
	return new URL(location.replace(/[\t\r\n]/g, ''), APP);
}

/** What every answer of safeNext must be: a path of our own site, safe as a header value. */
function expectSameOriginPath(result: string) {
	expect(result.startsWith('/')).toBe(true);
	expect(result.startsWith('//')).toBe(false);
	expect(result).toMatch(/^[\x21-\x7e]*$/);
	expect(browserTarget(result).origin).toBe(APP);
}

describe('safeNext', () => {
	it('keeps paths on our own site and drops everything else', () => {
		expect(safeNext('/account/tokens?x=1')).toBe('/account/tokens?x=1');
		expect(safeNext('/assets/3#surveys')).toBe('/assets/3#surveys');
		expect(safeNext('https://evil.example/')).toBe('/dashboard');
		expect(safeNext('//evil.example/')).toBe('/dashboard');
		expect(safeNext('/\\evil.example')).toBe('/dashboard');
		expect(safeNext(null)).toBe('/dashboard');
	});

	it('refuses a tab, a newline or another control character that browsers drop (open redirect)', () => {
		for (const next of [
			'/\t/evil.example',
			'/\n/evil.example',
			'/\r/evil.example',
			'/\r\n/evil.example',
			'/\n/x',
			'/\u0000/evil.example',
			'/\u000b/evil.example',
			'/\u007f/evil.example',
			'/\u0085/evil.example',
			'\t//evil.example',
			'/dashboard\nSet-Cookie: x=1'
		]) {
			expect(safeNext(next), JSON.stringify(next)).toBe('/dashboard');
		}
	});

	it('refuses backslashes anywhere and paths that resolve off the site', () => {
		for (const next of [
			'/\\/evil.example',
			'/x\\..\\..\\/evil.example',
			'/.//evil.example',
			'/./\\evil.example',
			'/../..//evil.example',
			'/%2e//evil.example',
			'///evil.example',
			'/\\\\evil.example',
			'javascript:alert(1)',
			'evil.example',
			' /dashboard',
			'https:/evil.example'
		]) {
			const result = safeNext(next);
			expectSameOriginPath(result);
			expect(browserTarget(result).host, JSON.stringify(next)).toBe('app.example');
		}
		expect(safeNext('/.//evil.example')).toBe('/dashboard');
	});

	it('percent-encodes what a header may not carry instead of answering 500', () => {
		expect(safeNext('/assets?q=Brücke')).toBe('/assets?q=Br%C3%BCcke');
		expectSameOriginPath(safeNext('/ō/“x”'));
	});

	it('always answers a same-origin path, for any string at all (property, seeded)', () => {
		const tricky = fc.constantFrom(
			'/',
			'//',
			'\\',
			'\t',
			'\n',
			'\r',
			'.',
			'..',
			'%2f',
			'%5c',
			'@',
			':',
			'?',
			'#',
			' ',
			'\u3000',
			'\u2028',
			'evil.example',
			'https:'
		);
		const pieces = fc.array(
			fc.oneof(tricky, fc.string({ unit: 'grapheme' }), fc.string({ unit: 'binary' })),
			{ maxLength: 8 }
		);
		fc.assert(
			fc.property(pieces, (parts) => expectSameOriginPath(safeNext(parts.join('')))),
			{ seed: 20261204, numRuns: 3000 }
		);
		fc.assert(
			fc.property(fc.string({ unit: 'binary', maxLength: 60 }), (text) => {
				expectSameOriginPath(safeNext(text));
				expectSameOriginPath(safeNext(`/${text}`));
			}),
			{ seed: 7, numRuns: 3000 }
		);
	});
});
