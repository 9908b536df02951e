import { Asset, Survey } from '../db/models';
import { recordAudit } from '../audit';
import type { AssetInput } from '$lib/intake/schemas';
import type { Actor } from '../policy';
import { readableAssetsWhere, scopedAsset } from '../access';
import { saveAudited } from './changes';

export interface AssetSummary {
	id: number;
	name: string;
	locationText: string | null;
	designCode: string;
	yearOfConstruction: number | null;
	shared: boolean;
	surveyCount: number;
}

/** The assets the actor may see: their organisation's and those shared with it. */
export async function listAssets(actor: Actor): Promise<AssetSummary[]> {
	const assets = await Asset.findAll({
		where: await readableAssetsWhere(actor),
		order: [['name', 'ASC']]
	});
	const surveys = await Survey.findAll({
		where: { assetId: assets.map((a) => a.id) },
		attributes: ['assetId']
	});
	const counts = new Map<number, number>();
	for (const s of surveys) counts.set(s.assetId, (counts.get(s.assetId) ?? 0) + 1);
	return assets.map((a) => ({
		id: a.id,
		name: a.name,
		locationText: a.locationText,
		designCode: a.designCode,
		yearOfConstruction: a.yearOfConstruction,
		shared: a.organisationId !== actor.organisationId,
		surveyCount: counts.get(a.id) ?? 0
	}));
}

export async function createAsset(actor: Actor, input: AssetInput): Promise<Asset> {
	const sequelize = Asset.sequelize!;
	return sequelize.transaction(async (transaction) => {
		const asset = await Asset.create(
			{ ...input, organisationId: actor.organisationId },
			{ transaction }
		);
		await recordAudit(
			{
				action: 'asset.created',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'asset',
				subjectId: asset.id,
				detail: { name: asset.name }
			},
			transaction
		);
		return asset;
	});
}

export async function updateAsset(
	actor: Actor,
	assetId: number,
	input: AssetInput
): Promise<Asset> {
	const sequelize = Asset.sequelize!;
	return sequelize.transaction(async (transaction) => {
		const asset = await scopedAsset(actor, assetId, 'write', transaction);
		const subject = { type: 'asset' as const, id: asset.id, detail: { name: asset.name } };
		return saveAudited(actor, 'asset.updated', asset, input, subject, transaction);
	});
}
