/**
 * Which assets an actor may see. Another organisation's records answer 404, never 403, so that
 * ids reveal nothing. An asset is visible to its owning organisation and read-only to the
 * organisations it is shared with (asset_shares).
 * The intake issue writes src/lib/server/scope.ts for the same rule; the lead reconciles the two.
 */
import { error } from '@sveltejs/kit';
import { Op } from 'sequelize';
import { Asset, AssetShare, Member, Survey } from '$lib/server/db';
import type { Actor } from '$lib/server/policy';

export interface VisibleAsset {
	asset: Asset;
	/** 'own' for the owning organisation, 'shared' for a read-only share. */
	access: 'own' | 'shared';
}

/** The asset if the actor's organisation owns it or has it shared; otherwise 404. */
export async function visibleAsset(actor: Actor, assetId: number): Promise<VisibleAsset> {
	const asset = await Asset.findByPk(assetId);
	if (asset && asset.organisationId === actor.organisationId) return { asset, access: 'own' };
	if (asset) {
		const share = await AssetShare.findOne({
			where: { assetId, organisationId: actor.organisationId }
		});
		if (share) return { asset, access: 'shared' };
	}
	error(404, 'No such asset.');
}

/** The asset, only if the actor's organisation owns it (for changes); otherwise 404. */
export async function ownAsset(actor: Actor, assetId: number): Promise<Asset> {
	const { asset, access } = await visibleAsset(actor, assetId);
	if (access !== 'own') error(404, 'No such asset.');
	return asset;
}

/** A survey of a visible asset, or 404. */
export async function visibleSurvey(actor: Actor, assetId: number, surveyId: number) {
	const visible = await visibleAsset(actor, assetId);
	const survey = await Survey.findOne({ where: { id: surveyId, assetId } });
	if (!survey) error(404, 'No such survey.');
	return { ...visible, survey };
}

/** A member with its visible asset, or 404. */
export async function visibleMember(actor: Actor, memberId: number) {
	const member = await Member.findByPk(memberId);
	if (!member) error(404, 'No such member.');
	const visible = await visibleAsset(actor, member.assetId);
	return { ...visible, member };
}

/** Ids of every asset the actor's organisation owns or has shared with it. */
export async function visibleAssetIds(actor: Actor): Promise<number[]> {
	const shares = await AssetShare.findAll({ where: { organisationId: actor.organisationId } });
	const assets = await Asset.findAll({
		attributes: ['id'],
		where: {
			[Op.or]: [{ organisationId: actor.organisationId }, { id: shares.map((s) => s.assetId) }]
		}
	});
	return assets.map((a) => a.id);
}
