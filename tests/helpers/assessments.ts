/**
 * A test fixture in place of the assessments' save and approve: build a snapshot of one
 * survey's populations with the engine on the seeded demo readings, shaped like
 * AssessmentSnapshot (src/lib/server/assessments/snapshot.ts), and insert it as an Assessment row.
 */
import { createHash } from 'node:crypto';
import type { Sequelize } from 'sequelize';
import {
	assessPopulation,
	ENGINE_VERSION,
	verifyMeter,
	type CoverRequirement
} from '../../src/lib/analysis';
import {
	Assessment,
	Asset,
	Member,
	Reading,
	Survey,
	User,
	VerificationHole
} from '../../src/lib/server/db/models';

export const CAR_PARK = 'Brackenfield Multi-storey Car Park';
export const CAR_PARK_SURVEY = 'Level 2 deck and soffits, condition survey';

function requirementOf(m: Member): CoverRequirement {
	return {
		cMinMm: m.cMinMm,
		cNomMm: m.cNomMm,
		deltaCDevMm: m.deltaCDevMm,
		deltaPlusMm: m.deltaPlusMm,
		codeSystem: 'EN',
		memberDepthMm: m.memberDepthMm,
		basis: `EN 1992-1-1, as specified for member ${m.label}`
	};
}

/** The covers of each member, one query. */
export async function coversByMember(memberIds: number[]): Promise<Map<number, number[]>> {
	const rows = await Reading.findAll({
		attributes: ['memberId', 'coverMm'],
		where: { memberId: memberIds },
		raw: true
	});
	const out = new Map<number, number[]>(memberIds.map((id) => [id, []]));
	for (const r of rows) out.get(r.memberId)!.push(Number(r.coverMm));
	return out;
}

async function populations(members: Member[]) {
	const covers = await coversByMember(members.map((m) => m.id));
	const groups = new Map<string, Member[]>();
	for (const m of members) {
		const id = `${m.memberType}|${m.exposureClass}`;
		groups.set(id, [...(groups.get(id) ?? []), m]);
	}
	return [...groups.entries()]
		.sort(([a], [b]) => a.localeCompare(b))
		.map(([id, group]) => {
			const all = group.flatMap((m) => covers.get(m.id)!);
			return {
				id,
				key: { memberType: group[0].memberType, exposureClass: group[0].exposureClass },
				label: `${group[0].memberType} · ${group[0].exposureClass}`,
				members: group.map((m) => ({
					id: m.id,
					label: m.label,
					surveyId: m.surveyId,
					face: m.face,
					readings: covers.get(m.id)!.length
				})),
				requirement: {
					requirement: requirementOf(group[0]),
					governingMember: group[0].label,
					mixed: false,
					note: null,
					cMinValuesMm: [group[0].cMinMm]
				},
				assessment:
					all.length >= 2 ? assessPopulation(all, requirementOf(group[0]), { charts: true }) : null,
				problem: all.length >= 2 ? null : 'Too few readings.'
			};
		});
}

async function meter(memberIds: number[]) {
	const holes = await VerificationHole.findAll({
		where: { memberId: memberIds },
		order: [['id', 'ASC']]
	});
	const rows = holes.map((h) => ({
		id: h.id,
		memberId: h.memberId,
		label: h.label,
		xMm: h.xMm,
		yMm: h.yMm,
		meterReadingMm: h.meterReadingMm,
		measuredCoverMm: h.measuredCoverMm,
		method: h.method
	}));
	const verification =
		rows.length >= 3
			? verifyMeter(
					rows.map((h) => h.meterReadingMm),
					rows.map((h) => h.measuredCoverMm)
				)
			: null;
	return { holes: rows, verification, note: verification ? null : 'Too few holes.' };
}

/** A snapshot of one survey of an asset, as the assessments' buildSnapshot would store it. */
export async function buildTestSnapshot(assetName: string, surveyTitle: string) {
	const asset = (await Asset.findOne({ where: { name: assetName } }))!;
	const survey = (await Survey.findOne({ where: { assetId: asset.id, title: surveyTitle } }))!;
	const members = await Member.findAll({ where: { surveyId: survey.id }, order: [['id', 'ASC']] });
	const surveyJson = {
		id: survey.id,
		title: survey.title,
		surveyDate: survey.surveyDate,
		status: survey.status,
		meterMake: survey.meterMake,
		meterSerial: survey.meterSerial,
		meterCalibration: survey.meterCalibration
	};
	const pops = await populations(members);
	return {
		asset,
		snapshot: {
			schemaVersion: 1,
			engineVersion: ENGINE_VERSION,
			computedAt: '2026-01-15T09:00:00.000Z',
			asset: {
				id: asset.id,
				name: asset.name,
				locationText: asset.locationText,
				designCode: asset.designCode,
				designServiceLifeYears: asset.designServiceLifeYears,
				yearOfConstruction: asset.yearOfConstruction
			},
			survey: surveyJson,
			surveys: [surveyJson],
			scope: { surveyId: survey.id, split: 'none' },
			methods: {
				fractile: 0.05,
				confidence: 0.95,
				percentile: '7',
				model: 'best-fit',
				method: 'prediction'
			},
			populations: pops,
			meter: await meter(members.map((m) => m.id)),
			readingCount: pops.reduce((s, p) => s + p.members.reduce((t, m) => t + m.readings, 0), 0)
		}
	};
}

/** Insert a draft assessment of the survey, created by the demo engineer. */
export async function insertDraft(
	sequelize: Sequelize,
	assetName = CAR_PARK,
	surveyTitle = CAR_PARK_SURVEY
): Promise<Assessment> {
	void sequelize;
	const { asset, snapshot } = await buildTestSnapshot(assetName, surveyTitle);
	const engineer = await User.findOne({ where: { email: 'engineer@kestrel-lane.example' } });
	const text = JSON.stringify(snapshot);
	return Assessment.create({
		assetId: asset.id,
		surveyId: snapshot.survey.id,
		title: `${surveyTitle}: cover assessment`,
		snapshot: text,
		snapshotSha256: createHash('sha256').update(text).digest('hex'),
		engineVersion: ENGINE_VERSION,
		recommendations:
			'Break out and test chloride profiles in bays L2-BAY-04 and L2-BAY-07 first; plan a protective coating for the deck within five years.',
		createdByUserId: engineer?.id ?? null
	});
}

/** Approve as the demo engineer, in place of the assessments' approve service. */
export async function approveDirectly(assessment: Assessment): Promise<void> {
	const engineer = await User.findOne({ where: { email: 'engineer@kestrel-lane.example' } });
	await assessment.update({
		state: 'approved',
		approvedByUserId: engineer?.id ?? null,
		approvedAt: new Date('2026-01-16T10:00:00Z')
	});
}

/** An approved car-park assessment with the default durability parameters, entered over HTTP. */
export async function approvedCarParkAssessment(
	sequelize: Sequelize,
	engineer: { putJson(path: string, body: unknown): Promise<Response> }
): Promise<Assessment> {
	const draft = await insertDraft(sequelize);
	const response = await engineer.putJson(`/api/v1/assessments/${draft.id}/durability`, {
		parameters: {}
	});
	if (response.status !== 200) throw new Error(`durability refused: ${await response.text()}`);
	await approveDirectly(draft);
	return draft;
}

/** An owner in an organisation of its own that nothing is shared with. */
export async function strangerOwner(tag: string): Promise<{ email: string; password: string }> {
	const { hashPassword } = await import('../../src/lib/server/auth/password');
	const { Membership, Organisation } = await import('../../src/lib/server/db/models');
	const password = 'stranger-owner-pass-2026';
	const organisation = await Organisation.create({
		name: `Elsewhere Holdings ${tag}`,
		slug: `elsewhere-${tag}`
	});
	const user = await User.create({
		email: `owner-${tag}@elsewhere.example`,
		displayName: 'Stranger Owner',
		passwordHash: await hashPassword(password),
		activeOrganisationId: organisation.id
	});
	await Membership.create({ userId: user.id, organisationId: organisation.id, role: 'owner' });
	return { email: user.email, password };
}
