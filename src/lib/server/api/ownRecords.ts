import { Op } from 'sequelize';
import type { z } from 'zod';
import { Member, Reading, Survey, type Asset } from '../db';
import { readingCounts } from '../readings/coverSets';
import { encodeCursor } from './cursor';
import type { assetSchema, memberSchema, readingPageSchema, surveySchema } from './schemas';

/** The API's answers for an organisation's own records, shaped to ./schemas.ts. */
export function assetAnswer(asset: Asset, owned: boolean): z.infer<typeof assetSchema> {
	return {
		id: asset.id,
		name: asset.name,
		locationText: asset.locationText,
		yearOfConstruction: asset.yearOfConstruction,
		designCode: asset.designCode,
		unitSystem: asset.unitSystem,
		designServiceLifeYears: asset.designServiceLifeYears,
		researchOptIn: Boolean(asset.researchOptIn),
		access: owned ? 'owner' : 'shared'
	};
}

export async function surveysOf(assetId: number): Promise<z.infer<typeof surveySchema>[]> {
	const surveys = await Survey.findAll({ where: { assetId }, order: [['surveyDate', 'ASC']] });
	return surveys.map((s) => ({
		id: s.id,
		assetId: s.assetId,
		title: s.title,
		surveyDate: s.surveyDate,
		status: s.status
	}));
}

export async function membersOf(surveyId: number): Promise<z.infer<typeof memberSchema>[]> {
	const members = await Member.findAll({ where: { surveyId }, order: [['id', 'ASC']] });
	const countOf = await readingCounts(members.map((m) => m.id));
	return members.map((m) => ({
		id: m.id,
		surveyId: m.surveyId,
		label: m.label,
		memberType: m.memberType,
		face: m.face,
		exposureClass: m.exposureClass,
		requirementSource: m.requirementSource,
		cMinMm: m.cMinMm,
		cNomMm: m.cNomMm,
		deltaCDevMm: m.deltaCDevMm,
		deltaPlusMm: m.deltaPlusMm,
		barDiameterMm: m.barDiameterMm,
		readingCount: countOf.get(m.id) ?? 0
	}));
}

/** One page of a member's readings in id order (keyset: id > cursor). */
export async function readingPage(
	memberId: number,
	afterId: number,
	limit: number
): Promise<z.infer<typeof readingPageSchema>> {
	const rows = await Reading.findAll({
		where: { memberId, id: { [Op.gt]: afterId } },
		order: [['id', 'ASC']],
		limit: limit + 1
	});
	const page = rows.slice(0, limit);
	return {
		readings: page.map((r) => ({
			id: Number(r.id),
			xMm: r.xMm,
			yMm: r.yMm,
			coverMm: r.coverMm,
			barDiameterMm: r.barDiameterMm,
			barSpacingMm: r.barSpacingMm,
			barDirection: r.barDirection,
			flags: r.flags,
			note: r.note
		})),
		nextCursor: rows.length > limit ? encodeCursor(Number(page[page.length - 1].id)) : null
	};
}
