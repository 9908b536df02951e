/**
 * Chloride profiles of a member with their increments, written together: recorded and removed
 * while the survey is a draft or returned, audited, frozen with the survey like its readings.
 */
import {
	conversionNote,
	percentOfBinder,
	type ChlorideProfileInput
} from '$lib/intake/measurements';
import { ChlorideIncrement, ChlorideProfile, Member } from '../db/models';
import type { Actor } from '../policy';
import { scopedChlorideProfile, scopedMember, scopedSurvey } from '../access';
import { assertSurveyEditableLocked } from './frozen';
import { assertLabelFree, auditMeasurement } from './measurementRecords';

const WITH_INCREMENTS = {
	include: [{ model: ChlorideIncrement, as: 'increments' }],
	order: [
		['testedOn', 'ASC'],
		['label', 'ASC'],
		[{ model: ChlorideIncrement, as: 'increments' }, 'position', 'ASC']
	] as never
};

/** A profile as the API and pages show it: its increments in % of binder too, the surface one flagged. */
export function presentProfile(profile: ChlorideProfile) {
	const plain = profile.get({ plain: true }) as ChlorideProfile & {
		increments: ChlorideIncrement[];
	};
	const increments = [...(plain.increments ?? [])].sort((a, b) => a.position - b.position);
	return {
		id: plain.id,
		memberId: plain.memberId,
		label: plain.label,
		xMm: plain.xMm,
		yMm: plain.yMm,
		testedOn: plain.testedOn,
		basis: plain.basis,
		binderContentKgM3: plain.binderContentKgM3,
		concreteDensityKgM3: plain.concreteDensityKgM3,
		initialContentPercent: plain.initialContentPercent,
		method: plain.method,
		notes: plain.notes,
		createdAt: new Date(plain.createdAt).toISOString(),
		conversion: conversionNote(plain),
		increments: increments.map((i) => ({
			fromMm: i.fromMm,
			toMm: i.toMm,
			chloridePercent: i.chloridePercent,
			percentOfBinder: percentOfBinder(i.chloridePercent, plain),
			outermost: Boolean(i.outermost)
		}))
	};
}
export type PresentedProfile = ReturnType<typeof presentProfile>;

export async function listChlorideProfiles(actor: Actor, memberId: number) {
	await scopedMember(actor, memberId, 'read');
	const rows = await ChlorideProfile.findAll({ where: { memberId }, ...WITH_INCREMENTS });
	return rows.map(presentProfile);
}

/** Every chloride profile of a survey's members. */
export async function chlorideProfilesOfSurvey(actor: Actor, surveyId: number) {
	await scopedSurvey(actor, surveyId, 'read');
	const members = await Member.findAll({ attributes: ['id'], where: { surveyId } });
	const rows = await ChlorideProfile.findAll({
		where: { memberId: members.map((m) => m.id) },
		...WITH_INCREMENTS
	});
	return rows.map(presentProfile);
}

export async function getChlorideProfile(actor: Actor, id: number) {
	const { record } = await scopedChlorideProfile(actor, id, 'read');
	await record.reload({ include: [{ model: ChlorideIncrement, as: 'increments' }] });
	return presentProfile(record);
}

const contents = (input: Pick<ChlorideProfileInput, 'increments'>) =>
	input.increments.map((i) => [i.fromMm, i.toMm, i.chloridePercent]);

/** The rows of a profile's increments: the schema has them from the surface inwards, so the first is the outermost. */
export function incrementRows(profileId: number, increments: ChlorideProfileInput['increments']) {
	return increments.map((i, n) => ({ ...i, profileId, position: n + 1, outermost: n === 0 }));
}

export async function createChlorideProfile(
	actor: Actor,
	memberId: number,
	input: ChlorideProfileInput
) {
	return ChlorideProfile.sequelize!.transaction(async (transaction) => {
		const { survey } = await scopedMember(actor, memberId, 'write', transaction);
		await assertSurveyEditableLocked(survey, transaction);
		await assertLabelFree(ChlorideProfile, 'Chloride profile', memberId, input.label, transaction);
		const { increments, ...fields } = input;
		const profile = await ChlorideProfile.create({ ...fields, memberId }, { transaction });
		await ChlorideIncrement.bulkCreate(incrementRows(profile.id, increments), { transaction });
		const detail = { basis: input.basis, increments: contents(input) };
		await auditMeasurement(actor, 'chloride_profile', 'created', profile, detail, transaction);
		await profile.reload({
			include: [{ model: ChlorideIncrement, as: 'increments' }],
			transaction
		});
		return presentProfile(profile);
	});
}

/** Removes a profile recorded in error, with its increments; the audit event keeps them. */
export async function deleteChlorideProfile(actor: Actor, id: number) {
	return ChlorideProfile.sequelize!.transaction(async (transaction) => {
		const { record, survey } = await scopedChlorideProfile(actor, id, 'write', transaction);
		await assertSurveyEditableLocked(survey, transaction);
		const increments = await ChlorideIncrement.findAll({
			where: { profileId: record.id },
			order: [['position', 'ASC']],
			transaction
		});
		await ChlorideIncrement.destroy({ where: { profileId: record.id }, transaction });
		await record.destroy({ transaction });
		const detail = { basis: record.basis, increments: contents({ increments }) };
		await auditMeasurement(actor, 'chloride_profile', 'deleted', record, detail, transaction);
		return { id: record.id, memberId: record.memberId };
	});
}
