import { accounts } from './001-accounts';
import { surveys } from './002-surveys';
import { readings } from './003-readings';
import { assessments } from './004-assessments';
import { assessmentFreeze } from './005-assessment-freeze';
import { assessmentRisk } from './006-assessment-risk';
import { apiRateLimits } from './007-api-rate-limits';
import { intakeProgress } from './008-intake-progress';
import { coverSets } from './009-cover-sets';
import { secondApprover } from './010-second-approver';
import { durabilityMeasurements } from './011-durability-measurements';
import { coverCounts } from './012-cover-counts';
import { surveyPlans } from './013-survey-plans';
import { syncBatches } from './014-sync-batches';
import { customPopulations } from './015-custom-populations';
import { measurementImports } from './016-measurement-imports';
import { shorterCoverCounts } from './017-shorter-cover-counts';
import { dropCoverSets } from './018-drop-cover-sets';
import type { Migration } from './types';

/**
 * Every migration, in order. Listed by hand rather than found by a glob so Vite can bundle them
 * into the server build (STACK.md pitfall 8). A new migration is a new file plus a line here.
 */
export const migrations: Migration[] = [
	accounts,
	surveys,
	readings,
	assessments,
	assessmentFreeze,
	assessmentRisk,
	apiRateLimits,
	intakeProgress,
	coverSets,
	secondApprover,
	durabilityMeasurements,
	coverCounts,
	surveyPlans,
	syncBatches,
	customPopulations,
	measurementImports,
	shorterCoverCounts,
	dropCoverSets
];
