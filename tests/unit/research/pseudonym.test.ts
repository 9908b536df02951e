import { createHmac } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import {
	checkIdSecret,
	constructionDecade,
	pseudonym,
	pseudonymMaker
} from '../../../src/lib/server/research/pseudonym';

const secret = 'a-test-secret-of-enough-length';

describe('research pseudonyms (HMAC-SHA256, RFC 2104)', () => {
	it('is the first 16 hex digits of HMAC-SHA256(secret, "kind:id") behind a kind prefix', () => {
		const expected = createHmac('sha256', secret).update('member:42').digest('hex').slice(0, 16);
		expect(pseudonym(secret, 'member', 42)).toBe(`M-${expected}`);
		expect(pseudonym(secret, 'asset', 42)).toMatch(/^A-[0-9a-f]{16}$/);
	});

	it('is stable for one secret and changes with the secret, the kind and the id', () => {
		expect(pseudonym(secret, 'asset', 7)).toBe(pseudonym(secret, 'asset', 7));
		expect(pseudonym(`${secret}!`, 'asset', 7)).not.toBe(pseudonym(secret, 'asset', 7));
		expect(pseudonym(secret, 'asset', 8)).not.toBe(pseudonym(secret, 'asset', 7));
		expect(pseudonym(secret, 'member', 7).slice(2)).not.toBe(
			pseudonym(secret, 'asset', 7).slice(2)
		);
	});

	it('memoises without changing the value', () => {
		const name = pseudonymMaker(secret);
		expect(name('member', 3)).toBe(pseudonym(secret, 'member', 3));
		expect(name('member', 3)).toBe(name('member', 3));
	});

	it('refuses a missing or short secret with a message naming the variable', () => {
		expect(() => checkIdSecret(undefined)).toThrow(/RESEARCH_ID_SECRET/);
		expect(() => checkIdSecret('short')).toThrow(/at least 16/);
	});

	it('coarsens the year of construction to its decade', () => {
		expect(constructionDecade(1998)).toBe(1990);
		expect(constructionDecade(2009)).toBe(2000);
		expect(constructionDecade(2010)).toBe(2010);
		expect(constructionDecade(null)).toBeNull();
	});
});
