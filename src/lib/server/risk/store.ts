/**
 * Reading and writing risk annexes. The annex is written only while its assessment is a draft,
 * by an engineer of the owning organisation, in one transaction with its audit event.
 */
import { createHash } from 'node:crypto';
import type { Transaction } from 'sequelize';
import {
	db,
	AssessmentRisk,
	CarbonationTest,
	ChlorideIncrement,
	ChlorideProfile,
	Member
} from '$lib/server/db';
import {
	carbonationDepths,
	concreteAgeYears,
	conversionNote,
	percentOfBinder
} from '$lib/intake/measurements';
import { readCoverCounts } from '$lib/server/readings/coverSets';
import { recordAudit } from '$lib/server/audit';
import type { Actor } from '$lib/server/policy';
import { visibleAssessment } from '$lib/server/access';
import { StateError } from '$lib/server/domainErrors';
import {
	buildAnnex,
	measurementKey,
	ReadingsChangedError,
	type MemberData,
	type RiskAnnex
} from './annex';
import type { PopulationMeasurements } from './measured';
import type { DurabilityParameters } from './parameters';
import { fromSnapshot, type SnapshotLike } from './source';

/** Every member's cover counts (its stored summary) and grid extent. */
export async function memberData(memberIds: readonly number[]): Promise<Map<number, MemberData>> {
	const ids = [...new Set(memberIds)];
	const [members, covers] = await Promise.all([
		Member.findAll({
			attributes: ['id', 'gridWidthMm', 'gridHeightMm'],
			where: { id: ids },
			raw: true
		}),
		readCoverCounts(ids)
	]);
	return new Map<number, MemberData>(
		members.map((m) => [
			m.id,
			{
				sample: covers.get(m.id) ?? null,
				gridWidthMm: m.gridWidthMm,
				gridHeightMm: m.gridHeightMm
			}
		])
	);
}

function groupOf(groups: Map<string, PopulationMeasurements>, member: Member) {
	const key = measurementKey(member.memberType, member.exposureClass);
	let group = groups.get(key);
	if (!group) groups.set(key, (group = { carbonation: [], chloride: [] }));
	return group;
}

/**
 * The asset's carbonation tests and chloride profiles, grouped by member type and exposure
 * class (the populations' key), with each test's age from the year of construction and the
 * profiles' contents converted to % by mass of binder. Nothing without a construction year: the
 * age at testing is then unknown.
 */
export async function assetMeasurements(
	assetId: number,
	yearOfConstruction: number | null
): Promise<Map<string, PopulationMeasurements>> {
	const groups = new Map<string, PopulationMeasurements>();
	if (yearOfConstruction === null) return groups;
	const members = await Member.findAll({
		attributes: ['id', 'label', 'memberType', 'exposureClass'],
		where: { assetId }
	});
	const byId = new Map(members.map((m) => [m.id, m]));
	const ids = members.map((m) => m.id);
	const [tests, profiles] = await Promise.all([
		CarbonationTest.findAll({ where: { memberId: ids }, order: [['id', 'ASC']] }),
		ChlorideProfile.findAll({
			where: { memberId: ids },
			include: [{ model: ChlorideIncrement, as: 'increments' }],
			order: [['id', 'ASC']]
		})
	]);
	for (const t of tests) {
		const member = byId.get(t.memberId)!;
		const depths = carbonationDepths(t);
		groupOf(groups, member).carbonation.push({
			memberLabel: member.label,
			label: t.label,
			testedOn: t.testedOn,
			ageYears: concreteAgeYears(yearOfConstruction, t.testedOn),
			depthsMm: t.depthsMm.length ? t.depthsMm : [depths.meanMm],
			minMm: depths.minMm,
			maxMm: depths.maxMm
		});
	}
	for (const p of profiles) {
		const member = byId.get(p.memberId)!;
		const increments = [...(p.increments ?? [])].sort((a, b) => a.position - b.position);
		groupOf(groups, member).chloride.push({
			memberLabel: member.label,
			label: p.label,
			testedOn: p.testedOn,
			ageYears: concreteAgeYears(yearOfConstruction, p.testedOn),
			initialContent:
				p.initialContentPercent === null ? null : percentOfBinder(p.initialContentPercent, p),
			conversion: conversionNote(p),
			increments: increments.map((i) => ({
				fromMm: i.fromMm,
				toMm: i.toMm,
				content: percentOfBinder(i.chloridePercent, p),
				outermost: Boolean(i.outermost)
			}))
		});
	}
	return groups;
}

/**
 * The annex of a snapshot: covers from the members' cover counts, and the asset's measurements as they
 * are now — kept in the annex, so the approved assessment shows them as they were.
 */
export async function annexFor(
	snapshot: SnapshotLike,
	entered: DurabilityParameters
): Promise<RiskAnnex> {
	const [data, measurements] = await Promise.all([
		memberData(snapshot.populations.flatMap((p) => p.members.map((m) => m.id))),
		assetMeasurements(snapshot.asset.id, snapshot.asset.yearOfConstruction)
	]);
	return buildAnnex(snapshot, data, entered, measurements);
}

const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

/** Compute and keep the annex of a draft assessment (replacing an earlier one of the draft). */
export async function saveRisk(
	actor: Actor,
	assessmentId: number,
	entered: DurabilityParameters
): Promise<RiskAnnex> {
	const { assessment } = await visibleAssessment(actor, assessmentId, 'write');
	if (assessment.state !== 'draft') {
		throw new StateError('The durability parameters of an approved assessment cannot change.');
	}
	let annex: RiskAnnex;
	try {
		annex = await annexFor(fromSnapshot(assessment.snapshot), entered);
	} catch (e) {
		if (e instanceof ReadingsChangedError) throw new StateError(e.message);
		throw e;
	}
	await db().transaction(async (transaction) => {
		await AssessmentRisk.destroy({ where: { assessmentId }, transaction });
		await writeAnnex(assessmentId, annex, actor.userId, transaction);
		await recordAudit(
			{
				action: 'assessment.risk_saved',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'assessment',
				subjectId: assessmentId,
				detail: { sha256: sha256(JSON.stringify(annex)), parameters: annex.parameters }
			},
			transaction
		);
	});
	return annex;
}

/**
 * Keeps an annex with its assessment, inside the caller's transaction. A new draft gets one
 * computed with the stated defaults (saveDraft), so an assessment approved without the engineer
 * entering parameters still carries its projections; saveRisk replaces it with entered ones.
 */
export async function writeAnnex(
	assessmentId: number,
	annex: RiskAnnex,
	userId: number | null,
	transaction: Transaction
): Promise<void> {
	const text = JSON.stringify(annex);
	await AssessmentRisk.create(
		{
			assessmentId,
			parameters: JSON.stringify(annex.parameters),
			annex: text,
			annexSha256: sha256(text),
			engineVersion: annex.engineVersion,
			createdByUserId: userId
		},
		{ transaction }
	);
}

/** The stored annex of an assessment, or null when none was entered. */
export async function loadAnnex(assessmentId: number): Promise<RiskAnnex | null> {
	const row = await AssessmentRisk.findOne({ where: { assessmentId } });
	return row ? (JSON.parse(row.annex) as RiskAnnex) : null;
}
