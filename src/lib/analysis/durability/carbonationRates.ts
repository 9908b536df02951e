/**
 * Carbonation rates from measured depths: k = x/√t per test location, and their population.
 * √t law: Tuutti (1982); fib Bulletin 34 (2006) uses the same form. Units: depths mm, ages
 * years, k mm/√year.
 */
import { predictionFactor, toleranceFactor } from '../characteristicFactors';
import { normalQuantile } from '../normalDistribution';

/** One carbonation test (a phenolphthalein-sprayed core or drilled face) at one location. */
export interface CarbonationTest {
	memberId?: number | string;
	/** A label the caller recognises the location by (grid position, core number). */
	label?: string;
	/** The depths read on the test face, mm, as read (one or several). */
	depthsMm: readonly number[];
	/** Age of the concrete at the test date, years (test date − year of construction). */
	ageYears: number;
}

export interface CarbonationRate {
	memberId?: number | string;
	label?: string;
	ageYears: number;
	readings: number;
	meanDepthMm: number;
	minDepthMm: number;
	maxDepthMm: number;
	/** k = mean depth/√age, mm/√year. */
	kMmPerSqrtYear: number;
	kMinMmPerSqrtYear: number;
	kMaxMmPerSqrtYear: number;
	/** Standard error of k from the depths read here, s/(√m·√t); null with one reading. */
	kStandardError: number | null;
}

/** 'prediction' EN 1990 D7.2 (k_n); 'tolerance' ISO 16269-6; 'model' z(1−p). */
export type CarbonationCharacteristicMethod = 'prediction' | 'tolerance' | 'model';

export interface CarbonationRatePopulation {
	rates: CarbonationRate[];
	n: number;
	meanMmPerSqrtYear: number;
	/** Sample SD (n − 1) of k across locations; null with one location. */
	sdMmPerSqrtYear: number | null;
	/**
	 * Upper characteristic k = mean + factor·SD: carbonation is unfavourable when fast, so the
	 * fractile is the upper one (1 − p). Null with one location.
	 */
	characteristic: {
		p: number;
		confidence: number;
		method: CarbonationCharacteristicMethod;
		factor: number;
		kMmPerSqrtYear: number;
	} | null;
	warnings: string[];
}

function checkTest(test: CarbonationTest, index: number): void {
	const where = `carbonation test ${index + 1}`;
	if (!(Number.isFinite(test.ageYears) && test.ageYears > 0))
		throw new Error(`${where}: age must be a number of years > 0 (k = x/√t needs t > 0)`);
	if (test.depthsMm.length === 0) throw new Error(`${where} needs at least 1 depth reading`);
	test.depthsMm.forEach((d, j) => {
		if (!(Number.isFinite(d) && d >= 0))
			throw new Error(`${where}: depth reading ${j + 1} must be a number ≥ 0 mm`);
	});
}

/**
 * k = x̄/√t for one test, with the smallest and largest depth read kept as k_min, k_max.
 * Units mm/√year. Cost O(m). Throws on an age ≤ 0 or a negative/NaN depth.
 * @example carbonationRate({ depthsMm: [8, 10, 12], ageYears: 16 }).kMmPerSqrtYear // 2.5
 */
export function carbonationRate(test: CarbonationTest, index = 0): CarbonationRate {
	checkTest(test, index);
	const m = test.depthsMm.length;
	const root = Math.sqrt(test.ageYears);
	let sum = 0;
	let min = Infinity;
	let max = -Infinity;
	for (const d of test.depthsMm) [sum, min, max] = [sum + d, Math.min(min, d), Math.max(max, d)];
	const mean = sum / m;
	let ss = 0;
	for (const d of test.depthsMm) ss += (d - mean) ** 2;
	return {
		...(test.memberId === undefined ? {} : { memberId: test.memberId }),
		...(test.label === undefined ? {} : { label: test.label }),
		ageYears: test.ageYears,
		readings: m,
		meanDepthMm: mean,
		minDepthMm: min,
		maxDepthMm: max,
		kMmPerSqrtYear: mean / root,
		kMinMmPerSqrtYear: min / root,
		kMaxMmPerSqrtYear: max / root,
		kStandardError: m > 1 ? Math.sqrt(ss / (m - 1) / m) / root : null
	};
}

function characteristicFactor(
	n: number,
	p: number,
	confidence: number,
	method: CarbonationCharacteristicMethod
): number {
	if (method === 'prediction') return predictionFactor(n, p);
	if (method === 'tolerance') return toleranceFactor(n, p, confidence);
	return normalQuantile(1 - p);
}

/**
 * The population of k over test locations: n, mean, sample SD and the upper characteristic
 * value mean + factor·SD. Default: p = 0.05 (the 95 % upper fractile) by the EN 1990 Annex D
 * prediction method (D7.2, V_x unknown), the same fractile and method as the engine's default
 * characteristic cover, mirrored to the unfavourable side.
 * Units mm/√year. Cost O(total readings). Needs 1 test (SD and characteristic need 2).
 * @example carbonationRates([{ depthsMm: [10], ageYears: 16 }, { depthsMm: [15], ageYears: 25 }]).meanMmPerSqrtYear // 2.75
 */
export function carbonationRates(
	tests: readonly CarbonationTest[],
	options: { p?: number; confidence?: number; method?: CarbonationCharacteristicMethod } = {}
): CarbonationRatePopulation {
	if (tests.length === 0) throw new Error('carbonationRates needs at least 1 carbonation test');
	const rates = tests.map((t, i) => carbonationRate(t, i));
	const n = rates.length;
	const mean = rates.reduce((s, r) => s + r.kMmPerSqrtYear, 0) / n;
	const warnings: string[] = [];
	if (n < 2) {
		warnings.push('One test location: no spread of k between locations, no characteristic value.');
		return {
			rates,
			n,
			meanMmPerSqrtYear: mean,
			sdMmPerSqrtYear: null,
			characteristic: null,
			warnings
		};
	}
	const sd = Math.sqrt(rates.reduce((s, r) => s + (r.kMmPerSqrtYear - mean) ** 2, 0) / (n - 1));
	const p = options.p ?? 0.05;
	const confidence = options.confidence ?? 0.95;
	const method = options.method ?? 'prediction';
	const factor = characteristicFactor(n, p, confidence, method);
	if (n < 5) warnings.push(`Only ${n} test locations: the characteristic k rests on few values.`);
	return {
		rates,
		n,
		meanMmPerSqrtYear: mean,
		sdMmPerSqrtYear: sd,
		characteristic: { p, confidence, method, factor, kMmPerSqrtYear: mean + factor * sd },
		warnings
	};
}

/**
 * The carbonation front x(t) = k·√t at an age: mean, SD and characteristic depth, scaling the
 * population of k by √t (the scatter of x grows with √t under the √t law).
 * Units mm. Cost O(1). Throws on a negative or NaN age; t = 0 gives 0 mm.
 * @example carbonationFront(population, 50).meanMm
 */
export function carbonationFront(
	population: CarbonationRatePopulation,
	ageYears: number
): { ageYears: number; meanMm: number; sdMm: number | null; characteristicMm: number | null } {
	if (!(Number.isFinite(ageYears) && ageYears >= 0))
		throw new Error('carbonation front: age must be a number of years ≥ 0');
	const root = Math.sqrt(ageYears);
	return {
		ageYears,
		meanMm: population.meanMmPerSqrtYear * root,
		sdMm: population.sdMmPerSqrtYear === null ? null : population.sdMmPerSqrtYear * root,
		characteristicMm:
			population.characteristic === null ? null : population.characteristic.kMmPerSqrtYear * root
	};
}
