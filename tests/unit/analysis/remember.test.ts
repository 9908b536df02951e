import { describe, expect, it } from 'vitest';
import { remember } from '../../../src/lib/analysis/remember';

describe('remember (the engine’s memo for costly pure functions)', () => {
	it('runs the function once per exact arguments, and tells 0.1 + 0.2 from 0.3', () => {
		let calls = 0;
		const square = remember((x: number) => {
			calls++;
			return x * x;
		});
		expect(square(3)).toBe(9);
		expect(square(3)).toBe(9);
		expect(calls).toBe(1);
		square(0.1 + 0.2);
		square(0.3);
		expect(calls).toBe(3);
	});

	it('starts afresh past its limit instead of growing without bound', () => {
		let calls = 0;
		const id = remember((x: number) => {
			calls++;
			return x;
		}, 2);
		id(1);
		id(2);
		id(3); // full: forgets 1 and 2
		id(1);
		expect(calls).toBe(4);
	});
});
