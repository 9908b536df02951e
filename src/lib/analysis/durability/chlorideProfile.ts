/**
 * A measured chloride profile as entered: depth increments with their contents, the age at
 * sampling and the initial content Ci; the checks of that input and the choice of the points
 * fitted (mid-depths, the outermost increment left out as ASTM C1556 and NT BUILD 443 do).
 */

export interface ChlorideIncrement {
	/** Depth of the increment's top and bottom below the exposed surface, mm. */
	fromMm: number;
	toMm: number;
	/** Chloride content of the increment (% by mass of binder). */
	content: number;
	/** The increment at the surface, left out of the fit; by default the shallowest one. */
	outermost?: boolean;
}

export interface ChlorideProfile {
	memberId?: number | string;
	label?: string;
	increments: readonly ChlorideIncrement[];
	/** Age of the concrete at sampling, years. */
	ageYears: number;
	/** Initial (background) content Ci, same unit as the increments. */
	initialContent?: number;
	/** How Ci was obtained: on a deep sample ('measured') or taken from elsewhere ('stated'). */
	initialContentBasis?: 'measured' | 'stated';
}

export interface ChlorideFitPoint {
	depthMm: number;
	content: number;
	used: boolean;
	/** Fitted content at this depth (fitted profiles only). */
	fittedContent?: number;
}

/** Ci as used, with how it was obtained. */
export interface InitialContent {
	value: number;
	basis: 'measured' | 'stated';
}

/** Fewest increments left after the exclusion: two parameters and one degree of freedom. */
export const MIN_FITTED_INCREMENTS = 3;

export function checkProfile(profile: ChlorideProfile): void {
	if (!(Number.isFinite(profile.ageYears) && profile.ageYears > 0))
		throw new Error('chloride profile: age at sampling must be a number of years > 0');
	profile.increments.forEach((inc, i) => {
		const where = `chloride profile increment ${i + 1}`;
		if (!(Number.isFinite(inc.fromMm) && inc.fromMm >= 0 && Number.isFinite(inc.toMm)))
			throw new Error(`${where}: depths must be numbers ≥ 0 mm`);
		if (!(inc.toMm > inc.fromMm)) throw new Error(`${where}: "to" must be deeper than "from"`);
		if (!(Number.isFinite(inc.content) && inc.content >= 0))
			throw new Error(`${where}: content must be a number ≥ 0`);
	});
}

export function initialContentOf(
	profile: ChlorideProfile,
	statedContent: number | undefined
): InitialContent {
	const value = profile.initialContent ?? statedContent;
	if (value === undefined)
		throw new Error(
			'chloride profile needs an initial content Ci: measured on a deep sample, or stated'
		);
	if (!(Number.isFinite(value) && value >= 0))
		throw new Error('chloride profile: initial content Ci must be a number ≥ 0');
	const basis = profile.initialContent === undefined ? 'stated' : profile.initialContentBasis;
	return { value, basis: basis ?? 'stated' };
}

/** Points by mid-depth; the flagged increments, or else the shallowest one, left out. */
export function choosePoints(profile: ChlorideProfile, exclude: boolean): ChlorideFitPoint[] {
	const sorted = [...profile.increments].sort((a, b) => a.fromMm + a.toMm - (b.fromMm + b.toMm));
	const flagged = sorted.some((i) => i.outermost);
	return sorted.map((inc, i) => ({
		depthMm: (inc.fromMm + inc.toMm) / 2,
		content: inc.content,
		used: !exclude || (flagged ? !inc.outermost : i > 0)
	}));
}

export function checkAgeing(alpha: number): number {
	if (!(alpha >= 0 && alpha < 1)) throw new Error('chloride ageing exponent must be in [0, 1)');
	return alpha;
}
