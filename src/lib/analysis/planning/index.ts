/**
 * Survey planning: how many readings a population needs, and what the rule set then does.
 */
export { binomialCdf } from './binomial';
export {
	characteristicFactor,
	characteristicPenaltyMm,
	readingsForPenalty,
	MAX_PLANNED_READINGS
} from './penalty';
export {
	acceptanceNumber,
	characteristicRuleOc,
	fractionRuleOc,
	ruleOc,
	EXACT_OC,
	type OcMethod,
	type RuleOcSettings
} from './operatingCharacteristic';
export { readingsForRule, type Discrimination, type RuleReadings } from './requiredReadings';
export { simulateRuleSetOc, type SimulatedPoint } from './simulate';
export {
	planPopulation,
	draftPlan,
	simulatePoint,
	completePlan,
	SIMULATION_READINGS_PER_POINT,
	type PlanDraft,
	type Criterion,
	type OcCurve,
	type PlanSettings,
	type PopulationPlan,
	type PopulationToPlan
} from './planPopulation';
