/**
 * Assessment sign-off: save a draft (a computed snapshot), approve it, supersede an approved
 * one with a stated reason, read the history. Each change is one transaction with its audit
 * event. An approved or superseded snapshot is never rewritten.
 */
import { annexFor, fromSnapshot, writeAnnex } from '$lib/server/risk';
import type { Transaction } from 'sequelize';
import { db, Assessment, Asset, Organisation } from '$lib/server/db';
import { recordAudit } from '$lib/server/audit';
import type { Actor } from '$lib/server/policy';
import {
	ownAsset,
	scopedSurvey,
	seesDrafts,
	visibleAsset,
	visibleAssessment
} from '$lib/server/access';
import { InputError, NotFoundError, StateError } from '$lib/server/domainErrors';
import { customPopulationsOf, surveySelection } from '$lib/server/populations';
import type { CalibrationChoice, MethodChoice, Split } from '$lib/server/populations';
import { buildSnapshot, serialiseSnapshot, sha256Hex } from './snapshot';

export interface SaveInput {
	assetId: number;
	title: string;
	surveyId: number | null;
	/** The surveys to include; null, the default selection (approved surveys, selection.ts). */
	surveyIds?: number[] | null;
	split: Split;
	/** The custom populations to carry, by id; null or absent, every one of the asset. */
	customIds?: number[] | null;
	methods: MethodChoice;
	/** 'apply': each population also judged through its check holes; absent, none. */
	calibration?: CalibrationChoice;
	recommendations: string | null;
	/** An approved assessment this one is to replace, with the reason. */
	supersedes?: { id: number; reason: string } | null;
}

async function checkSupersedable(assetId: number, id: number) {
	const old = await Assessment.findOne({ where: { id, assetId } });
	if (!old) throw new NotFoundError('The assessment to supersede');
	if (old.state !== 'approved') {
		throw new StateError('Only an approved assessment can be superseded, and only once.');
	}
}

/**
 * The custom populations an assessment carries: every one of the asset when none are named,
 * else the named ones, each of which must be the asset's (400 naming `custom`, nothing saved).
 */
async function chosenCustom(assetId: number, ids: number[] | null): Promise<number[]> {
	const all = (await customPopulationsOf(assetId)).map((c) => c.id);
	if (ids === null) return all;
	const known = new Set(all);
	const unknown = ids.find((id) => !known.has(id));
	if (unknown !== undefined) {
		const message = `Custom population ${unknown} is not one of this asset's.`;
		throw new InputError(message, { custom: [message] });
	}
	return [...new Set(ids)].sort((a, b) => a - b);
}

/** Compute the populations now and keep them as a draft assessment. */
export async function saveDraft(actor: Actor, input: SaveInput): Promise<Assessment> {
	const asset = await ownAsset(actor, input.assetId);
	if (input.surveyId) {
		const { survey } = await scopedSurvey(actor, input.surveyId, 'read');
		if (survey.assetId !== asset.id) throw new NotFoundError('The survey');
	}
	if (input.supersedes) await checkSupersedable(asset.id, input.supersedes.id);
	const requested = input.surveyIds ?? (input.surveyId ? [input.surveyId] : null);
	const selection = await surveySelection(asset.id, requested);
	if (selection.surveyIds.length === 0) {
		throw new InputError(selection.words, { surveys: [selection.words] });
	}
	const customIds = await chosenCustom(asset.id, input.customIds ?? null);
	const snapshot = await buildSnapshot(
		asset,
		{ surveyId: input.surveyId, split: input.split },
		input.methods,
		selection,
		customIds,
		input.calibration ?? 'none'
	);
	const { text, sha256 } = serialiseSnapshot(snapshot);
	// Durability projections with the stated defaults, kept with the draft (risk/store.ts).
	const annex = await annexFor(fromSnapshot(text), {});
	return db().transaction(async (transaction) => {
		const created = await Assessment.create(
			{
				assetId: asset.id,
				surveyId: input.surveyId,
				title: input.title,
				snapshot: text,
				snapshotSha256: sha256,
				engineVersion: snapshot.engineVersion,
				recommendations: input.recommendations,
				createdByUserId: actor.userId,
				supersedesId: input.supersedes?.id ?? null,
				supersededReason: input.supersedes?.reason ?? null
			},
			{ transaction }
		);
		await writeAnnex(created.id, annex, actor.userId, transaction);
		await recordAudit(
			{
				action: 'assessment.saved',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'assessment',
				subjectId: created.id,
				detail: { sha256, supersedes: input.supersedes?.id ?? null }
			},
			transaction
		);
		return created;
	});
}

/** Whether the asset's organisation asks a second person to approve (migration 010). */
async function secondApproverRequired(
	assetId: number,
	transaction?: Transaction
): Promise<boolean> {
	const asset = await Asset.findByPk(assetId, { attributes: ['organisationId'], transaction });
	if (!asset) return true;
	const organisation = await Organisation.findByPk(asset.organisationId, {
		attributes: ['secondApproverRequired'],
		transaction
	});
	return organisation?.secondApproverRequired ?? true;
}

/** Whether this actor may approve this draft under the organisation's second-approver rule. */
export async function mayApprove(actor: Actor, row: Assessment): Promise<boolean> {
	if (row.state !== 'draft') return false;
	if (row.createdByUserId !== actor.userId) return true;
	return !(await secondApproverRequired(row.assetId));
}

/**
 * Approve a draft: its snapshot is checked against its sha256 and frozen; the assessment it
 * supersedes, if any, becomes superseded. Policy 'assessment:approve' is asked by the caller.
 */
export async function approve(actor: Actor, id: number): Promise<Assessment> {
	await visibleAssessment(actor, id, 'write');
	return db().transaction(async (transaction) => {
		const draft = await Assessment.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
		if (!draft || draft.state !== 'draft') throw new StateError('Only a draft can be approved.');
		if (await secondApproverRequired(draft.assetId, transaction)) {
			if (draft.createdByUserId === actor.userId) {
				throw new StateError(
					'You prepared this assessment: your organisation asks a second engineer to check and approve it.'
				);
			}
		}
		if (sha256Hex(draft.snapshot) !== draft.snapshotSha256) {
			throw new StateError('The draft does not match its checksum; save it again.');
		}
		await draft.update(
			{ state: 'approved', approvedByUserId: actor.userId, approvedAt: new Date() },
			{ transaction }
		);
		if (draft.supersedesId) {
			const old = await Assessment.findByPk(draft.supersedesId, {
				transaction,
				lock: transaction.LOCK.UPDATE
			});
			if (!old || old.state !== 'approved') {
				throw new StateError('The assessment this one replaces is no longer approved.');
			}
			await old.update({ state: 'superseded' }, { transaction });
		}
		await recordAudit(
			{
				action: 'assessment.approved',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'assessment',
				subjectId: draft.id,
				detail: { sha256: draft.snapshotSha256, supersedes: draft.supersedesId }
			},
			transaction
		);
		return draft;
	});
}

/** An asset's assessments, newest first; owners and shared viewers see approved ones only. */
export async function history(actor: Actor, assetId: number): Promise<Assessment[]> {
	const { access } = await visibleAsset(actor, assetId);
	const rows = await Assessment.findAll({
		where: { assetId },
		attributes: { exclude: ['snapshot'] },
		order: [['id', 'DESC']]
	});
	return seesDrafts(actor, access) ? rows : rows.filter((a) => a.state !== 'draft');
}

/** One assessment with its snapshot; NotFoundError when the actor may not see it. */
export async function getAssessment(actor: Actor, id: number): Promise<Assessment> {
	return (await visibleAssessment(actor, id)).assessment;
}
