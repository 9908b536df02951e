/**
 * Reading and writing risk annexes. The annex is written only while its assessment is a draft,
 * by an engineer of the owning organisation, in one transaction with its audit event.
 */
import { createHash } from 'node:crypto';
import { error } from '@sveltejs/kit';
import { db, Assessment, AssessmentRisk, Member, Reading } from '$lib/server/db';
import { recordAudit } from '$lib/server/audit';
import type { Actor } from '$lib/server/policy';
import { visibleAsset } from './access';
import { buildAnnex, ReadingsChangedError, type MemberData, type RiskAnnex } from './annex';
import type { DurabilityParameters } from './parameters';
import { fromSnapshot, type SnapshotLike } from './source';

/** Every member's covers and grid extent, in one query each. */
export async function memberData(memberIds: readonly number[]): Promise<Map<number, MemberData>> {
	const ids = [...new Set(memberIds)];
	const [members, readings] = await Promise.all([
		Member.findAll({
			attributes: ['id', 'gridWidthMm', 'gridHeightMm'],
			where: { id: ids },
			raw: true
		}),
		Reading.findAll({ attributes: ['memberId', 'coverMm'], where: { memberId: ids }, raw: true })
	]);
	const out = new Map<number, MemberData>(
		members.map((m) => [
			m.id,
			{ coversMm: [], gridWidthMm: m.gridWidthMm, gridHeightMm: m.gridHeightMm }
		])
	);
	for (const r of readings) out.get(r.memberId)?.coversMm.push(Number(r.coverMm));
	return out;
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
	const { own } = await visibleAsset(actor, assessment.assetId);
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
	const text = JSON.stringify(annex);
	await db().transaction(async (transaction) => {
		await AssessmentRisk.destroy({ where: { assessmentId }, transaction });
		await AssessmentRisk.create(
			{
				assessmentId,
				parameters: JSON.stringify(annex.parameters),
				annex: text,
				annexSha256: sha256(text),
				engineVersion: annex.engineVersion,
				createdByUserId: actor.userId
			},
			{ transaction }
		);
		await recordAudit(
			{
				action: 'assessment.risk_saved',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'assessment',
				subjectId: assessmentId,
				detail: { sha256: sha256(text), parameters: annex.parameters }
			},
			transaction
		);
	});
	return annex;
}

/** The stored annex of an assessment, or null when none was entered. */
export async function loadAnnex(assessmentId: number): Promise<RiskAnnex | null> {
	const row = await AssessmentRisk.findOne({ where: { assessmentId } });
	return row ? (JSON.parse(row.annex) as RiskAnnex) : null;
}
