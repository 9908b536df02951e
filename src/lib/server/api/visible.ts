import { Asset, Member, Survey } from '../db/models';
import { NotFoundError } from '../domainErrors';
import { apiError } from '../web/http';
import type { Actor } from '../policy';
import { readableAssetsWhere, scopedAsset, scopedMember, scopedSurvey } from '../scope';

/**
 * What an actor may read through the API: the one visibility rule of scope.ts (assets their
 * organisation owns or that are shared with it, and the surveys and members of those), in the
 * API's words. Anything else answers 404 — never 403 — with the words a record that does not
 * exist gets, so another organisation's ids reveal nothing.
 */
async function orNotFound<T>(find: () => Promise<T>, message: string): Promise<T> {
	try {
		return await find();
	} catch (err) {
		if (err instanceof NotFoundError) apiError(404, 'not_found', message);
		throw err;
	}
}

export async function visibleAssets(actor: Actor): Promise<{ asset: Asset; owned: boolean }[]> {
	const assets = await Asset.findAll({
		where: await readableAssetsWhere(actor),
		order: [['id', 'ASC']]
	});
	return assets.map((asset) => ({ asset, owned: asset.organisationId === actor.organisationId }));
}

export function visibleAsset(actor: Actor, assetId: number): Promise<Asset> {
	return orNotFound(() => scopedAsset(actor, assetId, 'read'), 'No such asset.');
}

export async function visibleSurvey(actor: Actor, surveyId: number): Promise<Survey> {
	const { survey } = await orNotFound(
		() => scopedSurvey(actor, surveyId, 'read'),
		'No such survey.'
	);
	return survey;
}

export async function visibleMember(actor: Actor, memberId: number): Promise<Member> {
	const { member } = await orNotFound(
		() => scopedMember(actor, memberId, 'read'),
		'No such member.'
	);
	return member;
}
