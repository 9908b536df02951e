/**
 * A population's risk from what was measured on its asset: the carbonation tests or chloride
 * profiles of the asset's members of the population's type and exposure class, reduced by the
 * engine (src/lib/analysis/durability) to fronts, the share depassivated now and over time with
 * a seeded bootstrap band, and the input that matters most. Pure: the measurements come in as
 * plain data (store.ts reads them), and what comes out is kept in the annex, so an approved
 * assessment shows the measurements as they were when it was computed.
 */
import {
	carbonationRates,
	depassivationSensitivity,
	fitChlorideProfile,
	measuredDepassivation,
	projectMeasuredDepassivation,
	type ChlorideFit,
	type MeasuredFront,
	type SensitivityInput
} from '$lib/analysis';

/** One carbonation test as stored, its depths in mm. */
export interface CarbonationTestData {
	memberLabel: string;
	label: string;
	testedOn: string;
	ageYears: number;
	/** The depths read; a test logged as min/mean/max only gives its mean here. */
	depthsMm: number[];
	minMm: number | null;
	maxMm: number | null;
}

/** One chloride profile as stored, its contents converted to % by mass of binder. */
export interface ChlorideProfileData {
	memberLabel: string;
	label: string;
	testedOn: string;
	ageYears: number;
	initialContent: number | null;
	conversion: string | null;
	increments: { fromMm: number; toMm: number; content: number; outermost: boolean }[];
}

export interface PopulationMeasurements {
	carbonation: CarbonationTestData[];
	chloride: ChlorideProfileData[];
}

export interface MeasuredLocation {
	label: string;
	memberLabel: string;
	testedOn: string;
	ageYears: number;
	/** Carbonation: depths read, mean depth, k and its standard error. */
	readings?: number;
	meanDepthMm?: number;
	kMmPerSqrtYear?: number;
	kStandardError?: number | null;
	/** Chloride: the fit, or why it was refused; the points with the excluded increment marked. */
	fit?: {
		status: 'fitted' | 'refused';
		reason: string | null;
		surfaceContent: number | null;
		surfaceContentSe: number | null;
		dM2PerS: number | null;
		dSeM2PerS: number | null;
		residualSd: number | null;
		initialContent: { value: number; basis: 'measured' | 'stated' };
		points: { depthMm: number; content: number; used: boolean }[];
		conversion: string | null;
		warnings: string[];
	};
	/** Depth of this location's front at the design life (mm); null when refused or never. */
	frontAtDesignLifeMm: number | null;
	/** Share of the population's readings with cover < this location's front, at the design life. */
	shareAtDesignLife: number | null;
}

export interface MeasuredShare {
	years: number;
	share: number;
	low: number;
	high: number;
}

export interface MeasuredRisk {
	kind: 'carbonation' | 'chloride';
	convention: 'cover < front';
	locations: MeasuredLocation[];
	/** C_crit for chloride fronts: an assumption, stated with its source. */
	criticalContent: { value: number; sd: number; source: string } | null;
	now: MeasuredShare | null;
	atDesignLife: MeasuredShare;
	curve: MeasuredShare[];
	/** Shares at headline ages (the same bootstrap). */
	atAges: MeasuredShare[];
	bootstrap: { replicates: number; seed: number; probabilities: [number, number] };
	sensitivity: {
		input: SensitivityInput;
		sd: number;
		basis: string;
		shareMinus: number;
		sharePlus: number;
	} | null;
	warnings: string[];
}

/** C_crit and its spread for measured chloride fronts: assumptions, with their sources. */
export interface CriticalContentAssumption {
	value: number;
	sd: number;
	source: string;
}

export const BOOTSTRAP = { replicates: 1000, probabilities: [0.05, 0.95] as [number, number] };

function carbonationFront(tests: CarbonationTestData[]) {
	const population = carbonationRates(
		tests.map((t) => ({ label: t.label, depthsMm: t.depthsMm, ageYears: t.ageYears }))
	);
	const front: MeasuredFront = { kind: 'carbonation', rates: population.rates };
	const locations: MeasuredLocation[] = population.rates.map((r, i) => ({
		label: tests[i].label,
		memberLabel: tests[i].memberLabel,
		testedOn: tests[i].testedOn,
		ageYears: tests[i].ageYears,
		readings: r.readings,
		meanDepthMm: r.meanDepthMm,
		kMmPerSqrtYear: r.kMmPerSqrtYear,
		kStandardError: r.kStandardError,
		frontAtDesignLifeMm: null,
		shareAtDesignLife: null
	}));
	return { front, locations, warnings: population.warnings };
}

function fitSummary(fit: ChlorideFit, profile: ChlorideProfileData): MeasuredLocation['fit'] {
	const fitted = fit.status === 'fitted' ? fit : null;
	return {
		status: fit.status,
		reason: fit.status === 'refused' ? fit.reason : null,
		surfaceContent: fitted?.surfaceContent ?? null,
		surfaceContentSe: fitted?.surfaceContentSe ?? null,
		dM2PerS: fitted?.dM2PerS ?? null,
		dSeM2PerS: fitted?.dSeM2PerS ?? null,
		residualSd: fitted?.residualSd ?? null,
		initialContent: fit.initialContent,
		points: fit.points.map((p) => ({ depthMm: p.depthMm, content: p.content, used: p.used })),
		conversion: profile.conversion,
		warnings: fitted?.warnings ?? []
	};
}

function chlorideFront(
	profiles: ChlorideProfileData[],
	critical: CriticalContentAssumption,
	statedInitial: number
) {
	const fits = profiles.map((p) =>
		fitChlorideProfile(
			{
				label: p.label,
				ageYears: p.ageYears,
				increments: p.increments,
				...(p.initialContent === null
					? {}
					: { initialContent: p.initialContent, initialContentBasis: 'measured' as const })
			},
			{ initialContent: statedInitial }
		)
	);
	const front: MeasuredFront = { kind: 'chloride', fits, criticalContent: critical.value };
	const locations: MeasuredLocation[] = profiles.map((p, i) => ({
		label: p.label,
		memberLabel: p.memberLabel,
		testedOn: p.testedOn,
		ageYears: p.ageYears,
		fit: fitSummary(fits[i], p),
		frontAtDesignLifeMm: null,
		shareAtDesignLife: null
	}));
	const refused = fits.filter((f) => f.status === 'refused').length;
	const warnings = refused
		? [`${refused} of ${fits.length} profiles could not be fitted and are left out.`]
		: [];
	return { front, locations, warnings, usable: fits.length - refused };
}

export interface MeasuredRiskInput {
	sortedCoversMm: Float64Array;
	measurements: PopulationMeasurements;
	kind: 'carbonation' | 'chloride';
	designLifeYears: number;
	ageAtSurveyYears: number | null;
	headlineAges: readonly number[];
	curveAges: readonly number[];
	critical: CriticalContentAssumption;
	statedInitialContent: number;
	seed: number;
}

/**
 * The measured risk of one population, or null when it has no usable measurement of the kind
 * its exposure calls for (no tests, or every profile refused), or no readings.
 * Cost: the fits, one bootstrap of 1000 replicates, one sensitivity ranking.
 */
export function measuredRisk(input: MeasuredRiskInput): MeasuredRisk | null {
	const covers = input.sortedCoversMm;
	if (covers.length < 2) return null;
	const built =
		input.kind === 'carbonation'
			? input.measurements.carbonation.length
				? carbonationFront(input.measurements.carbonation)
				: null
			: input.measurements.chloride.length
				? chlorideFront(input.measurements.chloride, input.critical, input.statedInitialContent)
				: null;
	if (!built || ('usable' in built && built.usable === 0)) return null;
	const life = input.designLifeYears;
	const now = input.ageAtSurveyYears;
	const ages = [...input.headlineAges, ...(now === null ? [] : [now]), life, ...input.curveAges];
	const projection = projectMeasuredDepassivation(covers, built.front, {
		agesYears: ages,
		bandProbabilities: BOOTSTRAP.probabilities,
		replicates: BOOTSTRAP.replicates,
		seed: input.seed
	});
	const shares: MeasuredShare[] = projection.atAges.map((a) => ({
		years: a.ageYears,
		share: a.share,
		low: a.band[0].share,
		high: a.band[1].share
	}));
	const h = input.headlineAges.length;
	const atLife = measuredDepassivation(covers, built.front, life);
	// The engine lists the usable locations in order (refused profiles left out).
	const usable = built.locations.filter((l) => l.fit?.status !== 'refused');
	usable.forEach((location, i) => {
		location.frontAtDesignLifeMm = atLife.locations[i]?.frontDepthMm ?? null;
		location.shareAtDesignLife = atLife.locations[i]?.share ?? null;
	});
	const ranked = depassivationSensitivity(covers, built.front, {
		designLifeYears: life,
		...(input.kind === 'chloride' ? { criticalContentSd: input.critical.sd } : {})
	}).inputs[0];
	return {
		kind: input.kind,
		convention: 'cover < front',
		locations: built.locations,
		criticalContent: input.kind === 'chloride' ? input.critical : null,
		now: now === null ? null : shares[h],
		atDesignLife: shares[h + (now === null ? 0 : 1)],
		curve: shares.slice(h + (now === null ? 1 : 2)),
		atAges: shares.slice(0, h),
		bootstrap: {
			replicates: BOOTSTRAP.replicates,
			seed: input.seed,
			probabilities: BOOTSTRAP.probabilities
		},
		sensitivity: ranked
			? {
					input: ranked.input,
					sd: ranked.sd,
					basis: ranked.basis,
					shareMinus: ranked.shareMinus,
					sharePlus: ranked.sharePlus
				}
			: null,
		warnings: [...built.warnings, ...projection.warnings]
	};
}
