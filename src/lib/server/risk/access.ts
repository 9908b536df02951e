/**
 * Which assets an actor sees in the owner's view: those of their own organisation and those
 * shared with it read-only. Anything else answers 404, never 403, so ids reveal nothing.
 * Issue 6 writes the same rule in src/lib/server/populations/access.ts (branch `pages`); when it
 * lands on main this file should call it instead.
 */
import { error } from '@sveltejs/kit';
import { Op } from 'sequelize';
import { Asset, AssetShare } from '$lib/server/db';
import type { Actor } from '$lib/server/policy';

export async function visibleAssets(actor: Actor): Promise<Asset[]> {
	const shares = await AssetShare.findAll({ where: { organisationId: actor.organisationId } });
	return Asset.findAll({
		where: {
			[Op.or]: [{ organisationId: actor.organisationId }, { id: shares.map((s) => s.assetId) }]
		},
		order: [['name', 'ASC']]
	});
}

export async function visibleAsset(
	actor: Actor,
	assetId: number
): Promise<{ asset: Asset; own: boolean }> {
	const asset = await Asset.findByPk(assetId);
	if (asset && asset.organisationId === actor.organisationId) return { asset, own: true };
	if (asset) {
		const share = await AssetShare.findOne({
			where: { assetId, organisationId: actor.organisationId }
		});
		if (share) return { asset, own: false };
	}
	error(404, 'No such asset.');
}
