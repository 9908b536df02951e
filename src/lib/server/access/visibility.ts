import { Op, type Model, type ModelStatic, type Transaction, type WhereOptions } from 'sequelize';
import {
	Asset,
	AssetShare,
	Attachment,
	CarbonationTest,
	ChlorideProfile,
	ImportBatch,
	Member,
	Survey,
	VerificationHole
} from '../db/models';
import { NotFoundError, ReadOnlyError } from '../domainErrors';
import type { Actor } from '../policy';

/**
 * Data scoping, written once: an actor sees the assets their organisation owns and those shared
 * with it (read-only); surveys, members, readings, holes, imports and attachments through their
 * asset. Anything else does not exist for them: NotFoundError, which routes answer with 404,
 * said of the record asked for so that another organisation's ids reveal nothing.
 */
export type Access = 'read' | 'write';

/** How the actor stands to a visible asset: their organisation's, or shared with it read-only. */
export type Standing = 'own' | 'shared';

export function standingOf(actor: Actor, asset: Asset): Standing {
	return asset.organisationId === actor.organisationId ? 'own' : 'shared';
}

/** The record with this id, or null; an id no integer column could hold finds nothing. */
function byId<M extends Model>(model: ModelStatic<M>, id: number, transaction?: Transaction) {
	return Number.isSafeInteger(id) ? model.findByPk(id, { transaction }) : Promise.resolve(null);
}

/** A parent's "not found" said of the record asked for, so that the message names it. */
const notFoundAs =
	(what: string) =>
	(err: unknown): never => {
		throw err instanceof NotFoundError ? new NotFoundError(what) : err;
	};

export async function sharedAssetIds(organisationId: number): Promise<number[]> {
	const shares = await AssetShare.findAll({ where: { organisationId }, attributes: ['assetId'] });
	return shares.map((s) => s.assetId);
}

/** The where-clause of every asset the actor may read. */
export async function readableAssetsWhere(actor: Actor): Promise<WhereOptions<Asset>> {
	const shared = await sharedAssetIds(actor.organisationId);
	return shared.length
		? { [Op.or]: [{ organisationId: actor.organisationId }, { id: shared }] }
		: { organisationId: actor.organisationId };
}

/** Every asset the actor may read, by name (the owner's lists) or by id (the API's). */
export async function readableAssets(actor: Actor, orderBy: 'name' | 'id' = 'name') {
	return Asset.findAll({ where: await readableAssetsWhere(actor), order: [[orderBy, 'ASC']] });
}

/** Ids of every asset the actor may read. */
export async function readableAssetIds(actor: Actor): Promise<number[]> {
	const assets = await Asset.findAll({
		attributes: ['id'],
		where: await readableAssetsWhere(actor)
	});
	return assets.map((a) => a.id);
}

/** A readable asset and how the actor stands to it; NotFoundError said of `what` otherwise. */
export async function visibleAsset(
	actor: Actor,
	assetId: number,
	what = 'The asset',
	transaction?: Transaction
): Promise<{ asset: Asset; access: Standing }> {
	const asset = await scopedAsset(actor, assetId, 'read', transaction).catch(notFoundAs(what));
	return { asset, access: standingOf(actor, asset) };
}

/**
 * An asset of the actor's own organisation, for what only the owner may see or do (drafts,
 * research consent): a shared asset is as unknown as any other here, NotFoundError said of `what`.
 */
export async function ownAsset(
	actor: Actor,
	assetId: number,
	what = 'The asset',
	transaction?: Transaction
): Promise<Asset> {
	const { asset, access } = await visibleAsset(actor, assetId, what, transaction);
	if (access !== 'own') throw new NotFoundError(what);
	return asset;
}

export async function scopedAsset(
	actor: Actor,
	assetId: number,
	access: Access,
	transaction?: Transaction
): Promise<Asset> {
	const asset = await byId(Asset, assetId, transaction);
	if (!asset) throw new NotFoundError('The asset');
	if (asset.organisationId === actor.organisationId) return asset;
	const share = await AssetShare.findOne({
		where: { assetId, organisationId: actor.organisationId },
		transaction
	});
	if (!share) throw new NotFoundError('The asset');
	if (access === 'write') {
		throw new ReadOnlyError('This asset is shared with your organisation read-only.');
	}
	return asset;
}

export async function scopedSurvey(
	actor: Actor,
	surveyId: number,
	access: Access,
	transaction?: Transaction
): Promise<{ survey: Survey; asset: Asset }> {
	const survey = await byId(Survey, surveyId, transaction);
	if (!survey) throw new NotFoundError('The survey');
	const asset = await scopedAsset(actor, survey.assetId, access, transaction).catch(
		notFoundAs('The survey')
	);
	return { survey, asset };
}

export async function scopedMember(
	actor: Actor,
	memberId: number,
	access: Access,
	transaction?: Transaction
) {
	const member = await byId(Member, memberId, transaction);
	if (!member) throw new NotFoundError('The member');
	const { survey, asset } = await scopedSurvey(actor, member.surveyId, access, transaction).catch(
		notFoundAs('The member')
	);
	return { member, survey, asset };
}

export async function scopedHole(
	actor: Actor,
	holeId: number,
	access: Access,
	transaction?: Transaction
) {
	const hole = await byId(VerificationHole, holeId, transaction);
	if (!hole) throw new NotFoundError('The hole');
	const scoped = await scopedMember(actor, hole.memberId, access, transaction).catch(
		notFoundAs('The hole')
	);
	return { hole, ...scoped };
}

/** A member's carbonation test, through its member. */
export async function scopedCarbonationTest(
	actor: Actor,
	id: number,
	access: Access,
	transaction?: Transaction
) {
	const record = await byId(CarbonationTest, id, transaction);
	if (!record) throw new NotFoundError('The carbonation test');
	const scoped = await scopedMember(actor, record.memberId, access, transaction).catch(
		notFoundAs('The carbonation test')
	);
	return { record, ...scoped };
}

/** A member's chloride profile, through its member. */
export async function scopedChlorideProfile(
	actor: Actor,
	id: number,
	access: Access,
	transaction?: Transaction
) {
	const record = await byId(ChlorideProfile, id, transaction);
	if (!record) throw new NotFoundError('The chloride profile');
	const scoped = await scopedMember(actor, record.memberId, access, transaction).catch(
		notFoundAs('The chloride profile')
	);
	return { record, ...scoped };
}

/** A survey's attachment, through its survey. */
export async function scopedAttachment(actor: Actor, attachmentId: number) {
	const attachment = await byId(Attachment, attachmentId);
	if (!attachment) throw new NotFoundError('The attachment');
	await scopedSurvey(actor, attachment.surveyId, 'read').catch(notFoundAs('The attachment'));
	return attachment;
}

export async function scopedImportBatch(actor: Actor, batchId: number, access: Access) {
	const batch = await byId(ImportBatch, batchId);
	if (!batch) throw new NotFoundError('The import');
	const { survey, asset } = await scopedSurvey(actor, batch.surveyId, access).catch(
		notFoundAs('The import')
	);
	return { batch, survey, asset };
}

/**
 * A record of the actor's organisation, or NotFoundError (the route layer's 404). Another organisation's record is "not found",
 * never "forbidden", so that ids reveal nothing. Use after `authorize` in every route with an id.
 */
export function ownRecord<T extends { organisationId: number }>(
	record: T | null | undefined,
	actor: Actor
): T {
	if (!record || record.organisationId !== actor.organisationId) {
		throw new NotFoundError('The record');
	}
	return record;
}
