/**
 * Which input of a measured-front projection matters most: each input moved down and up by one
 * standard deviation of what is known about it, the others held, and the share depassivated at
 * the design life recomputed (one-at-a-time, a "tornado" ranking).
 *
 * "One standard deviation" is the input's uncertainty, so the ranking names what is worth
 * measuring better: the cover mean by its standard error s/√n; the cover SD by the standard
 * error of a sample SD, s/√(2(n − 1)) (normal theory); Cs, Da and k by the standard error of
 * their mean over locations, SD/√m (one location: the fit's own standard error); C_crit and the
 * ageing exponent by an SD the caller states (they are assumptions; not ranked without one).
 * Shares use the cover < front convention of measuredDepassivation.
 */
import { countBelowSorted, requireReadings } from '../readings';
import { chlorideFrontCoefficient, frontSources, shareBelowFronts } from './measuredFront';
import type { FrontSource, MeasuredFront } from './measuredFront';

export type SensitivityInput =
	| 'cover-mean'
	| 'cover-sd'
	| 'surface-content'
	| 'diffusion-coefficient'
	| 'critical-content'
	| 'ageing-exponent'
	| 'carbonation-rate';

export interface SensitivityRow {
	input: SensitivityInput;
	/** The one-SD move applied, in the input's unit. */
	sd: number;
	/** Where that SD comes from, in words. */
	basis: string;
	shareMinus: number;
	sharePlus: number;
	/** max(|shareMinus − share|, |sharePlus − share|). */
	largestChange: number;
}

export interface DepassivationSensitivity {
	designLifeYears: number;
	share: number;
	/** Ranked, largest change first. */
	inputs: SensitivityRow[];
	notRanked: { input: SensitivityInput; reason: string }[];
}

export interface SensitivityOptions {
	designLifeYears: number;
	/** SD of C_crit (same unit), an assumption; C_crit is not ranked without it. */
	criticalContentSd?: number;
	/** SD of the ageing exponent α, an assumption; α is not ranked without it. */
	ageingExponentSd?: number;
}

type Evaluate = (sources: FrontSource[], critical: number, cover: CoverMove | null) => number;
interface CoverMove {
	shiftMm: number;
	spread: number;
	meanMm: number;
}

function standardErrorOfMean(values: number[], single: number): number {
	const m = values.length;
	if (m < 2) return single;
	const mean = values.reduce((s, v) => s + v, 0) / m;
	return Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (m - 1) / m);
}

function coverStatistics(sorted: Float64Array): { mean: number; sd: number } {
	let sum = 0;
	for (const c of sorted) sum += c;
	const mean = sum / sorted.length;
	let ss = 0;
	for (const c of sorted) ss += (c - mean) ** 2;
	return { mean, sd: sorted.length > 1 ? Math.sqrt(ss / (sorted.length - 1)) : 0 };
}

/** A chloride source rebuilt with changed values (refit of the front law only). */
function movedChloride(
	s: FrontSource,
	critical: number,
	change: { cs?: number; da?: number; alpha?: number }
): FrontSource {
	const f = s.chloride;
	if (!f) return s;
	const alpha = Math.min(0.999, Math.max(0, f.ageingExponent + (change.alpha ?? 0)));
	const moved = {
		...f,
		surfaceContent: f.surfaceContent + (change.cs ?? 0),
		dMm2PerYear: Math.max(0, f.dMm2PerYear + (change.da ?? 0)),
		ageingExponent: alpha
	};
	const coefficient = chlorideFrontCoefficient(
		moved.surfaceContent,
		f.initialContent.value,
		critical,
		moved.dMm2PerYear,
		f.ageYears,
		alpha
	);
	return { ...s, chloride: moved, coefficient, exponent: (1 - alpha) / 2 };
}

function row(
	input: SensitivityInput,
	sd: number,
	basis: string,
	share: number,
	at: (sign: number) => number
): SensitivityRow {
	const shareMinus = at(-1);
	const sharePlus = at(1);
	const largestChange = Math.max(Math.abs(shareMinus - share), Math.abs(sharePlus - share));
	return { input, sd, basis, shareMinus, sharePlus, largestChange };
}

/**
 * Rank the inputs of a measured-front projection by the change of the share depassivated at
 * the design life when each is moved by ∓1 SD (see the file comment for each SD).
 * Units: covers mm (sorted), contents as the profiles, design life years. Cost O(n) once plus
 * O(m·log n) for each of ≤ 12 recomputations.
 * @example depassivationSensitivity(sorted, front, { designLifeYears: 50, criticalContentSd: 0.1 }).inputs[0]
 */
export function depassivationSensitivity(
	sortedCoversMm: Float64Array,
	front: MeasuredFront,
	options: SensitivityOptions
): DepassivationSensitivity {
	requireReadings('depassivationSensitivity', sortedCoversMm.length, 2);
	const t = options.designLifeYears;
	if (!(Number.isFinite(t) && t >= 0)) throw new Error('design life must be a number of years ≥ 0');
	for (const [name, v] of [
		['C_crit SD', options.criticalContentSd],
		['ageing exponent SD', options.ageingExponentSd]
	] as const)
		if (v !== undefined && !(Number.isFinite(v) && v >= 0))
			throw new Error(`${name} must be a number ≥ 0`);
	const { sources } = frontSources(front);
	const critical = front.kind === 'chloride' ? front.criticalContent : 0;
	const evaluate: Evaluate = (list, crit, cover) => {
		const resolved =
			front.kind === 'chloride' && crit !== critical
				? list.map((s) => movedChloride(s, crit, {}))
				: list;
		return shareBelowFronts(
			(d) => countBelowSorted(sortedCoversMm, d),
			sortedCoversMm.length,
			resolved.map((s) => s.coefficient),
			resolved.map((s) => s.exponent),
			t,
			cover
		);
	};
	const share = evaluate(sources, critical, null);
	const rows: SensitivityRow[] = [];
	const notRanked: DepassivationSensitivity['notRanked'] = [];
	const { mean, sd } = coverStatistics(sortedCoversMm);
	const n = sortedCoversMm.length;
	const seMean = sd / Math.sqrt(n);
	rows.push(
		row('cover-mean', seMean, 'standard error of the mean cover, s/√n', share, (k) =>
			evaluate(sources, critical, { shiftMm: k * seMean, spread: 1, meanMm: mean })
		)
	);
	const seSd = sd / Math.sqrt(2 * (n - 1));
	if (sd > 0)
		rows.push(
			row('cover-sd', seSd, 'standard error of the cover SD, s/√(2(n − 1))', share, (k) =>
				evaluate(sources, critical, { shiftMm: 0, spread: (sd + k * seSd) / sd, meanMm: mean })
			)
		);
	else notRanked.push({ input: 'cover-sd', reason: 'every cover reading is the same' });
	if (front.kind === 'carbonation') {
		const se = standardErrorOfMean(
			sources.map((s) => s.coefficient),
			sources[0].carbonation?.se ?? 0
		);
		rows.push(
			row('carbonation-rate', se, 'standard error of the mean k over locations', share, (k) =>
				evaluate(
					sources.map((s) => {
						const moved = Math.max(0, s.coefficient + k * se);
						return { ...s, coefficient: moved };
					}),
					critical,
					null
				)
			)
		);
	} else chlorideRows(sources, critical, options, share, evaluate, rows, notRanked);
	rows.sort((x, y) => y.largestChange - x.largestChange);
	return { designLifeYears: t, share, inputs: rows, notRanked };
}

function chlorideRows(
	sources: FrontSource[],
	critical: number,
	options: SensitivityOptions,
	share: number,
	evaluate: Evaluate,
	rows: SensitivityRow[],
	notRanked: DepassivationSensitivity['notRanked']
): void {
	const fits = sources.map((s) => s.chloride).filter((f) => f !== undefined);
	const seCs = standardErrorOfMean(
		fits.map((f) => f.surfaceContent),
		fits[0].surfaceContentSe
	);
	const seDa = standardErrorOfMean(
		fits.map((f) => f.dMm2PerYear),
		fits[0].dSeMm2PerYear
	);
	const basis =
		fits.length > 1 ? 'standard error of the mean over profiles' : "the fit's standard error";
	const moveAll = (change: { cs?: number; da?: number; alpha?: number }) =>
		sources.map((s) => movedChloride(s, critical, change));
	rows.push(
		row('surface-content', seCs, basis, share, (k) =>
			evaluate(moveAll({ cs: k * seCs }), critical, null)
		),
		row('diffusion-coefficient', seDa, `${basis} (mm²/year)`, share, (k) =>
			evaluate(moveAll({ da: k * seDa }), critical, null)
		)
	);
	const sdCrit = options.criticalContentSd;
	if (sdCrit === undefined)
		notRanked.push({ input: 'critical-content', reason: 'no SD stated for C_crit' });
	else
		rows.push(
			row('critical-content', sdCrit, 'stated SD (an assumption)', share, (k) =>
				evaluate(sources, Math.max(0, critical + k * sdCrit), null)
			)
		);
	const sdAlpha = options.ageingExponentSd;
	if (sdAlpha === undefined)
		notRanked.push({ input: 'ageing-exponent', reason: 'no SD stated for the ageing exponent' });
	else
		rows.push(
			row('ageing-exponent', sdAlpha, 'stated SD (an assumption), kept within [0, 1)', share, (k) =>
				evaluate(moveAll({ alpha: k * sdAlpha }), critical, null)
			)
		);
}
