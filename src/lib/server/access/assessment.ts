import type { Transaction } from 'sequelize';
import { Assessment, type Asset } from '../db/models';
import { NotFoundError } from '../domainErrors';
import { can, type Actor } from '../policy';
import { ownAsset, visibleAsset, type Access, type Standing } from './visibility';

const WHAT = 'The assessment';

/**
 * Whether the actor sees drafts of an asset: only those who may write assessments, of their own
 * organisation's assets. Owners and shared viewers see approved and superseded ones only.
 */
export function seesDrafts(actor: Actor, access: Standing): boolean {
	return access === 'own' && can(actor.role, 'assessment:write');
}

/**
 * The one visibility rule of an assessment: through its asset (see visibility.ts), a draft only
 * for those who see drafts. 'write' asks for an assessment of the actor's own organisation.
 * Anything else is NotFoundError, with the same words as an id that does not exist.
 */
export async function visibleAssessment(
	actor: Actor,
	assessmentId: number,
	access: Access = 'read',
	transaction?: Transaction
): Promise<{ assessment: Assessment; asset: Asset; access: Standing }> {
	const assessment = Number.isSafeInteger(assessmentId)
		? await Assessment.findByPk(assessmentId, { transaction })
		: null;
	if (!assessment) throw new NotFoundError(WHAT);
	const visible =
		access === 'write'
			? {
					asset: await ownAsset(actor, assessment.assetId, WHAT, transaction),
					access: 'own' as const
				}
			: await visibleAsset(actor, assessment.assetId, WHAT, transaction);
	if (assessment.state === 'draft' && !seesDrafts(actor, visible.access)) {
		throw new NotFoundError(WHAT);
	}
	return { assessment, ...visible };
}

/** A signed (approved or superseded) assessment the actor may read: what reports are made of. */
export async function signedAssessment(actor: Actor, assessmentId: number): Promise<Assessment> {
	const { assessment } = await visibleAssessment(actor, assessmentId);
	if (assessment.state === 'draft') throw new NotFoundError(WHAT);
	return assessment;
}
