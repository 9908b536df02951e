/**
 * What the dashboard shows, by role: what waits for me (surveys to review, failed imports,
 * mails that failed), recent assessments, and the assets with their standing.
 */
import { Op } from 'sequelize';
import { Asset, Assessment, ImportBatch, MailMessage, Survey } from '$lib/server/db';
import { can, type Actor } from '$lib/server/policy';
import { readableAssetIds } from '$lib/server/access';
import { parseSnapshot } from '$lib/server/assessments';

export interface AssetStanding {
	id: number;
	name: string;
	own: boolean;
	latestApproved: { id: number; title: string; approvedAt: string | null } | null;
	populations: number;
	failing: number;
	tooFew: number;
}

/**
 * Failed imports a later import has not made good: one drops off once a file of the same name
 * completes into the same survey after it (the corrected file, or the same one on a retry).
 */
async function unfixedFailures(surveyIds: number[]): Promise<ImportBatch[]> {
	const failed = await ImportBatch.findAll({
		attributes: ['id', 'surveyId', 'fileName', 'errorMessage'],
		where: { surveyId: surveyIds, state: 'failed' },
		limit: 100,
		order: [['id', 'DESC']]
	});
	if (failed.length === 0) return [];
	const later = await ImportBatch.findAll({
		attributes: ['id', 'surveyId', 'fileName'],
		where: {
			surveyId: [...new Set(failed.map((b) => b.surveyId))],
			state: { [Op.in]: ['completed', 'undone'] },
			id: { [Op.gt]: Math.min(...failed.map((b) => b.id)) }
		}
	});
	const fixedBy = (b: ImportBatch) =>
		later.some((l) => l.surveyId === b.surveyId && l.id > b.id && l.fileName === b.fileName);
	return failed.filter((b) => !fixedBy(b)).slice(0, 20);
}

async function standing(actor: Actor, assetIds: number[]): Promise<AssetStanding[]> {
	const assets = await Asset.findAll({ where: { id: assetIds }, order: [['name', 'ASC']] });
	const approved = await Assessment.findAll({
		where: { assetId: assetIds, state: 'approved' },
		order: [['id', 'DESC']]
	});
	return assets.map((asset) => {
		const latest = approved.find((a) => a.assetId === asset.id) ?? null;
		const populations = latest ? parseSnapshot(latest.snapshot).populations : [];
		return {
			id: asset.id,
			name: asset.name,
			own: asset.organisationId === actor.organisationId,
			latestApproved: latest
				? {
						id: latest.id,
						title: latest.title,
						approvedAt: latest.approvedAt?.toISOString() ?? null
					}
				: null,
			populations: populations.length,
			failing: populations.filter((p) => p.assessment?.verdict === 'fail').length,
			tooFew: populations.filter((p) => !p.assessment || p.assessment.verdict === 'not-enough-data')
				.length
		};
	});
}

export async function dashboardFor(actor: Actor) {
	const assetIds = await readableAssetIds(actor);
	const ownIds = (
		await Asset.findAll({
			attributes: ['id'],
			where: { id: assetIds, organisationId: actor.organisationId }
		})
	).map((a) => a.id);
	const reviewer = can(actor.role, 'survey:review');
	const surveys = await Survey.findAll({
		where: reviewer
			? { assetId: ownIds, status: 'submitted' }
			: {
					assetId: ownIds,
					status: { [Op.in]: ['draft', 'returned'] },
					surveyorUserId: actor.userId
				},
		order: [['surveyDate', 'DESC']],
		limit: 20
	});
	const surveyIds = (await Survey.findAll({ attributes: ['id'], where: { assetId: ownIds } })).map(
		(s) => s.id
	);
	const failedImports = can(actor.role, 'reading:import') ? await unfixedFailures(surveyIds) : [];
	const failedMails = can(actor.role, 'mail:read')
		? await MailMessage.count({ where: { organisationId: actor.organisationId, state: 'failed' } })
		: 0;
	const recent = can(actor.role, 'assessment:read')
		? await Assessment.findAll({
				attributes: { exclude: ['snapshot'] },
				where: can(actor.role, 'assessment:write')
					? { assetId: assetIds }
					: { assetId: assetIds, state: 'approved' },
				order: [['id', 'DESC']],
				limit: 8
			})
		: [];
	return {
		surveys: surveys.map((s) => ({
			id: s.id,
			assetId: s.assetId,
			title: s.title,
			surveyDate: s.surveyDate,
			status: s.status
		})),
		surveysHeading: reviewer ? 'Surveys waiting for your review' : 'Your surveys still open',
		failedImports: failedImports.map((b) => ({
			id: b.id,
			surveyId: b.surveyId,
			href: `/surveys/${b.surveyId}#import-${b.id}`,
			fileName: b.fileName,
			error: b.errorMessage
		})),
		failedMails,
		recent: recent.map((a) => ({
			id: a.id,
			assetId: a.assetId,
			title: a.title,
			state: a.state,
			createdAt: new Date(a.createdAt).toISOString()
		})),
		assets: can(actor.role, 'asset:read') ? await standing(actor, assetIds) : []
	};
}
