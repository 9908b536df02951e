/**
 * The owner's portfolio: each visible asset with its latest approved assessment and its risk,
 * and the populations of all of them ranked for "look at first".
 */
import { Assessment, Asset, Organisation, User } from '$lib/server/db';
import type { Actor } from '$lib/server/policy';
import { readableAssets, visibleAsset } from '$lib/server/access';
import { coverOnlyAnnex, type RiskAnnex } from './annex';
import type { PopulationRisk } from './compute';
import { fromSnapshot, type AssessmentHeader, type SnapshotLike } from './source';
import { loadAnnex } from './store';
import { assetRisk, worstFirst, type AssetRisk } from './summary';

export interface AssessedSource {
	header: AssessmentHeader;
	snapshot: SnapshotLike;
	annex: RiskAnnex;
	/** False when no durability parameters were entered: cover figures only. */
	projected: boolean;
	risk: AssetRisk;
}

export interface PortfolioEntry {
	asset: { id: number; name: string; locationText: string | null; designServiceLifeYears: number };
	latest: AssessedSource | null;
}

async function nameOf(id: number | null): Promise<string | null> {
	if (id === null) return null;
	return (await User.findByPk(id, { attributes: ['displayName'] }))?.displayName ?? null;
}

async function organisationOf(assetId: number): Promise<string | null> {
	const asset = await Asset.findByPk(assetId, { attributes: ['organisationId'] });
	if (!asset) return null;
	return (
		(await Organisation.findByPk(asset.organisationId, { attributes: ['name'] }))?.name ?? null
	);
}

/** Header, snapshot, annex and risk of one assessment row. */
export async function assessedSource(row: Assessment): Promise<AssessedSource> {
	const snapshot = fromSnapshot(row.snapshot);
	const stored = await loadAnnex(row.id);
	const annex = stored ?? coverOnlyAnnex(snapshot);
	return {
		header: {
			id: row.id,
			title: row.title,
			state: row.state,
			snapshotSha256: row.snapshotSha256,
			recommendations: row.recommendations,
			approvedAt: row.approvedAt ? new Date(row.approvedAt).toISOString() : null,
			approvedBy: await nameOf(row.approvedByUserId),
			createdBy: await nameOf(row.createdByUserId),
			organisation: await organisationOf(row.assetId)
		},
		snapshot,
		annex,
		projected: stored !== null,
		risk: assetRisk(annex.populations)
	};
}

export function latestApproved(assetId: number): Promise<Assessment | null> {
	return Assessment.findOne({
		where: { assetId, state: 'approved' },
		order: [
			['approvedAt', 'DESC'],
			['id', 'DESC']
		]
	});
}

const assetFields = (a: Asset) => ({
	id: a.id,
	name: a.name,
	locationText: a.locationText,
	designServiceLifeYears: a.designServiceLifeYears
});

export async function portfolio(actor: Actor) {
	const assets = await readableAssets(actor);
	const entries: PortfolioEntry[] = [];
	for (const asset of assets) {
		const row = await latestApproved(asset.id);
		entries.push({ asset: assetFields(asset), latest: row ? await assessedSource(row) : null });
	}
	const lookFirst: (PopulationRisk & { assetId: number; assetName: string })[] = entries
		.flatMap((e) =>
			e.latest
				? e.latest.annex.populations.map((p) => ({
						...p,
						assetId: e.asset.id,
						assetName: e.asset.name
					}))
				: []
		)
		.filter((p) => p.level !== 'not-judged')
		.sort(worstFirst);
	return { entries, lookFirst };
}

/** One visible asset with its latest approved assessment (404 for anyone else). */
export async function assetView(actor: Actor, assetId: number) {
	const { asset, access } = await visibleAsset(actor, assetId);
	const row = await latestApproved(asset.id);
	return {
		asset: assetFields(asset),
		own: access === 'own',
		latest: row ? await assessedSource(row) : null
	};
}
