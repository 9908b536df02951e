/**
 * The population and assessment routes' face of the one visibility rule in
 * src/lib/server/scope.ts: the same answers, as SvelteKit 404s. Another organisation's records
 * answer 404, never 403, and with the words a record that does not exist gets — said of the
 * record asked for (an assessment, a member), not of the asset behind it, so the message does
 * not tell whether another organisation's id exists.
 */
import { error } from '@sveltejs/kit';
import { Asset, Member, Survey } from '$lib/server/db';
import type { Actor } from '$lib/server/policy';
import { NotFoundError } from '$lib/server/domainErrors';
import { readableAssetsWhere, scopedAsset } from '$lib/server/scope';

export interface VisibleAsset {
	asset: Asset;
	/** 'own' for the owning organisation, 'shared' for a read-only share. */
	access: 'own' | 'shared';
}

/**
 * The asset if the actor's organisation owns it or has it shared; otherwise 404 with `notFound`
 * (pass the child's words, "No such assessment.", when the asset is that of a record asked for).
 */
export async function visibleAsset(
	actor: Actor,
	assetId: number,
	notFound = 'No such asset.'
): Promise<VisibleAsset> {
	try {
		const asset = await scopedAsset(actor, assetId, 'read');
		return { asset, access: asset.organisationId === actor.organisationId ? 'own' : 'shared' };
	} catch (err) {
		if (err instanceof NotFoundError) error(404, notFound);
		throw err;
	}
}

/** The asset, only if the actor's organisation owns it (for changes); otherwise 404. */
export async function ownAsset(
	actor: Actor,
	assetId: number,
	notFound = 'No such asset.'
): Promise<Asset> {
	const { asset, access } = await visibleAsset(actor, assetId, notFound);
	if (access !== 'own') error(404, notFound);
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
	const member = Number.isSafeInteger(memberId) ? await Member.findByPk(memberId) : null;
	if (!member) error(404, 'No such member.');
	const visible = await visibleAsset(actor, member.assetId, 'No such member.');
	return { ...visible, member };
}

/** Ids of every asset the actor's organisation owns or has shared with it. */
export async function visibleAssetIds(actor: Actor): Promise<number[]> {
	const assets = await Asset.findAll({
		attributes: ['id'],
		where: await readableAssetsWhere(actor)
	});
	return assets.map((a) => a.id);
}
