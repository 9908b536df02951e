/**
 * The assessment snapshot: everything an approved assessment says, frozen as JSON text with its
 * sha256. The owner's risk view and the PDF are rendered from it, so it carries what they
 * need without the readings: populations with the engine's full results and chart data, the
 * methods and parameters chosen, the asset and survey identity, the meter verification and the
 * engine version. It is never altered after approval (service.ts, Assessment model hook and the
 * database trigger of migration 005).
 */
import { createHash } from 'node:crypto';
import { ENGINE_VERSION } from '$lib/analysis';
import { Asset, Survey } from '$lib/server/db';
import {
	customOverview,
	meterCheck,
	populationLowAreas,
	populationOverview,
	type CalibrationChoice,
	type MeterCheck,
	type MethodChoice,
	type JudgedCustomPopulation,
	type PopulationLowAreas,
	type PopulationResult,
	type Split,
	type SurveySelection
} from '$lib/server/populations';

export const SNAPSHOT_SCHEMA_VERSION = 1;

export interface SnapshotSurvey {
	id: number;
	title: string;
	surveyDate: string;
	status: string;
	meterMake: string | null;
	meterSerial: string | null;
	meterCalibration: string | null;
}

export interface AssessmentSnapshot {
	schemaVersion: typeof SNAPSHOT_SCHEMA_VERSION;
	engineVersion: string;
	/** When the figures were computed (ISO 8601, UTC). */
	computedAt: string;
	asset: {
		id: number;
		name: string;
		locationText: string | null;
		designCode: string;
		designServiceLifeYears: number;
		yearOfConstruction: number | null;
	};
	/** The survey assessed, or null when the assessment covers every survey of the asset. */
	survey: SnapshotSurvey | null;
	/** Every survey whose readings are in the populations. */
	surveys: SnapshotSurvey[];
	scope: {
		surveyId: number | null;
		split: Split;
		/** The surveys whose readings count, and how they were picked (selection.ts). */
		surveyIds?: number[];
		selection?: SurveySelection['basis'];
		selectionWords?: string;
	};
	/** The methods and parameters chosen; each population's `assessment.options` has them resolved. */
	methods: MethodChoice;
	/** Judged populations, with chart data (`assessment.charts`) for reports. */
	populations: PopulationResult[];
	/** The meter's verification from every hole in the populations' members. */
	meter: MeterCheck;
	readingCount: number;
	/** Each population's members with areas below c_min (lowAreas.ts); absent in older snapshots. */
	lowAreas?: PopulationLowAreas[];
	/**
	 * The populations the engineers made (members split out of a group, or chosen by hand), each
	 * with its member ids and judged over the same surveys and methods; kept apart from
	 * `populations` so no member counts twice in the risk annex. Only those the engineer chose to
	 * carry (all of the asset's when the save named none). Absent in older snapshots.
	 */
	custom?: JudgedCustomPopulation[];
	/**
	 * 'apply' when the engineer asked for each population to be judged again through its
	 * members' check-hole calibration (each population's `calibration`); absent otherwise.
	 */
	calibration?: 'apply';
}

function surveyOf(s: Survey): SnapshotSurvey {
	return {
		id: s.id,
		title: s.title,
		surveyDate: s.surveyDate,
		status: s.status,
		meterMake: s.meterMake,
		meterSerial: s.meterSerial,
		meterCalibration: s.meterCalibration
	};
}

/** Compute a snapshot of an asset's populations now. */
export async function buildSnapshot(
	asset: Asset,
	scope: { surveyId: number | null; split: Split },
	methods: MethodChoice,
	selection?: SurveySelection,
	/** The custom populations to carry; absent, every one of the asset. */
	customIds?: readonly number[],
	calibration: CalibrationChoice = 'none'
): Promise<AssessmentSnapshot> {
	const overview = await populationOverview({
		assetId: asset.id,
		surveyId: selection ? undefined : (scope.surveyId ?? undefined),
		surveyIds: selection?.surveyIds,
		split: scope.split,
		choice: methods,
		charts: true,
		calibration
	});
	const members = overview.populations.flatMap((p) => p.members);
	const surveyIds = [...new Set(members.map((m) => m.surveyId))];
	const surveys = await Survey.findAll({ where: { id: surveyIds }, order: [['id', 'ASC']] });
	const chosen = scope.surveyId ? surveys.find((s) => s.id === scope.surveyId) : null;
	return {
		schemaVersion: SNAPSHOT_SCHEMA_VERSION,
		engineVersion: ENGINE_VERSION,
		computedAt: new Date().toISOString(),
		asset: {
			id: asset.id,
			name: asset.name,
			locationText: asset.locationText,
			designCode: asset.designCode,
			designServiceLifeYears: asset.designServiceLifeYears,
			yearOfConstruction: asset.yearOfConstruction
		},
		survey: chosen ? surveyOf(chosen) : null,
		surveys: surveys.map(surveyOf),
		scope: selection
			? {
					...scope,
					surveyIds: selection.surveyIds,
					selection: selection.basis,
					selectionWords: selection.words
				}
			: scope,
		methods,
		populations: overview.populations,
		meter: await meterCheck(members.map((m) => m.id)),
		readingCount: members.reduce((sum, m) => sum + m.readings, 0),
		lowAreas: await populationLowAreas(overview.populations),
		custom: await customOverview({
			assetId: asset.id,
			surveyIds: selection?.surveyIds ?? (scope.surveyId ? [scope.surveyId] : undefined),
			choice: methods,
			ids: customIds,
			charts: true
		}),
		...(calibration === 'apply' ? { calibration } : {})
	};
}

/** The stored text of a snapshot and its sha256 (hex). */
export function serialiseSnapshot(snapshot: AssessmentSnapshot): { text: string; sha256: string } {
	const text = JSON.stringify(snapshot);
	return { text, sha256: sha256Hex(text) };
}

export function sha256Hex(text: string): string {
	return createHash('sha256').update(text, 'utf8').digest('hex');
}

/** Parse a stored snapshot (no re-validation: it was written by buildSnapshot). */
export function parseSnapshot(text: string): AssessmentSnapshot {
	return JSON.parse(text) as AssessmentSnapshot;
}
