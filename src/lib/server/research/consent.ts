import { recordAudit } from '../audit';
import { Asset } from '../db/models';

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

export class AssetNotFoundError extends Error {
	constructor() {
		super('No such asset in your organisation.');
	}
}

function state(asset: Asset): ConsentState {
	return {
		assetId: asset.id,
		researchOptIn: Boolean(asset.researchOptIn),
		changedAt: asset.researchOptInChangedAt ? asset.researchOptInChangedAt.toISOString() : null
	};
}

/** The consent of an asset the organisation owns; AssetNotFoundError otherwise (a 404). */
export async function readConsent(organisationId: number, assetId: number): Promise<ConsentState> {
	const asset = await Asset.findOne({ where: { id: assetId, organisationId } });
	if (!asset) throw new AssetNotFoundError();
	return state(asset);
}

export async function setConsent(
	actor: { userId: number; organisationId: number },
	assetId: number,
	optIn: boolean
): Promise<ConsentState> {
	const sequelize = Asset.sequelize!;
	return sequelize.transaction(async (transaction) => {
		const asset = await Asset.findOne({
			where: { id: assetId, organisationId: actor.organisationId },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!asset) throw new AssetNotFoundError();
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
