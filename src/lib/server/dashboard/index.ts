/**
 * What the dashboard shows, by role: what waits for me (surveys to review, failed imports,
 * mails that failed), recent assessments, and the assets with their standing.
 */
import { Op } from 'sequelize';
import { Asset, Assessment, ImportBatch, MailMessage, Survey } from '$lib/server/db';
import { can, type Actor } from '$lib/server/policy';
import { visibleAssetIds } from '$lib/server/populations';
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
	const assetIds = await visibleAssetIds(actor);
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
	const failedImports = can(actor.role, 'reading:import')
		? await ImportBatch.findAll({
				where: { surveyId: surveyIds, state: 'failed' },
				limit: 20,
				order: [['id', 'DESC']]
			})
		: [];
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
