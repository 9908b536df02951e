/** Assessments as the API and pages show them. */
import { Assessment, User } from '$lib/server/db';
import { parseSnapshot, type AssessmentSnapshot } from './snapshot';

export interface AssessmentSummary {
	id: number;
	assetId: number;
	surveyId: number | null;
	title: string;
	state: Assessment['state'];
	snapshotSha256: string;
	engineVersion: string;
	recommendations: string | null;
	createdAt: string;
	createdBy: string | null;
	approvedAt: string | null;
	approvedBy: string | null;
	supersedesId: number | null;
	supersededReason: string | null;
	/** The assessment that replaced this one, if any. */
	supersededById: number | null;
}

async function namesOf(ids: (number | null)[]): Promise<Map<number, string>> {
	const wanted = [...new Set(ids.filter((x): x is number => x !== null))];
	if (wanted.length === 0) return new Map();
	const users = await User.findAll({ attributes: ['id', 'displayName'], where: { id: wanted } });
	return new Map(users.map((u) => [u.id, u.displayName]));
}

/** Summaries of assessments (one query for the people named). */
export async function summarise(rows: Assessment[]): Promise<AssessmentSummary[]> {
	const names = await namesOf(rows.flatMap((r) => [r.createdByUserId, r.approvedByUserId]));
	const replacedBy = new Map(
		rows.filter((r) => r.supersedesId).map((r) => [r.supersedesId!, r.id])
	);
	return rows.map((r) => ({
		id: r.id,
		assetId: r.assetId,
		surveyId: r.surveyId,
		title: r.title,
		state: r.state,
		snapshotSha256: r.snapshotSha256,
		engineVersion: r.engineVersion,
		recommendations: r.recommendations,
		createdAt: new Date(r.createdAt).toISOString(),
		createdBy: r.createdByUserId ? (names.get(r.createdByUserId) ?? null) : null,
		approvedAt: r.approvedAt ? new Date(r.approvedAt).toISOString() : null,
		approvedBy: r.approvedByUserId ? (names.get(r.approvedByUserId) ?? null) : null,
		supersedesId: r.supersedesId,
		supersededReason: r.supersededReason,
		supersededById: replacedBy.get(r.id) ?? null
	}));
}

/** One assessment with its snapshot parsed. */
export async function withSnapshot(
	row: Assessment
): Promise<AssessmentSummary & { snapshot: AssessmentSnapshot }> {
	const [summary] = await summarise([row]);
	return { ...summary, snapshot: parseSnapshot(row.snapshot) };
}
