/**
 * Reading and writing risk annexes. The annex is written only while its assessment is a draft,
 * by an engineer of the owning organisation, in one transaction with its audit event.
 */
import { createHash } from 'node:crypto';
import { error } from '@sveltejs/kit';
import type { Transaction } from 'sequelize';
import { db, Assessment, AssessmentRisk, Member } from '$lib/server/db';
import { readCoverSets } from '$lib/server/readings/coverSets';
import { recordAudit } from '$lib/server/audit';
import type { Actor } from '$lib/server/policy';
import { visibleAsset } from './access';
import { buildAnnex, ReadingsChangedError, type MemberData, type RiskAnnex } from './annex';
import type { DurabilityParameters } from './parameters';
import { fromSnapshot, type SnapshotLike } from './source';

/** Every member's covers (from the cover sets) and grid extent. */
export async function memberData(memberIds: readonly number[]): Promise<Map<number, MemberData>> {
	const ids = [...new Set(memberIds)];
	const [members, covers] = await Promise.all([
		Member.findAll({
			attributes: ['id', 'gridWidthMm', 'gridHeightMm'],
			where: { id: ids },
			raw: true
		}),
		readCoverSets(ids)
	]);
	return new Map<number, MemberData>(
		members.map((m) => [
			m.id,
			{
				coversMm: Array.from(covers.get(m.id) ?? []),
				gridWidthMm: m.gridWidthMm,
				gridHeightMm: m.gridHeightMm
			}
		])
	);
}

export async function annexFor(
	snapshot: SnapshotLike,
	entered: DurabilityParameters
): Promise<RiskAnnex> {
	const data = await memberData(snapshot.populations.flatMap((p) => p.members.map((m) => m.id)));
	return buildAnnex(snapshot, data, entered);
}

const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

/** Compute and keep the annex of a draft assessment (replacing an earlier one of the draft). */
export async function saveRisk(
	actor: Actor,
	assessmentId: number,
	entered: DurabilityParameters
): Promise<RiskAnnex> {
	const assessment = await Assessment.findByPk(assessmentId);
	if (!assessment) error(404, 'No such assessment.');
	const { own } = await visibleAsset(actor, assessment.assetId, 'No such assessment.');
	if (!own) error(404, 'No such assessment.');
	if (assessment.state !== 'draft')
		error(409, 'The durability parameters of an approved assessment cannot change.');
	let annex: RiskAnnex;
	try {
		annex = await annexFor(fromSnapshot(assessment.snapshot), entered);
	} catch (e) {
		if (e instanceof ReadingsChangedError) error(409, e.message);
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
