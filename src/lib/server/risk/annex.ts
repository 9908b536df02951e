/**
 * The risk annex: what the engine says about each population's future, computed once from the
 * readings while the assessment is a draft and then kept with it (the snapshot has no readings).
 */
import {
	countBelowCounted,
	type CountedSample,
	ENGINE_VERSION,
	expandCounted,
	mergeCounted,
	momentsCounted,
	toPlainJson
} from '$lib/analysis';
import { populationRisk, type PopulationRisk } from './compute';
import type { MeasuredRiskInput, PopulationMeasurements } from './measured';
import { modelKindFor } from './model';
import {
	CHLORIDE_DEFAULTS,
	SIMULATION,
	withDefaults,
	type DurabilityParameters,
	type ExposureParameters
} from './parameters';
import { ageAtSurveyYears, type SnapshotLike } from './source';

/** 2: populations carry the projection from measured fronts (`measured`), when there is one. */
export const ANNEX_SCHEMA_VERSION = 2;

export interface MemberSummary {
	id: number;
	label: string;
	populationId: string;
	face: string;
	n: number;
	meanMm: number | null;
	minMm: number | null;
	maxMm: number | null;
	belowCMin: number;
	gridWidthMm: number | null;
	gridHeightMm: number | null;
}

export interface RiskAnnex {
	schemaVersion: typeof ANNEX_SCHEMA_VERSION;
	engineVersion: string;
	designLifeYears: number;
	ageAtSurveyYears: number | null;
	parameters: DurabilityParameters;
	simulation: typeof SIMULATION;
	populations: PopulationRisk[];
	members: MemberSummary[];
}

/** What the database gives for each member in the snapshot's populations. */
export interface MemberData {
	/** The member's covers as counts of distinct values (its stored summary); null with none. */
	sample: CountedSample | null;
	gridWidthMm: number | null;
	gridHeightMm: number | null;
}

export class ReadingsChangedError extends Error {}

/** The key under which an asset's measurements are grouped: a population's type and exposure. */
export const measurementKey = (memberType: string, exposureClass: string) =>
	`${memberType}|${exposureClass}`;

/**
 * SD of C_crit for the sensitivity ranking: fib Bulletin 34 (2006) B.2.2 describes C_crit by a
 * beta distribution of mean 0.6 and SD 0.15 % by mass of binder — from memory, not checked.
 */
export const CRITICAL_CONTENT_SD = {
	value: 0.15,
	source: 'fib Bulletin 34 (2006), B.2.2: SD 0.15 % of binder — from memory, not checked'
};

/** C_crit (an assumption, with its source), the stated Ci and the seed for measured fronts. */
function measuredSettings(
	exposureClass: string,
	p: ExposureParameters | null
): Pick<MeasuredRiskInput, 'critical' | 'statedInitialContent' | 'seed'> | undefined {
	if (!p) return undefined;
	if (p.kind === 'carbonation')
		return {
			critical: { value: 0, sd: 0, source: '' },
			statedInitialContent: 0,
			seed: SIMULATION.seed
		};
	const fallback = CHLORIDE_DEFAULTS[exposureClass]?.criticalContent;
	const source =
		fallback && fallback.value === p.criticalContent
			? `Default: ${fallback.source}`
			: 'Entered by the engineer for this assessment.';
	return {
		critical: {
			value: p.criticalContent,
			sd: CRITICAL_CONTENT_SD.value,
			source: `${source} SD for the sensitivity: ${CRITICAL_CONTENT_SD.source}.`
		},
		statedInitialContent: p.initialContent,
		seed: SIMULATION.seed
	};
}

function summarise(
	id: number,
	label: string,
	face: string,
	populationId: string,
	cMinMm: number | null,
	data: MemberData
): MemberSummary {
	const c = data.sample;
	const n = c?.n ?? 0;
	return {
		id,
		label,
		populationId,
		face,
		n,
		meanMm: c && n ? momentsCounted(c).mean : null,
		minMm: c && n ? c.values[0] : null,
		maxMm: c && n ? c.values[c.values.length - 1] : null,
		belowCMin: c === null || cMinMm === null ? 0 : countBelowCounted(c, cMinMm),
		gridWidthMm: data.gridWidthMm,
		gridHeightMm: data.gridHeightMm
	};
}

/** Scanned area (m²) as the sum of the members' grid extents; null if any member lacks one. */
export function areaOfMembersM2(
	members: readonly Pick<MemberSummary, 'gridWidthMm' | 'gridHeightMm'>[]
): number | null {
	let mm2 = 0;
	for (const m of members) {
		if (m.gridWidthMm === null || m.gridHeightMm === null) return null;
		mm2 += m.gridWidthMm * m.gridHeightMm;
	}
	return mm2 / 1e6;
}

/**
 * Build the annex from a snapshot, the members' readings and the parameters entered (defaults
 * filled in). Throws ReadingsChangedError when a population's readings no longer number what the
 * snapshot counted: the draft must be saved again first.
 */
export function buildAnnex(
	snapshot: SnapshotLike,
	data: Map<number, MemberData>,
	entered: DurabilityParameters,
	measurements: Map<string, PopulationMeasurements> = new Map()
): RiskAnnex {
	const classes = snapshot.populations
		.map((p) => p.key.exposureClass)
		.filter((x) => modelKindFor(x) !== null);
	const parameters = withDefaults(classes, entered);
	const ageAtSurvey = ageAtSurveyYears(snapshot);
	const designLife = snapshot.asset.designServiceLifeYears;
	const members: MemberSummary[] = [];
	const populations = snapshot.populations.map((p) => {
		const cMinMm = p.assessment?.requirement.cMinMm ?? null;
		const own = p.members.map((m) =>
			summarise(
				m.id,
				m.label,
				m.face,
				p.id,
				cMinMm,
				data.get(m.id) ?? { sample: null, gridWidthMm: null, gridHeightMm: null }
			)
		);
		for (const member of own) members.push(member);
		// The durability engine takes sorted covers: expanded from the merged counts (the
		// summaries are what is read; the array lives only while the annex is built).
		const covers = expandCounted(
			mergeCounted(p.members.flatMap((m) => data.get(m.id)?.sample ?? []))
		);
		const expected = p.assessment?.description.n ?? covers.length;
		if (covers.length !== expected) {
			throw new ReadingsChangedError(
				`The readings of ${p.label} have changed since the draft was computed (${expected} then, ${covers.length} now): save the draft again.`
			);
		}
		const chosen = parameters[p.key.exposureClass] ?? null;
		const measured = measurements.get(measurementKey(p.key.memberType, p.key.exposureClass));
		const settings = measuredSettings(p.key.exposureClass, chosen);
		return populationRisk({
			populationId: p.id,
			label: p.label,
			memberType: p.key.memberType,
			exposureClass: p.key.exposureClass,
			memberCount: p.members.length,
			areaM2: areaOfMembersM2(own),
			assessment: p.assessment,
			sortedCoversMm: covers,
			parameters: chosen,
			designLifeYears: designLife,
			ageAtSurveyYears: ageAtSurvey,
			...(measured && settings ? { measurements: measured, measuredSettings: settings } : {})
		});
	});
	return toPlainJson({
		schemaVersion: ANNEX_SCHEMA_VERSION,
		engineVersion: ENGINE_VERSION,
		designLifeYears: designLife,
		ageAtSurveyYears: ageAtSurvey,
		parameters,
		simulation: SIMULATION,
		populations,
		members
	});
}

/**
 * The annex of an approved assessment for which no durability parameters were entered: cover
 * figures only, no projections (nothing is computed that the signed assessment did not hold).
 */
export function coverOnlyAnnex(snapshot: SnapshotLike): RiskAnnex {
	const designLife = snapshot.asset.designServiceLifeYears;
	const ageAtSurvey = ageAtSurveyYears(snapshot);
	return toPlainJson({
		schemaVersion: ANNEX_SCHEMA_VERSION,
		engineVersion: snapshot.engineVersion,
		designLifeYears: designLife,
		ageAtSurveyYears: ageAtSurvey,
		parameters: {},
		simulation: SIMULATION,
		populations: snapshot.populations.map((p) =>
			populationRisk({
				populationId: p.id,
				label: p.label,
				memberType: p.key.memberType,
				exposureClass: p.key.exposureClass,
				memberCount: p.members.length,
				areaM2: null,
				assessment: p.assessment,
				sortedCoversMm: new Float64Array(0),
				parameters: null,
				designLifeYears: designLife,
				ageAtSurveyYears: ageAtSurvey
			})
		),
		members: []
	});
}
