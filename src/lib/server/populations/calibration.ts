/**
 * A population judged again through the meter's check-hole calibration, its uncertainty
 * included (engine: assessCalibrated), beside the verdict as the meter logged it, and one
 * sentence saying whether applying it changes the outcome. Detail only.
 */
import {
	assessCalibrated,
	CALIBRATION_METHOD_WORDS,
	CalibrationRefused,
	fitCalibration,
	type CalibratedAssessment,
	type RuleOutcome
} from '$lib/analysis';
import { verdictWords } from '$lib/words';
import type { MeterCheck } from './detail';
import type { GatheredGroup } from './groups';
import { toAssessOptions, type MethodChoice } from './query';
import type { PopulationResult } from './service';

export interface CalibrationOutcome {
	/** The verdict as the meter logged the readings. */
	asRead: RuleOutcome | null;
	/** The population through the calibration; null when it was not applied (see problem). */
	calibrated: CalibratedAssessment | null;
	/** Why the calibration was not applied, in words; null when it was. */
	problem: string | null;
	/** Whether applying it changes the outcome, in words. */
	sentence: string;
	/** How the calibrated figures are obtained, in words. */
	method: string;
}

function outcomeSentence(asRead: RuleOutcome, calibrated: RuleOutcome): string {
	return asRead === calibrated
		? `Applying the check-hole calibration does not change the outcome: ${verdictWords(asRead)}.`
		: `Applying the check-hole calibration changes the outcome from ${verdictWords(asRead)} to ${verdictWords(calibrated)}.`;
}

/** The calibrated verdict of a judged population from its members' check holes. */
export function calibrationOutcome(
	result: PopulationResult,
	group: GatheredGroup,
	meter: MeterCheck,
	choice: MethodChoice
): CalibrationOutcome {
	const asRead = result.assessment?.verdict ?? null;
	const refused = (problem: string): CalibrationOutcome => ({
		asRead,
		calibrated: null,
		problem,
		sentence: `The check-hole calibration was not applied. ${problem}`,
		method: CALIBRATION_METHOD_WORDS
	});
	if (!result.assessment || asRead === null)
		return refused(result.problem ?? 'The population has no verdict to compare.');
	try {
		const calibration = fitCalibration(
			meter.holes.map((h) => h.meterReadingMm),
			meter.holes.map((h) => h.measuredCoverMm)
		);
		const calibrated = assessCalibrated(
			group.sample,
			calibration,
			result.requirement.requirement,
			toAssessOptions(choice, true)
		);
		return {
			asRead,
			calibrated,
			problem: null,
			sentence: outcomeSentence(asRead, calibrated.assessment.verdict),
			method: CALIBRATION_METHOD_WORDS
		};
	} catch (e) {
		if (e instanceof CalibrationRefused) return refused(e.message);
		throw e;
	}
}
