import { describe, expect, it } from 'vitest';
import {
	barPositionFromScan,
	correctReadings,
	nearestStandardBarMm,
	shareMatchingDiameter,
	spacingSummary,
	spacingsFromPositions,
	verifyMeter
} from '../../../src/lib/analysis/index';

// Anscombe (1973), "Graphs in statistical analysis", Am. Statistician 27: data set I has
// fitted line y = 3.00 + 0.500x and residual sum of squares 13.76 (9 d.f.) → s_e = 1.237.
const X = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
const Y = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];

describe('meter verification', () => {
	it('regression of Anscombe I: a = 3.00, b = 0.500, s_e = 1.237 (Anscombe 1973)', () => {
		const v = verifyMeter(X, Y);
		expect(v.interceptMm).toBeCloseTo(3.0, 2);
		expect(v.slope).toBeCloseTo(0.5, 3);
		expect(v.residualSdMm).toBeCloseTo(1.237, 3);
		// 95 % prediction at the mean reading: t(0.975; 9)·s_e·√(1 + 1/11) (scipy 1.17.1 t.ppf)
		expect(v.uncertaintyMm).toBeCloseTo(2.262157162798205 * v.residualSdMm * Math.sqrt(12 / 11), 7);
		// bias = mean(y) − mean(x) = 7.5009 − 9 (Anscombe: mean y 7.50, mean x 9)
		expect(v.biasMm).toBeCloseTo(7.500909 - 9, 5);
		expect(v.enough).toBe(true);
	});
	it('corrected readings lie on the fitted line; too few holes are flagged', () => {
		const v = verifyMeter([40, 50, 60, 70], [42, 52.5, 61.5, 72]);
		const c = correctReadings([40, 70], v);
		expect(c[1] - c[0]).toBeCloseTo(30 * v.slope, 12);
		expect(v.enough).toBe(false);
		expect(() => verifyMeter([1, 2], [1, 2])).toThrow('verifyMeter needs at least 3 readings');
	});
});

describe('bar diameter and spacing (common practice: a 20 mm bar reads within about ±1 mm)', () => {
	it('19.3 and 20.7 round to 20 mm in the EN stock; 16.2 to 16 mm', () => {
		expect(nearestStandardBarMm(19.3, 'EN')).toBe(20);
		expect(nearestStandardBarMm(20.7, 'EN')).toBe(20);
		expect(shareMatchingDiameter([19.3, 20.7, 16.2], 20, 'EN')).toBeCloseTo(2 / 3, 12);
	});
	it('ACI: 19.3 mm rounds to No. 6 (0.750 in = 19.05 mm, ASTM A615 Table 1)', () => {
		expect(nearestStandardBarMm(19.3, 'ACI')).toBeCloseTo(19.05, 10);
	});
	it('spacing statistics against 150 ± 10 mm', () => {
		const s = spacingSummary(spacingsFromPositions([0, 148, 300, 462, 610]), 150, 10);
		expect(s.n).toBe(4);
		expect(s.meanMm).toBeCloseTo(152.5, 12);
		expect(s.shareWithinTolerance).toBeCloseTo(0.75, 12);
	});
	it('the smallest reading along a scan marks the bar (common practice)', () => {
		expect(barPositionFromScan([0, 10, 20, 30, 40], [48, 41, 37.5, 40, 47])).toBe(20);
	});
});
