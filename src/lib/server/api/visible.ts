import { Op } from 'sequelize';
import { Asset, AssetShare, Member, Survey } from '../db/models';
import { apiError } from '../http';
import type { Actor } from '../policy';

/**
 * What an actor may read through the API: assets their organisation owns or that are shared
 * with it, and the surveys and members of those. Anything else answers 404 — never 403 — so
 * another organisation's ids reveal nothing. (The intake issue's scope module covers writes.)
 */
async function sharedIds(organisationId: number): Promise<number[]> {
	const rows = await AssetShare.findAll({ where: { organisationId }, attributes: ['assetId'] });
	return rows.map((r) => r.assetId);
}

export async function visibleAssets(actor: Actor): Promise<{ asset: Asset; owned: boolean }[]> {
	const shared = await sharedIds(actor.organisationId);
	const assets = await Asset.findAll({
		where: { [Op.or]: [{ organisationId: actor.organisationId }, { id: shared }] },
		order: [['id', 'ASC']]
	});
	return assets.map((asset) => ({ asset, owned: asset.organisationId === actor.organisationId }));
}

export async function visibleAsset(actor: Actor, assetId: number): Promise<Asset> {
	const asset = await Asset.findByPk(assetId);
	if (asset && asset.organisationId === actor.organisationId) return asset;
	if (asset && (await sharedIds(actor.organisationId)).includes(asset.id)) return asset;
	apiError(404, 'not_found', 'No such asset.');
}

export async function visibleSurvey(actor: Actor, surveyId: number): Promise<Survey> {
	const survey = await Survey.findByPk(surveyId);
	if (!survey) apiError(404, 'not_found', 'No such survey.');
	await visibleAsset(actor, survey.assetId).catch(() =>
		apiError(404, 'not_found', 'No such survey.')
	);
	return survey;
}

export async function visibleMember(actor: Actor, memberId: number): Promise<Member> {
	const member = await Member.findByPk(memberId);
	if (!member) apiError(404, 'not_found', 'No such member.');
	await visibleAsset(actor, member.assetId).catch(() =>
		apiError(404, 'not_found', 'No such member.')
	);
	return member;
}
