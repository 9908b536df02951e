import { describe, expect, it } from 'vitest';
import {
	applySpread,
	assessCalibrated,
	assessPopulation,
	calibrateReading,
	calibratedSpread,
	CalibrationRefused,
	countedFromSorted,
	enRequirement,
	expandCounted,
	fitCalibration,
	predictionSeMm,
	predictiveShareBelow
} from '../../../src/lib/analysis/index';

// Invented check holes (meter reading, measured depth), mm.
const READ = [28, 35, 41, 47, 52, 60, 66];
const MEASURED = [31.5, 37.0, 44.5, 48.0, 55.5, 61.0, 69.5];

describe('check-hole calibration: least squares and prediction interval', () => {
	const cal = fitCalibration(READ, MEASURED);

	it('coefficients, residual SD and t quantile match scipy 1.17.1 (stats.linregress, t.ppf)', () => {
		expect(cal.model).toBe('line');
		// scipy 1.17.1: linregress(r, m).slope / .intercept
		expect(cal.slope).toBeCloseTo(0.986770072992701, 12);
		expect(cal.interceptMm).toBeCloseTo(3.19323514077163, 11);
		// √(Σe²/(n − 2)) from scipy's fitted line (numpy 2, scipy 1.17.1)
		expect(cal.residualSdMm).toBeCloseTo(1.30556131780011, 11);
		expect(cal.meanReadingMm).toBe(47);
		expect(cal.sxxMm2).toBeCloseTo(1096, 10);
		expect(cal.degreesOfFreedom).toBe(5);
		// scipy 1.17.1: stats.t.ppf(0.975, 5); jStat's t inverse agrees to about 1e-9
		expect(cal.tQuantile).toBeCloseTo(2.57058183563631, 8);
	});

	it("the parameters' uncertainty is scipy's: s/√Sxx = linregress stderr, se(0)² − s² = intercept_stderr²", () => {
		// scipy 1.17.1: linregress(r, m).stderr and .intercept_stderr
		expect(cal.residualSdMm / Math.sqrt(cal.sxxMm2)).toBeCloseTo(0.0394359218140152, 12);
		const se0 = predictionSeMm(cal, 0);
		expect(Math.sqrt(se0 ** 2 - cal.residualSdMm ** 2)).toBeCloseTo(1.91805046699687, 10);
	});

	it('prediction intervals at 45, 20 and 80 mm: ŷ ± t·s·√(1 + 1/n + (r − r̄)²/Sxx) (OLS prediction interval; numbers from scipy 1.17.1)', () => {
		const cases = [
			[45, 47.5978884254432, 1.39793052199665, 44.004393618117, 51.1913832327694],
			[20, 22.9286366006257, 1.75548394839932, 18.4160214501193, 27.4412517511321],
			[80, 82.1348409801877, 1.90829583336632, 77.2294103739158, 87.0402715864596]
		];
		for (const [r, value, se, lower, upper] of cases) {
			const c = calibrateReading(cal, r);
			expect(c.valueMm).toBeCloseTo(value, 10);
			expect(c.seMm).toBeCloseTo(se, 11);
			expect(c.lowerMm).toBeCloseTo(lower, 8);
			expect(c.upperMm).toBeCloseTo(upper, 8);
		}
	});

	it('with fewer than 5 holes the offset alone: b = 1, a = mean(m − r), ν = n − 1 (scipy 1.17.1 t.ppf(0.975, 3))', () => {
		const offset = fitCalibration([30, 42, 51, 63], [33.0, 44.5, 55.0, 65.0]);
		expect(offset.model).toBe('offset');
		expect(offset.slope).toBe(1);
		expect(offset.interceptMm).toBeCloseTo(2.875, 12);
		// numpy std(ddof=1) of the differences
		expect(offset.residualSdMm).toBeCloseTo(0.853912563829966, 12);
		expect(offset.degreesOfFreedom).toBe(3);
		expect(offset.tQuantile).toBeCloseTo(3.18244630528371, 9);
		// s·√(1 + 1/n) wherever the meter reads: the offset has no leverage term
		expect(predictionSeMm(offset, 10)).toBeCloseTo(0.954703269782467, 12);
		expect(predictionSeMm(offset, 90)).toBeCloseTo(0.954703269782467, 12);
	});
});

describe('check-hole calibration refuses in words', () => {
	it('fewer than 3 holes', () => {
		expect(() => fitCalibration([40, 50], [41, 52])).toThrow(CalibrationRefused);
		expect(() => fitCalibration([40, 50], [41, 52])).toThrow(
			'The calibration needs at least 3 check holes; there are 2.'
		);
	});
	it('every hole reading the same on the meter (Sxx = 0): a message, not NaN', () => {
		expect(() => fitCalibration([45, 45, 45, 45, 45], [46, 47, 48, 46, 47])).toThrow(
			/Every check hole read 45 mm on the meter/
		);
	});
	it('3 holes fit (ν = 2) but are not applied: a t with 2 degrees of freedom has no variance', () => {
		const three = fitCalibration([30, 45, 60], [32, 46, 63]);
		expect(three.degreesOfFreedom).toBe(2);
		expect(() => calibratedSpread([30, 40, 50], three)).toThrow(/at least 4 holes are needed/);
	});
	it('a falling line, readings with no spread, a cover below 0 mm', () => {
		const falling = fitCalibration([30, 40, 50, 60, 70], [60, 52, 41, 33, 20]);
		expect(() => calibratedSpread([30, 40, 50], falling)).toThrow(/falls or is flat/);
		const cal = fitCalibration(READ, MEASURED);
		expect(() => calibratedSpread([40, 40, 40], cal)).toThrow(/no spread/);
		const low = fitCalibration([10, 20, 30, 40, 50], [1, 12, 23, 34, 45]);
		expect(() => calibratedSpread([1, 30, 40], low)).toThrow(/below 0 mm/);
		expect(() => fitCalibration([40, 50, NaN], [41, 52, 60])).toThrow(/finite/);
	});
});

describe('the calibration carried into the population', () => {
	const cal = fitCalibration(READ, MEASURED);
	const POP = [30, 34, 38, 38, 41, 45, 45, 45, 50, 55, 61];

	it('predictive share below 40 mm = mean of t CDFs (scipy 1.17.1: mean(t.cdf((40 − ŷ)/se, 5)))', () => {
		expect(predictiveShareBelow(POP, cal, 40)).toBeCloseTo(0.239840345816547, 10);
		// the same from counts of the distinct values
		expect(predictiveShareBelow(countedFromSorted(Float64Array.from(POP)), cal, 40)).toBeCloseTo(
			0.239840345816547,
			10
		);
	});

	it("mean predictive variance V̄ = mean of scipy's t.var(ν, scale = se(r)); the judged SD √(s_c² + V̄) (scipy 1.17.1, numpy)", () => {
		const spread = calibratedSpread(POP, cal);
		// scipy 1.17.1: mean([stats.t.var(5, scale=se(r)) for r in POP])
		expect(spread.predictiveVarianceMm2).toBeCloseTo(3.46743842128967, 11);
		expect(spread.calibratedMeanMm).toBeCloseTo(46.4317056119063, 11);
		expect(spread.calibratedSdMm).toBeCloseTo(8.96624033761005, 11);
		expect(spread.stretch).toBeCloseTo(1.0213377741209, 12);
		expect(spread.judgedSdMm).toBeCloseTo(9.15755994864763, 11);
		// the mapped readings have exactly that mean and SD (the engine's describe)
		const judged = assessPopulation(
			applySpread(POP, spread),
			enRequirement({ exposureClass: 'XC1', barDiameterMm: 10 })
		);
		expect(judged.description.meanMm).toBeCloseTo(spread.calibratedMeanMm, 10);
		expect(judged.description.sdMm).toBeCloseTo(spread.judgedSdMm, 10);
	});

	it('counts give what the readings give: the grid is mapped, not expanded (property: summary = raw)', () => {
		const counted = countedFromSorted(Float64Array.from(POP));
		const fromCounts = calibratedSpread(counted, cal);
		const fromRaw = calibratedSpread(POP, cal);
		expect(fromCounts.slope).toBeCloseTo(fromRaw.slope, 13);
		expect(fromCounts.interceptMm).toBeCloseTo(fromRaw.interceptMm, 12);
		const mapped = applySpread(counted, fromCounts);
		expect(mapped.lattice?.b).toBeCloseTo(fromRaw.slope, 13);
		expect(Array.from(expandCounted(mapped))).toEqual(Array.from(applySpread(POP, fromRaw)));
	});
});

describe('the verdict through the calibration (invented case: a meter that reads about 4 mm high)', () => {
	const counts = [1, 2, 4, 7, 11, 15, 19, 21, 22, 21, 19, 15, 11, 7, 4, 2, 1];
	const readings = counts.flatMap((c, k) => Array<number>(c).fill(26 + k));
	const holes = fitCalibration([28, 33, 37, 41, 46, 52], [24.1, 28.7, 33.4, 36.9, 42.5, 47.8]);
	const requirement = enRequirement({ exposureClass: 'XC3', barDiameterMm: 12 });
	const options = { model: 'normal', characteristicMethod: 'prediction' } as const;

	it('complies as read, does not comply calibrated; the characteristic is μ_T − k_n·σ_T (scipy 1.17.1 peer)', () => {
		const asRead = assessPopulation(readings, requirement, options);
		// EN 1990 D7.2 with scipy 1.17.1: mean − t.ppf(0.95, 181)·√(1 + 1/182)·sd
		expect(asRead.characteristic.chosenMm).toBeCloseTo(28.8039628588, 6);
		expect(asRead.verdict).toBe('pass');
		const calibrated = assessCalibrated(readings, holes, requirement, options);
		// scipy 1.17.1: linregress of the holes, V̄ from t.var, σ_T = √(s_c² + V̄), k_n as above
		expect(holes.interceptMm).toBeCloseTo(-3.9747487986, 9);
		expect(calibrated.spread.judgedSdMm).toBeCloseTo(3.19102366842, 9);
		expect(calibrated.assessment.characteristic.chosenMm).toBeCloseTo(24.7706562242, 6);
		expect(calibrated.assessment.verdict).toBe('fail');
		// scipy 1.17.1: mean(t.cdf((25 − ŷ)/se, 4))
		expect(calibrated.predictiveShareBelowCMin).toBeCloseTo(0.0573092173095, 10);
	});

	it('the grouped fit test keeps its classes through the line: the normal model p-value is unchanged (a positive straight line leaves z-scores as they are)', () => {
		const asRead = assessPopulation(readings, requirement, options);
		const calibrated = assessCalibrated(readings, holes, requirement, options).assessment;
		expect(asRead.models.normal.decidedBy).toBe('grouped-chi-square');
		expect(calibrated.models.normal.decidedBy).toBe('grouped-chi-square');
		expect(calibrated.models.normal.grouped?.pValue).toBeCloseTo(
			asRead.models.normal.grouped!.pValue!,
			9
		);
	});
});
