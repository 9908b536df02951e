import { describe, expect, it } from 'vitest';
import { tidyFigure } from '../../../src/lib/server/research/groupsCsv';

describe('group statistics CSV figures', () => {
	it('drops floating-point noise and keeps every meaningful digit', () => {
		// 31.1 − 40 in IEEE 754 doubles is -8.899999999999999 (JavaScript and Python agree).
		expect(31.1 - 40).toBe(-8.899999999999999);
		expect(tidyFigure(31.1 - 40)).toBe(-8.9);
		expect(tidyFigure(0.1 + 0.2)).toBe(0.3);
		expect(tidyFigure(0.0123456789)).toBe(0.0123456789);
		expect(tidyFigure(2242)).toBe(2242);
		expect(tidyFigure(null)).toBeNull();
		expect(tidyFigure('deck')).toBe('deck');
	});
});
