/**
 * Which assets an actor sees in the owner's view: the one visibility rule of
 * src/lib/server/scope.ts (their organisation's assets and those shared with it read-only), as
 * the risk pages want it. Anything else answers 404, never 403, so ids reveal nothing.
 */
import { Asset } from '$lib/server/db';
import type { Actor } from '$lib/server/policy';
import { readableAssetsWhere } from '$lib/server/scope';
import { visibleAsset as scopedVisibleAsset } from '$lib/server/populations/access';

export async function visibleAssets(actor: Actor): Promise<Asset[]> {
	return Asset.findAll({ where: await readableAssetsWhere(actor), order: [['name', 'ASC']] });
}

/** The asset and whether the actor's organisation owns it; 404 with `notFound` otherwise. */
export async function visibleAsset(
	actor: Actor,
	assetId: number,
	notFound = 'No such asset.'
): Promise<{ asset: Asset; own: boolean }> {
	const { asset, access } = await scopedVisibleAsset(actor, assetId, notFound);
	return { asset, own: access === 'own' };
}
