/**
 * The one place that turns readings into judged populations: gather the members' cover counts
 * (groups.ts), requirement from the members (requirement.ts), figures from the engine's counted
 * assessment — never computed here, and never from the readings one by one.
 * The risk view, the reports and the API call these functions.
 */
import {
	assessPopulationCounted,
	ENGINE_VERSION,
	toPlainJson,
	type PopulationAssessment
} from '$lib/analysis';
import { calibrationOutcome, type CalibrationOutcome } from './calibration';
import { meterCheck } from './detail';
import { gatherGroups, keyId, type GatheredGroup, type PopulationKey } from './groups';
import {
	toAssessOptions,
	type CalibrationChoice,
	type GroupSelector,
	type MethodChoice,
	type Split
} from './query';
import { groupRequirement, type GroupRequirement } from './requirement';

export interface PopulationMember {
	id: number;
	label: string;
	surveyId: number;
	face: string;
	readings: number;
}

export interface PopulationResult {
	id: string;
	key: PopulationKey;
	/** Words for a heading, e.g. "deck · XD3 · top face". */
	label: string;
	members: PopulationMember[];
	requirement: GroupRequirement;
	/** The engine's result; null when the group has fewer than 2 readings. */
	assessment: PopulationAssessment | null;
	/** Why there is no assessment, in words. */
	problem: string | null;
	/**
	 * The population judged again through its members' check-hole calibration, beside the
	 * verdict as read (calibration.ts); only when the calibration was asked for.
	 */
	calibration?: CalibrationOutcome;
}

export interface PopulationScopeInput {
	assetId: number;
	surveyId?: number;
	/** The surveys whose readings count (selection.ts); absent, every survey. */
	surveyIds?: readonly number[];
	split: Split;
	choice: MethodChoice;
	/** Chart data for every population (snapshots for reports); default false. */
	charts?: boolean;
	/** 'apply': each population also judged through its members' check holes; default none. */
	calibration?: CalibrationChoice;
}

export function populationLabel(key: PopulationKey, members: readonly { label: string }[]) {
	const parts = [key.memberType, key.exposureClass];
	if (key.face) parts.push(`${key.face} face`);
	if (key.surveyId) parts.push(`survey ${key.surveyId}`);
	if (key.memberId) parts.push(`member ${members[0]?.label ?? key.memberId}`);
	return parts.join(' · ');
}

/** One gathered group judged by the engine (automatic groups and custom populations alike). */
export function judgeGroup(
	group: GatheredGroup,
	choice: MethodChoice,
	charts: boolean
): PopulationResult {
	const requirement = groupRequirement(group.members);
	const n = group.sample.n;
	const enough = n >= 2;
	return {
		id: group.id,
		key: group.key,
		label: populationLabel(group.key, group.members),
		members: group.members.map((m) => ({
			id: m.id,
			label: m.label,
			surveyId: m.surveyId,
			face: m.face,
			readings: group.countsByMember.get(m.id) ?? 0
		})),
		requirement,
		assessment: enough
			? assessPopulationCounted(
					group.sample,
					requirement.requirement,
					toAssessOptions(choice, charts)
				)
			: null,
		problem: enough ? null : `Only ${n} reading${n === 1 ? '' : 's'}: at least 2 are needed.`
	};
}

export interface PopulationOverview {
	engineVersion: string;
	choice: MethodChoice;
	split: Split;
	populations: PopulationResult[];
}

/** Every population of an asset (or one survey of it), judged without chart data. */
export async function populationOverview(input: PopulationScopeInput): Promise<PopulationOverview> {
	const groups = await gatherGroups(
		{ assetId: input.assetId, surveyId: input.surveyId, surveyIds: input.surveyIds },
		input.split
	);
	const populations = groups.map((g) => judgeGroup(g, input.choice, input.charts ?? false));
	if (input.calibration === 'apply') {
		for (const [i, group] of groups.entries()) {
			const meter = await meterCheck(group.members.map((m) => m.id));
			populations[i].calibration = toPlainJson(
				calibrationOutcome(populations[i], group, meter, input.choice)
			);
		}
	}
	return { engineVersion: ENGINE_VERSION, choice: input.choice, split: input.split, populations };
}

export interface DetailGathered {
	result: PopulationResult;
	group: GatheredGroup;
}

/**
 * One population picked by its key (type × exposure, and face, member or survey when the
 * overview was split so), judged with chart data; null when no member matches.
 */
export async function populationDetail(
	input: Omit<PopulationScopeInput, 'split'>,
	selector: GroupSelector
): Promise<DetailGathered | null> {
	const [group] = await gatherGroups(
		{
			assetId: input.assetId,
			surveyId: input.surveyId,
			surveyIds: input.surveyIds,
			memberType: selector.type,
			exposureClass: selector.exposure,
			face: selector.face,
			memberId: selector.member
		},
		'none'
	);
	if (!group) return null;
	const key: PopulationKey = {
		...group.key,
		...(selector.face ? { face: selector.face } : {}),
		...(input.surveyId ? { surveyId: input.surveyId } : {}),
		...(selector.member ? { memberId: selector.member } : {})
	};
	const keyed = { ...group, key, id: keyId(key) };
	return { result: judgeGroup(keyed, input.choice, true), group: keyed };
}
