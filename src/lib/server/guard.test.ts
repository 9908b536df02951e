import { describe, expect, it } from 'vitest';
import { safeNext } from './guard';

describe('safeNext', () => {
	it('keeps paths on our own site and drops everything else', () => {
		expect(safeNext('/account/tokens?x=1')).toBe('/account/tokens?x=1');
		expect(safeNext('https://evil.example/')).toBe('/dashboard');
		expect(safeNext('//evil.example/')).toBe('/dashboard');
		expect(safeNext('/\\evil.example')).toBe('/dashboard');
		expect(safeNext(null)).toBe('/dashboard');
	});
});
