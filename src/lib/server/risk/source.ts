/**
 * What the risk view and the report need from an approved assessment, as a narrow interface of
 * our own over the fields of AssessmentSnapshot (src/lib/server/assessments) that we read;
 * `fromSnapshot` is the one adapter, so a change to the snapshot's shape changes only this file.
 */
import type { MeterVerification, PopulationAssessment } from '$lib/analysis';
import type { CarriedCustomLike, LowAreaSummary } from '$lib/words';
import type { CalibrationOutcome } from '$lib/server/populations/calibration';

export interface SnapshotPopulationLike {
	id: string;
	key: { memberType: string; exposureClass: string; face?: string };
	label: string;
	members: { id: number; label: string; surveyId: number; face: string; readings: number }[];
	requirement: { governingMember: string; note: string | null };
	assessment: PopulationAssessment | null;
	problem: string | null;
	/** Present when the assessment was saved with the check-hole calibration applied. */
	calibration?: CalibrationOutcome;
}

export interface SnapshotSurveyLike {
	id: number;
	title: string;
	surveyDate: string;
	status: string;
	meterMake: string | null;
	meterSerial: string | null;
	meterCalibration: string | null;
}

export interface HoleLike {
	memberId: number;
	label: string;
	meterReadingMm: number;
	measuredCoverMm: number;
	method: string | null;
}

/** The subset of AssessmentSnapshot read here. */
export interface SnapshotLike {
	engineVersion: string;
	computedAt: string;
	asset: {
		id: number;
		name: string;
		locationText: string | null;
		designCode: string;
		designServiceLifeYears: number;
		yearOfConstruction: number | null;
	};
	survey: SnapshotSurveyLike | null;
	surveys: SnapshotSurveyLike[];
	populations: SnapshotPopulationLike[];
	meter: { holes: HoleLike[]; verification: MeterVerification | null; note: string | null };
	readingCount: number;
	/** Low-cover areas per population (populations/lowAreas.ts); absent in older snapshots. */
	lowAreas?: { members: (LowAreaSummary & { share: number })[] }[];
	/** The custom populations the assessment carries, apart from `populations`; absent in older snapshots. */
	custom?: CarriedCustomLike[];
	/** 'apply' when each population was also judged through its check holes. */
	calibration?: 'apply';
}

/** The assessment row's own fields that the report shows beside its snapshot. */
export interface AssessmentHeader {
	id: number;
	title: string;
	state: 'draft' | 'approved' | 'superseded';
	snapshotSha256: string;
	recommendations: string | null;
	approvedAt: string | null;
	approvedBy: string | null;
	createdBy: string | null;
	/** The organisation whose engineers prepared and approved it (the asset's organisation). */
	organisation: string | null;
}

/** Everything a risk view or a report is built from: header, snapshot, risk annex. */
export interface ReportSource {
	header: AssessmentHeader;
	snapshot: SnapshotLike;
}

/** Parse the stored snapshot text into the fields we read (written by the assessments' snapshot builder). */
export function fromSnapshot(text: string): SnapshotLike {
	const parsed = JSON.parse(text) as SnapshotLike;
	if (!parsed || !Array.isArray(parsed.populations) || !parsed.asset) {
		throw new Error('the stored assessment snapshot has no populations or asset');
	}
	return parsed;
}

/** The survey whose date fixes the structure's age at assessment (the chosen one, else the latest). */
export function referenceSurvey(snapshot: SnapshotLike): SnapshotSurveyLike | null {
	if (snapshot.survey) return snapshot.survey;
	const sorted = [...snapshot.surveys].sort((a, b) => a.surveyDate.localeCompare(b.surveyDate));
	return sorted.at(-1) ?? null;
}

/** Age of the structure (years) on the reference survey's date; null without a construction year. */
export function ageAtSurveyYears(snapshot: SnapshotLike): number | null {
	const survey = referenceSurvey(snapshot);
	const built = snapshot.asset.yearOfConstruction;
	if (!survey || built === null) return null;
	// Construction taken as mid-year: we know the year only.
	const surveyed = new Date(`${survey.surveyDate}T00:00:00Z`);
	const years = (surveyed.getTime() - Date.UTC(built, 6, 1)) / (365.25 * 86_400_000);
	return Math.max(0, Math.round(years * 10) / 10);
}
