import { recordAudit } from '../audit';
import { Asset } from '../db/models';
import { ownAsset } from '../access';
import type { Actor } from '../policy';

/**
 * An asset's consent to anonymised research use. Only its owning organisation may change it;
 * every change is audited in the same transaction as the change. Off by default (the column's
 * default); revoking takes effect at once, since every research query reads the flag.
 */
export interface ConsentState {
	assetId: number;
	researchOptIn: boolean;
	changedAt: string | null;
}

function state(asset: Asset): ConsentState {
	return {
		assetId: asset.id,
		researchOptIn: Boolean(asset.researchOptIn),
		changedAt: asset.researchOptInChangedAt ? asset.researchOptInChangedAt.toISOString() : null
	};
}

/** The consent of an asset the actor's organisation owns; NotFoundError otherwise (a 404). */
export async function readConsent(actor: Actor, assetId: number): Promise<ConsentState> {
	return state(await ownAsset(actor, assetId));
}

/** The consent of every asset the actor's organisation owns, by name. */
export async function consentList(actor: Actor): Promise<(ConsentState & { name: string })[]> {
	const assets = await Asset.findAll({
		where: { organisationId: actor.organisationId },
		order: [['name', 'ASC']]
	});
	return assets.map((asset) => ({ ...state(asset), name: asset.name }));
}

export async function setConsent(
	actor: Actor,
	assetId: number,
	optIn: boolean
): Promise<ConsentState> {
	const sequelize = Asset.sequelize!;
	return sequelize.transaction(async (transaction) => {
		const asset = await ownAsset(actor, assetId, 'The asset', transaction);
		// Locked so that two changes at once are recorded one after the other.
		await asset.reload({ transaction, lock: transaction.LOCK.UPDATE });
		if (Boolean(asset.researchOptIn) === optIn) return state(asset);
		await asset.update(
			{ researchOptIn: optIn, researchOptInChangedAt: new Date() },
			{ transaction }
		);
		await recordAudit(
			{
				action: optIn ? 'research.opt_in' : 'research.opt_out',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'asset',
				subjectId: asset.id,
				detail: { researchOptIn: optIn }
			},
			transaction
		);
		return state(asset);
	});
}
