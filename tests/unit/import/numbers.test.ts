import { describe, expect, it } from 'vitest';
import { isPlainNumber, parseDecimal, PLAIN_NUMBER } from '$lib/server/import/numbers';

describe('reading numbers from cells', () => {
	it('accepts what the grammar accepts, and nothing else', () => {
		const accepted = ['0', '42', '-3', '+7', '12.5', '5.', '.5', '-.5', '1e3', '2.5E-2', '1e+3'];
		const refused = ['', '.', '-', '+.', 'e3', '1e', '1e+', '1.2.3', '0x10', 'Infinity', 'NaN'];
		for (const text of accepted) expect([text, isPlainNumber(text)]).toEqual([text, true]);
		for (const text of refused) expect([text, isPlainNumber(text)]).toEqual([text, false]);
	});

	it('gives the regular expression’s answer on 20,000 strings made of number characters', () => {
		// Random strings over the characters that matter (seeded LCG, so a failure repeats).
		const alphabet = '0123456789.+-eE ,x';
		let seed = 12345;
		const next = () => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0);
		for (let k = 0; k < 20_000; k++) {
			let text = '';
			const length = next() % 8;
			for (let i = 0; i < length; i++) text += alphabet[next() % alphabet.length];
			expect([text, isPlainNumber(text)]).toEqual([text, PLAIN_NUMBER.test(text)]);
		}
	});

	it('reads each decimal mark and refuses the other', () => {
		expect(parseDecimal(' 42.5 ', '.')).toBe(42.5);
		expect(parseDecimal('42,5', ',')).toBe(42.5);
		expect(parseDecimal('42,5', '.')).toBe('wrong-decimal-mark');
		expect(parseDecimal('1.250', ',')).toBe('wrong-decimal-mark');
		expect(parseDecimal('', '.')).toBeNull();
		expect(parseDecimal('forty', '.')).toBe('not-a-number');
		expect(parseDecimal('1e999', '.')).toBe('not-a-number');
	});
});
