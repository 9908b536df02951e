/**
 * Which surveys' readings a population view or an assessment is made from. By default only
 * approved surveys count: readings still being entered or not yet checked should not decide a
 * verdict that is signed. Where an asset has no approved survey yet, the submitted ones are
 * shown (the engineer must look at them to review them) and the words say so. Any survey may be
 * chosen explicitly; the choice travels with the page URL into the saved assessment.
 */
import { Member, MemberCoverSet, Survey } from '$lib/server/db';
import { surveyStateWords } from '$lib/words';
import { counted } from '$lib/format';
import { InputError } from '$lib/server/domainErrors';

export interface SelectableSurvey {
	id: number;
	title: string;
	surveyDate: string;
	status: string;
	included: boolean;
}

export interface SurveySelection {
	/** The surveys whose readings count. */
	surveyIds: number[];
	/** Every survey of the asset, with its state and whether it is included. */
	surveys: SelectableSurvey[];
	/** 'chosen' when the URL named the surveys; otherwise how the default was found. */
	basis: 'chosen' | 'approved' | 'submitted' | 'none';
	/** One sentence on what is included, for the page and the save form. */
	words: string;
}

/** The `surveys` query parameter ("3,5") or the older single `survey` ("3"), as ids. */
export function requestedSurveyIds(scope: {
	survey?: number;
	surveys?: number[];
}): number[] | null {
	if (scope.surveys) return scope.surveys;
	if (scope.survey) return [scope.survey];
	return null;
}

function describe(surveys: SelectableSurvey[], basis: SurveySelection['basis']): string {
	const included = surveys.filter((s) => s.included);
	if (included.length === 0) {
		return basis === 'none'
			? 'This asset has no approved or submitted survey yet: choose the surveys to include.'
			: 'No survey is included.';
	}
	const notApproved = included.filter((s) => s.status !== 'approved');
	const list = included.map((s) => `${s.title} (${surveyStateWords(s.status)})`).join('; ');
	const lead =
		basis === 'approved'
			? `Approved surveys only, ${counted(included.length, 'survey', 'surveys')}: `
			: basis === 'submitted'
				? `No survey is approved yet, so the submitted ${counted(included.length, 'survey is', 'surveys are')} shown: `
				: `${counted(included.length, 'survey', 'surveys')} chosen: `;
	const caution =
		notApproved.length > 0
			? ` ${counted(notApproved.length, 'survey is', 'surveys are')} not approved; an assessment made from them says so.`
			: '';
	return `${lead}${list}.${caution}`;
}

/**
 * The surveys a view or assessment of this asset is made from. A requested id that is not a
 * survey of this asset is a 400 naming the `surveys` parameter.
 */
export async function surveySelection(
	assetId: number,
	requested: number[] | null
): Promise<SurveySelection> {
	const rows = await Survey.findAll({
		attributes: ['id', 'title', 'surveyDate', 'status'],
		where: { assetId },
		order: [
			['surveyDate', 'ASC'],
			['id', 'ASC']
		]
	});
	let basis: SurveySelection['basis'];
	let ids: Set<number>;
	if (requested) {
		const known = new Set(rows.map((s) => s.id));
		const unknown = requested.find((id) => !known.has(id));
		if (unknown !== undefined) {
			const words = `Survey ${unknown} is not a survey of this asset.`;
			throw new InputError(words, { surveys: [words] });
		}
		basis = 'chosen';
		ids = new Set(requested);
	} else {
		const approved = rows.filter((s) => s.status === 'approved');
		const submitted = rows.filter((s) => s.status === 'submitted');
		basis = approved.length > 0 ? 'approved' : submitted.length > 0 ? 'submitted' : 'none';
		ids = new Set((approved.length > 0 ? approved : submitted).map((s) => s.id));
	}
	const surveys = rows.map((s) => ({
		id: s.id,
		title: s.title,
		surveyDate: s.surveyDate,
		status: s.status,
		included: ids.has(s.id)
	}));
	return {
		surveyIds: surveys.filter((s) => s.included).map((s) => s.id),
		surveys,
		basis,
		words: describe(surveys, basis)
	};
}

/** How many readings the members of these surveys hold (from the summary rows: one row a member). */
export async function readingCountOf(
	assetId: number,
	surveyIds: readonly number[]
): Promise<number> {
	if (surveyIds.length === 0) return 0;
	const members = await Member.findAll({
		attributes: ['id'],
		where: { assetId, surveyId: [...surveyIds] },
		raw: true
	});
	if (members.length === 0) return 0;
	const total = await MemberCoverSet.sum('readingCount', {
		where: { memberId: members.map((m) => m.id) }
	});
	return Number(total ?? 0);
}
