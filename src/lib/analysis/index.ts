/**
 * Fractile analysis engine: the public API. Pure TypeScript, no I/O; usable on server and browser.
 */
export { ENGINE_VERSION } from './version';
export {
	assessPopulation,
	assessPopulationCounted,
	type PopulationAssessment
} from './assessPopulation';
export {
	type AssessOptions,
	type ModelChoice,
	type ResolvedOptions,
	resolveOptions
} from './assessOptions';
export { toSortedCovers, toSortedValues, countBelowSorted, countAtOrBelowSorted } from './readings';
export { percentileSorted, type PercentileType } from './percentile';
export { describeSorted, type CoverDescription } from './describe';
export {
	fitNormal,
	fitLognormal,
	modelCdf,
	modelPdf,
	modelQuantile,
	type FittedModel,
	type ModelName
} from './fitModels';
export {
	andersonDarling,
	andersonDarlingPValue,
	type AndersonDarlingResult
} from './andersonDarling';
export { kolmogorovSmirnov, lillieforsPValue, type KolmogorovSmirnovResult } from './lilliefors';
export {
	compareModels,
	compareModelsCounted,
	FIT_SIGNIFICANCE,
	type ModelComparison,
	type ModelFit
} from './goodnessOfFit';
export {
	erf,
	erfc,
	erfcInverse,
	logNormalCdf,
	normalCdf,
	normalPdf,
	normalQuantile,
	normalUpperQuantile
} from './normalDistribution';
export { noncentralTCdf } from './noncentralT';
export {
	predictionFactor,
	toleranceFactor,
	fractionBelowUpperBound
} from './characteristicFactors';
export {
	characteristicCovers,
	chosenCharacteristicMm,
	type CharacteristicCovers,
	type CharacteristicMethod
} from './characteristicCover';
export { clopperPearsonInterval, clopperPearsonLower, clopperPearsonUpper } from './clopperPearson';
export { fractionBelow, type FractionBelow } from './fractionBelow';
export { histogramCounted, histogramSorted, type HistogramBin } from './histogram';
export {
	chartData,
	chartDataCounted,
	ecdfPoints,
	ecdfPointsCounted,
	modelCurves,
	normalProbabilityPlot,
	normalProbabilityPlotCounted,
	type ChartData
} from './charts';

export {
	type CoverRequirement,
	type CodeSystem,
	DEFAULT_ALLOWED_FRACTION_BELOW,
	projectRequirement,
	roundMm
} from './requirements/requirement';
export {
	cMinDurMm,
	enRequirement,
	structuralClassEn,
	type ExposureClass,
	type StructuralClass,
	type EnRequirementInput
} from './requirements/en1992';
export {
	aciCoverToleranceMm,
	aciRequirement,
	aciSpecifiedCoverIn,
	type AciBarSize,
	type AciExposure,
	type AciMember
} from './requirements/aci';
export {
	RULE_SETS,
	defaultRuleSet,
	runRuleSet,
	type RuleSetName,
	type RuleSetResult
} from './rules/ruleSets';
export type { RuleId, RuleOutcome, RuleResult, RuleContext } from './rules/ruleTypes';
export {
	verifyMeter,
	correctReadings,
	differenceSdMm,
	MIN_VERIFICATION_HOLES,
	type MeterVerification
} from './meterVerification';
export {
	calibrateReading,
	CalibrationRefused,
	fitCalibration,
	MIN_SLOPE_HOLES,
	predictionSeMm,
	type CalibratedReading,
	type CalibrationModel,
	type MeterCalibration
} from './meterCalibration';
export {
	applySpread,
	assessCalibrated,
	CALIBRATION_METHOD_WORDS,
	calibratedSpread,
	calibrationLineWords,
	predictiveShareBelow,
	type CalibratedAssessment,
	type CalibratedSpread,
	type CoverSampleInput
} from './calibratedPopulation';
export {
	barPositionFromScan,
	nearestStandardBarMm,
	shareMatchingDiameter,
	spacingSummary,
	spacingsFromPositions,
	standardBarDiametersMm,
	type SpacingSummary
} from './barsAndSpacing';
export {
	carbonationDepthMm,
	carbonationRateFromDepth,
	carbonationTimeToDepassivationYears
} from './durability/carbonation';
export {
	apparentDiffusionMm2PerYear,
	chlorideContentAt,
	chlorideCriticalDepthMm,
	chlorideTimeToDepassivationYears,
	m2PerSToMm2PerYear,
	mm2PerYearToM2PerS,
	type ChlorideModel
} from './durability/chloride';
export {
	carbonationFront,
	carbonationRate,
	carbonationRates,
	type CarbonationCharacteristicMethod,
	type CarbonationRate,
	type CarbonationRatePopulation,
	type CarbonationTest
} from './durability/carbonationRates';
export { chloridePercentOfBinder } from './durability/chlorideContentBasis';
export {
	MIN_FITTED_INCREMENTS,
	type ChlorideFitPoint,
	type ChlorideIncrement,
	type ChlorideProfile,
	type InitialContent
} from './durability/chlorideProfile';
export {
	chlorideModelFromFit,
	fitChlorideProfile,
	type ChlorideFit,
	type ChlorideFitOptions,
	type ChlorideFitRefused,
	type ChlorideFitted
} from './durability/chlorideProfileFit';
export { type MeasuredFront } from './durability/measuredFront';
export {
	measuredDepassivation,
	type MeasuredDepassivationNow
} from './durability/measuredDepassivation';
export {
	projectMeasuredDepassivation,
	type MeasuredProjection,
	type ProjectionOptions
} from './durability/measuredProjection';
export {
	depassivationSensitivity,
	type DepassivationSensitivity,
	type SensitivityInput,
	type SensitivityOptions,
	type SensitivityRow
} from './durability/depassivationSensitivity';
export {
	depassivationAssessment,
	timesToDepassivationYears,
	type DepassivationAtAge,
	type DurabilityModel,
	type DepassivationOptions
} from './durability/depassivation';
export {
	FIB_TARGET_BETA_DEPASSIVATION,
	meetsTargetBeta,
	reliabilityIndex
} from './durability/reliability';
export { mulberry32, normalSampler } from './durability/prng';
export {
	MM_PER_INCH,
	coversFromInches,
	formatCover,
	inchToMm,
	mmToInch,
	type LengthUnit
} from './units';
export { toPlainJson } from './plainJson';
export { pooledRanks, pooledRanksCounted, poolSorted, type PooledRanks } from './midRanks';
export { kruskalWallis, kruskalWallisFromRanks, type KruskalWallisResult } from './kruskalWallis';
export { oneWayAnova, oneWayAnovaCounted, type OneWayAnovaResult } from './oneWayAnova';
export { mannWhitney, mannWhitneyFromRanks, type MannWhitneyResult } from './mannWhitney';
export { holmAdjust } from './holm';
export {
	fitNormalMixture,
	fitNormalMixtureCounted,
	lowComponentShare,
	lowComponentShareCounted,
	type MixtureComponent,
	type MixtureOptions,
	type NormalMixture
} from './normalMixture';
export { detectResolutionMm, METER_STEPS_MM } from './resolution';
export { groupedChiSquare, type GroupedFitResult } from './groupedFit';
export {
	compareMembers,
	compareMembersCounted,
	MEMBER_SIGNIFICANCE,
	type MemberComparison,
	type MemberCovers,
	type MemberCounts,
	type MemberDifference
} from './memberComparison';
export * from './planning';
export {
	andersonDarlingCounted,
	characteristicCoversCounted,
	countAtOrBelowCounted,
	countBelowCounted,
	countedFromGridReadings,
	countedFromSorted,
	countedFromTally,
	describeCounted,
	expandCounted,
	fitLognormalCounted,
	fitNormalCounted,
	fractionBelowCounted,
	kolmogorovSmirnovCounted,
	mapCounted,
	mergeCounted,
	momentsCounted,
	orderStatisticsCounted,
	percentileCounted,
	type CountedMoments,
	type CountedSample
} from './countedSample';
export { detectGrid, gridStepMm, gridValue, type CoverGrid } from './coverGrid';
